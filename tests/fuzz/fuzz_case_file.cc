// Fuzz target: case files (the parameter files of nappe-solve and nappe-limits): every entry declared by
// declare_sheet_case_parameters, the text parsed by deal.II's ParameterHandler and read by
// parse_sheet_case (materials, edges, topographies and the files they name, adhesion, limits, solver).
#include <deal.II/base/parameter_handler.h>

#include <nappe/io/sheet_case.h>

#include <sstream>

#include "fuzz_common.h"
#include "fuzz_inputs.h"

namespace
{
  /// The declared handler, made once (declaring every entry costs milliseconds), and the text of its
  /// defaults, parsed before every input so that no value of one input leaks into the next.
  dealii::ParameterHandler &handler(std::string *defaults = nullptr)
  {
    static dealii::ParameterHandler prm;
    static const std::string        default_text = [] {
      nappe::declare_sheet_case_parameters(prm);
      std::ostringstream text;
      prm.print_parameters(text, dealii::ParameterHandler::ShortPRM);
      return text.str();
    }();
    if (defaults)
      *defaults = default_text;
    return prm;
  }
} // namespace

extern "C" int LLVMFuzzerInitialize(int *, char ***)
{
  nappe::fuzz::write_companion_files();
  return 0;
}

extern "C" int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size)
{
  using namespace nappe;
  const std::string text(reinterpret_cast<const char *>(data), size);
  std::string       defaults;
  dealii::ParameterHandler &prm = handler(&defaults);
  prm.parse_input_from_string(defaults, "defaults");
  // deal.II's parameter messages span several lines and do not name the case file: only the general rules.
  fuzz::run_reader(
    [&] {
      prm.parse_input_from_string(text, "case.prm");
      (void)parse_sheet_case(prm);
    },
    {"", false, text});
  // A reader that threw inside a subsection leaves the handler there; back to the top level (leaving
  // the top level is a no-op in deal.II's release library, which the fuzz build links).
  for (unsigned int depth = 0; depth < 8; ++depth)
    prm.leave_subsection();
  return 0;
}

// Fuzz target: formula topographies through the case file's entries (TopographyFactory): the first line
// of the input is Topography/Formula/Expression, the second Topography/Formula/Constants. An accepted
// formula is evaluated at a few points (a non-finite value must be rejected with its point named).
#include <deal.II/base/parameter_handler.h>

#include <nappe/geometry/topography_factory.h>

#include "fuzz_common.h"

extern "C" int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size)
{
  using namespace nappe;
  static dealii::ParameterHandler prm; // declared once; each input sets the two entries it fuzzes
  static const bool declared = [] {
    TopographyFactory::declare_parameters(prm);
    prm.enter_subsection("Topography");
    prm.set("Type", "formula");
    prm.leave_subsection();
    return true;
  }();
  (void)declared;
  const std::string text(reinterpret_cast<const char *>(data), size);
  const auto        first_break = text.find('\n');
  const std::string expression  = text.substr(0, first_break);
  std::string       constants;
  if (first_break != std::string::npos)
    constants = text.substr(first_break + 1, text.find('\n', first_break + 1) - first_break - 1);
  prm.enter_subsection("Topography");
  prm.enter_subsection("Formula");
  prm.set("Expression", expression);
  prm.set("Constants", constants);
  prm.leave_subsection();
  prm.leave_subsection();
  fuzz::run_reader(
    [&] {
      const auto topography = TopographyFactory::parse_parameters(prm);
      for (const double x : {0.0, 1e-9, -37e-9})
        for (const double y : {0.0, 5e-10})
          {
            fuzz::require_finite(topography->height(dealii::Point<2>(x, y)), "formula height");
            fuzz::require_finite(topography->gradient(dealii::Point<2>(x, y)), "formula slope");
          }
    },
    {"Topography/Formula", true, text});
  return 0;
}

#include <deal.II/base/utilities.h>

#include <nappe/io/parameter_override.h>
#include <nappe/io/parameter_validation.h>

namespace nappe
{
  void apply_override(dealii::ParameterHandler &prm, const std::string &assignment, const std::string &origin)
  {
    apply_override(prm, DeclaredEntries(prm), assignment, origin);
  }

  void apply_override(dealii::ParameterHandler &prm, const DeclaredEntries &declared, const std::string &assignment,
                      const std::string &origin)
  {
    declared.check_assignment(assignment, origin);
    const auto eq   = assignment.find('=');
    auto       path = dealii::Utilities::split_string_list(assignment.substr(0, eq), '/');
    const std::string entry = path.back();
    path.pop_back();
    for (const auto &section : path)
      prm.enter_subsection(section);
    prm.set(entry, dealii::Utilities::trim(assignment.substr(eq + 1)));
    for (std::size_t k = 0; k < path.size(); ++k)
      prm.leave_subsection();
  }
} // namespace nappe

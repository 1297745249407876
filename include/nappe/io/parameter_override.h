#pragma once

#include <deal.II/base/parameter_handler.h>

#include <nappe/base/collective.h>
#include <nappe/io/parameter_validation.h>

#include <string>

namespace nappe
{
  /**
   * Applies "Section/Sub/Entry=value" (a --set argument, a sweep's override or axis value) to a handler
   * with declared entries; throws naming @p origin and the assignment, with nappe's own message
   * (validate_assignment()), if the entry does not exist or the value does not match its pattern.
   */
  void apply_override(dealii::ParameterHandler &prm, const std::string &assignment,
                      const std::string &origin = "--set");

  /// The same, checked against entries read once from @p prm (for many assignments to one handler).
  void apply_override(dealii::ParameterHandler &prm, const DeclaredEntries &declared, const std::string &assignment,
                      const std::string &origin);
} // namespace nappe

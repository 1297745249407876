#pragma once

#include <deal.II/base/parameter_handler.h>

#include <nappe/base/collective.h>

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
} // namespace nappe

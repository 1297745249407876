#pragma once

#include <deal.II/base/parameter_handler.h>

#include <exception>
#include <string>

namespace nappe
{
  /**
   * Applies "Section/Sub/Entry=value" (a --set argument) to a handler with declared entries; throws
   * naming the assignment if the entry does not exist or the value does not match its pattern.
   */
  void apply_override(dealii::ParameterHandler &prm, const std::string &assignment);

  /// The message of an exception for a user: deal.II's text without source location and stack trace.
  std::string user_message(const std::exception &e);
} // namespace nappe

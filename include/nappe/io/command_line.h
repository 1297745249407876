#pragma once

#include <deal.II/base/parameter_handler.h>

#include <exception>
#include <string>
#include <vector>

namespace nappe
{
  /**
   * Applies "Section/Sub/Entry=value" (a --set argument) to a handler with declared entries; throws
   * naming the assignment if the entry does not exist or the value does not match its pattern.
   */
  void apply_override(dealii::ParameterHandler &prm, const std::string &assignment);

  /**
   * Reads a driver's case arguments into a handler with declared entries: "CASE.prm" or "--demo"
   * (then @p demo_case is parsed), followed by "--set Section/Entry=value" pairs. Throws with
   * @p usage on anything else, and naming the file, line or override on bad input.
   */
  void read_case_arguments(dealii::ParameterHandler &prm, const std::vector<std::string> &args,
                           const std::string &demo_case, const std::string &usage);

  /// The message of an exception for a user: deal.II's text without source location and stack trace;
  /// control characters other than line breaks (echoed from a binary input) are shown as \xNN.
  std::string user_message(const std::exception &e);
} // namespace nappe

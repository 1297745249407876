#pragma once

#include <sstream>
#include <string>

namespace nappe
{
  /**
   * @p value as a message prints it: at most @p significant significant digits, no trailing zeros
   * (0.005, 12.5, 1e-09), where full precision would print a binary fraction (0.0050000000000000001).
   */
  inline std::string message_number(double value, int significant = 6)
  {
    std::ostringstream out;
    out.precision(significant);
    out << value;
    return out.str();
  }
} // namespace nappe

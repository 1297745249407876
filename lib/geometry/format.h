#pragma once
// Private helper of lib/geometry: numbers in descriptions and messages, printed in nm.
#include <nappe/base/units.h>

#include <sstream>
#include <string>

namespace nappe::internal
{
  /// "12.5 nm" for a length of 12.5e-9 m.
  inline std::string nm(const double length)
  {
    std::ostringstream s;
    s.precision(6);
    s << length / units::nanometer << " nm";
    return s.str();
  }

  /**
   * Text from an input file made safe to quote in a one-line message: printable ASCII is kept, every
   * other byte (control characters, line breaks, binary data, non-ASCII) is shown as \xNN, and the
   * result is cut after @p max_length characters with "..." (a binary file must not flood a message).
   */
  inline std::string excerpt(const std::string &text, const std::size_t max_length = 40)
  {
    static const char *hex = "0123456789abcdef";
    std::string        out;
    for (const char c : text)
      {
        if (out.size() >= max_length)
          return out + "...";
        const auto byte = static_cast<unsigned char>(c);
        if (byte >= 0x20 && byte < 0x7f)
          out += c;
        else
          out += std::string("\\x") + hex[byte >> 4] + hex[byte & 15];
      }
    return out;
  }

  /// A plain number with six significant digits.
  inline std::string num(const double value)
  {
    std::ostringstream s;
    s.precision(6);
    s << value;
    return s.str();
  }
} // namespace nappe::internal

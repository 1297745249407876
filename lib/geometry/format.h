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

  /// A plain number with six significant digits.
  inline std::string num(const double value)
  {
    std::ostringstream s;
    s.precision(6);
    s << value;
    return s.str();
  }
} // namespace nappe::internal

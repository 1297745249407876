#pragma once

#include <string>

namespace nappe
{
  /// The library version, "major.minor.patch", as configured by CMake.
  std::string version();
} // namespace nappe

#pragma once

#include <ostream>
#include <string>
#include <vector>

namespace nappe
{
  /**
   * Prints rows of cells as aligned columns (two spaces apart, each column as wide as its widest cell,
   * counted in characters, not bytes, so that Γ, ² and other UTF-8 characters line up); the first row
   * is the header and is underlined. Every line starts with @p indent.
   */
  void print_table(const std::vector<std::vector<std::string>> &rows, std::ostream &out,
                   const std::string &indent = "  ");
} // namespace nappe

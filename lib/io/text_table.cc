#include <nappe/io/text_table.h>

#include <algorithm>

namespace nappe
{
  namespace
  {
    /// Characters of a UTF-8 string (bytes that do not continue a multi-byte character).
    std::size_t width(const std::string &text)
    {
      return std::count_if(text.begin(), text.end(), [](char c) { return (static_cast<unsigned char>(c) & 0xC0) != 0x80; });
    }
  } // namespace

  void print_table(const std::vector<std::vector<std::string>> &rows, std::ostream &out, const std::string &indent)
  {
    std::vector<std::size_t> widths;
    for (const auto &row : rows)
      for (std::size_t k = 0; k < row.size(); ++k)
        {
          widths.resize(std::max(widths.size(), row.size()), 0);
          widths[k] = std::max(widths[k], width(row[k]));
        }
    for (std::size_t r = 0; r < rows.size(); ++r)
      {
        std::string line = indent;
        for (std::size_t k = 0; k < rows[r].size(); ++k)
          line += rows[r][k] + std::string(widths[k] - width(rows[r][k]) + (k + 1 < rows[r].size() ? 2 : 0), ' ');
        while (!line.empty() && line.back() == ' ')
          line.pop_back();
        out << line << "\n";
        if (r == 0)
          {
            std::size_t total = 0;
            for (const auto w : widths)
              total += w + 2;
            out << indent << std::string(total - 2, '-') << "\n";
          }
      }
  }
} // namespace nappe

#include <deal.II/base/exceptions.h>

#include <nappe/physics/catalogue_sources.h>

#include <fstream>
#include <ostream>
#include <regex>

namespace nappe
{
  std::vector<CatalogueSource> read_catalogue_sources(const std::string &path)
  {
    std::ifstream in(path);
    AssertThrow(in, dealii::ExcMessage("Cannot read the material catalogue '" + path + "'."));
    static const std::regex subsection(R"(^\s*subsection\s+(.*\S)\s*$)");
    static const std::regex value(R"(^\s*set\s+(.*?\S)\s*=\s*([^#]*?)\s*(?:#\s*(.*\S))?\s*$)");
    std::vector<std::string>     open; // the subsection path at the current line
    std::vector<CatalogueSource> sources;
    std::smatch                  m;
    for (std::string line; std::getline(in, line);)
      if (std::regex_match(line, m, subsection))
        open.push_back(m[1]);
      else if (std::regex_match(line, std::regex(R"(^\s*end\s*$)")) && !open.empty())
        open.pop_back();
      else if (open.size() == 2 && std::regex_match(line, m, value) && m[1] != "Sheet" && m[1] != "Substrate")
        sources.push_back({open.back(), m[1], m[2], m[3]});
    return sources;
  }

  void print_catalogue_sources(const std::vector<CatalogueSource> &sources, std::ostream &out)
  {
    std::string subject;
    for (const CatalogueSource &s : sources)
      {
        if (s.subject != subject)
          out << (subject.empty() ? "" : "\n") << s.subject << '\n';
        subject = s.subject;
        out << "  " << s.entry << " = " << s.value << ": " << (s.source.empty() ? "no source given" : s.source)
            << '\n';
      }
  }
} // namespace nappe

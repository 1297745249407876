#include <deal.II/base/exceptions.h>

#include <nappe/physics/catalogue_sources.h>

#include <algorithm>
#include <fstream>
#include <ostream>
#include <regex>

namespace nappe
{
  namespace
  {
    // Entries that name things rather than measure them: no source is expected.
    bool is_label(const std::string &entry)
    {
      return entry == "Sheet" || entry == "Substrate" || entry == "Type" || entry == "Species";
    }

    bool ends_with(const std::string &text, const std::string &suffix)
    {
      return text.size() > suffix.size() && text.compare(text.size() - suffix.size(), suffix.size(), suffix) == 0;
    }

    // "Lattice/Lattice constant" for an entry in a nested subsection of a material, else the entry itself.
    std::string qualified_entry(const std::vector<std::string> &open, const std::string &entry)
    {
      std::string name;
      for (std::size_t i = 2; i < open.size(); ++i)
        name += open[i] + '/';
      return name + entry;
    }

    // Electronic entries carry their source and kind as separate "<entry> source" and "<entry> kind" entries
    // (the texts are too long for a comment): attach them to the value they describe.
    bool attach_to_value(std::vector<CatalogueSource> &sources, const CatalogueSource &note)
    {
      for (const std::string suffix : {" source", " kind"})
        if (ends_with(note.entry, suffix))
          {
            const std::string described = note.entry.substr(0, note.entry.size() - suffix.size());
            const auto value = std::find_if(sources.rbegin(), sources.rend(), [&](const CatalogueSource &s) {
              return s.subject == note.subject && s.entry == described;
            });
            if (value == sources.rend())
              return false;
            std::string &text = value->source;
            text = suffix == " source" ? note.value + (text.empty() ? "" : " " + text)
                                       : text + (text.empty() ? "" : " ") + "[" + note.value + "]";
            return true;
          }
      return false;
    }
  } // namespace

  std::vector<CatalogueSource> read_catalogue_sources(const std::string &path)
  {
    std::ifstream in(path);
    AssertThrow(in, dealii::ExcMessage("Cannot read the material catalogue '" + path + "'."));
    static const std::regex subsection(R"(^\s*subsection\s+(.*\S)\s*$)");
    static const std::regex end(R"(^\s*end\s*$)");
    static const std::regex value(R"(^\s*set\s+(.*?\S)\s*=\s*([^#]*?)\s*(?:#\s*(.*\S))?\s*$)");
    std::vector<std::string>     open; // the subsection path at the current line
    std::vector<CatalogueSource> sources;
    std::smatch                  m;
    for (std::string line; std::getline(in, line);)
      if (std::regex_match(line, m, subsection))
        open.push_back(m[1]);
      else if (std::regex_match(line, end) && !open.empty())
        open.pop_back();
      else if (open.size() >= 2 && std::regex_match(line, m, value) && !is_label(m[1]))
        {
          const CatalogueSource entry{open[1], qualified_entry(open, m[1]), m[2], m[3]};
          if (!attach_to_value(sources, entry))
            sources.push_back(entry);
        }
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

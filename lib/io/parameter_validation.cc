#include <deal.II/base/patterns.h>
#include <deal.II/base/utilities.h>

#include <boost/property_tree/ptree.hpp>
#include <boost/property_tree/xml_parser.hpp>

#include <nappe/io/parameter_validation.h>

#include <algorithm>
#include <cctype>
#include <cmath>
#include <map>
#include <regex>
#include <sstream>
#include <vector>

namespace nappe
{
  namespace internal
  {
    /// What is declared for one entry: its pattern description and whether it is a length in nm.
    struct DeclaredEntry
    {
      std::string pattern;
      bool        in_nm = false;
    };

    /// The declared entries and subsections of one section.
    struct DeclaredSection
    {
      std::map<std::string, DeclaredEntry>   entries;
      std::map<std::string, DeclaredSection> sections;
    };
  } // namespace internal

  namespace
  {
    using Declared = internal::DeclaredEntry;

    using Section = internal::DeclaredSection;

    /// A length below this is smaller than an atom by two orders: an entry in nm given in metres (common practice,
    /// no source) [nm].
    const double smallest_length_nm = 1e-3;

    /// deal.II writes names with every character but [a-zA-Z0-9] as "_xx" (hex).
    std::string demangle(const std::string &name)
    {
      std::string out;
      for (std::size_t i = 0; i < name.size(); ++i)
        if (name[i] == '_' && i + 2 < name.size() && std::isxdigit(name[i + 1]) && std::isxdigit(name[i + 2]))
          {
            out += static_cast<char>(std::stoi(name.substr(i + 1, 2), nullptr, 16));
            i += 2;
          }
        else
          out += name[i];
      return out;
    }

    /// The entry's documentation states its unit as "[nm]" or "Unit: nm.".
    bool is_in_nm(const std::string &documentation)
    {
      return documentation.find("[nm]") != std::string::npos || documentation.find("Unit: nm.") != std::string::npos;
    }

    void fill(Section &section, const boost::property_tree::ptree &tree)
    {
      for (const auto &[key, child] : tree)
        if (child.count("value") && child.count("pattern_description"))
          section.entries[demangle(key)] = {child.get<std::string>("pattern_description"),
                                            is_in_nm(child.get<std::string>("documentation", ""))};
        else if (!child.empty())
          fill(section.sections[demangle(key)], child);
    }

    Section declared(const dealii::ParameterHandler &prm)
    {
      std::stringstream xml;
      prm.print_parameters(xml, dealii::ParameterHandler::XML);
      boost::property_tree::ptree tree;
      boost::property_tree::read_xml(xml, tree);
      Section root;
      fill(root, tree.get_child("ParameterHandler"));
      return root;
    }

    std::string lower(std::string s)
    {
      std::transform(s.begin(), s.end(), s.begin(), [](unsigned char c) { return std::tolower(c); });
      return s;
    }

    std::size_t edit_distance(const std::string &a, const std::string &b)
    {
      std::vector<std::size_t> row(b.size() + 1);
      for (std::size_t j = 0; j <= b.size(); ++j)
        row[j] = j;
      for (std::size_t i = 1; i <= a.size(); ++i)
        {
          std::size_t diagonal = row[0];
          row[0]               = i;
          for (std::size_t j = 1; j <= b.size(); ++j)
            {
              const std::size_t up = row[j];
              row[j]               = std::min({row[j] + 1, row[j - 1] + 1, diagonal + (a[i - 1] != b[j - 1])});
              diagonal             = up;
            }
        }
      return row[b.size()];
    }

    /// " (did you mean 'X'?)" for the closest of @p names, if close enough; "" otherwise.
    template <class Map>
    std::string suggestion(const std::string &name, const Map &names)
    {
      std::string best;
      std::size_t best_distance = std::max<std::size_t>(2, name.size() / 3) + 1;
      for (const auto &[candidate, unused] : names)
        if (const std::size_t d = edit_distance(lower(name), lower(candidate)); d < best_distance)
          {
            best          = candidate;
            best_distance = d;
          }
      return best.empty() ? "" : " (did you mean '" + best + "'?)";
    }

    /// The path of the first section (depth first) that declares an entry called @p name.
    std::string owner_of(const Section &section, const std::string &name, const std::string &path = "")
    {
      if (section.entries.count(name))
        return path;
      for (const auto &[sub, child] : section.sections)
        if (const std::string found = owner_of(child, name, path + sub + "/"); !found.empty())
          return found;
      return "";
    }

    std::string joined(const std::vector<std::string> &path)
    {
      std::string text;
      for (const auto &p : path)
        text += p + "/";
      return text;
    }

    [[noreturn]] void fail(const std::string &where, const std::string &what)
    {
      AssertThrow(false, dealii::ExcMessage(where + ": " + what));
      throw;
    }

    /// A length in nm written in metres: a single number whose magnitude is above 0 and below smallest_length_nm.
    void check_length_scale(const std::string &value, const std::string &where, const std::string &entry)
    {
      std::istringstream in(value);
      double             v = 0.0;
      if (!(in >> v) || !(in >> std::ws).eof() || v == 0.0 || std::abs(v) >= smallest_length_nm)
        return;
      fail(where, entry + " = '" + value + "': lengths here are in nm, and this is below " +
                    dealii::Utilities::to_string(smallest_length_nm) +
                    " nm, far smaller than an atom; was it given in metres? (8e-9 m is written 8)");
    }

    /// Checks @p value against the entry's pattern; @p entry is "Section/…/Entry" for the message.
    void check_value(const Declared &declared, const std::string &value, const std::string &where,
                     const std::string &entry)
    {
      const std::string &description = declared.pattern;
      const auto         pattern     = dealii::Patterns::pattern_factory(description);
      if (pattern->match(value))
        {
          if (declared.in_nm)
            check_length_scale(value, where, entry);
          return;
        }
      static const std::regex number_with_unit(R"(\s*[-+]?[0-9.]+([eE][-+]?[0-9]+)?\s*[^\s0-9.,].*)");
      std::string             hint;
      if (std::regex_match(value, number_with_unit))
        hint = "; write the number alone: the unit is fixed by the entry (see its description in --print-defaults)";
      fail(where, entry + " = '" + value + "': expected " + pattern_in_words(description) + hint);
    }

    const Section &enter(const Section &section, const std::vector<std::string> &path, const std::string &name,
                         const std::string &where)
    {
      const auto it = section.sections.find(name);
      if (it == section.sections.end())
        fail(where, "no subsection '" + name + "' in " + (path.empty() ? "the file's top level" : joined(path)) +
                      suggestion(name, section.sections));
      return it->second;
    }

    void check_entry(const Section &section, const std::vector<std::string> &path, const std::string &name,
                     const std::string &value, const std::string &where, const Section &root)
    {
      const auto it = section.entries.find(name);
      if (it == section.entries.end())
        {
          std::string hint = suggestion(name, section.entries);
          if (hint.empty())
            if (const std::string owner = owner_of(root, name); !owner.empty())
              hint = " ('" + name + "' belongs to subsection " + owner.substr(0, owner.size() - 1) + ")";
          fail(where, "no entry '" + name + "' in " + (path.empty() ? "the file's top level" : joined(path)) + hint);
        }
      check_value(it->second, value, where, joined(path) + name);
    }

    /// The lines of a parameter file with continuation lines joined and comments removed.
    std::vector<std::pair<unsigned int, std::string>> logical_lines(const std::string &text)
    {
      std::vector<std::pair<unsigned int, std::string>> lines;
      std::istringstream                                in(text);
      std::string                                       line, pending;
      unsigned int                                      number = 0, first = 0;
      while (std::getline(in, line))
        {
          ++number;
          if (const auto hash = line.find('#'); hash != std::string::npos)
            line.erase(hash);
          if (pending.empty())
            first = number;
          line = dealii::Utilities::trim(line);
          if (!line.empty() && line.back() == '\\')
            {
              pending += line.substr(0, line.size() - 1) + " ";
              continue;
            }
          lines.emplace_back(first, dealii::Utilities::trim(pending + line));
          pending.clear();
        }
      return lines;
    }
  } // namespace

  std::string pattern_in_words(const std::string &d)
  {
    static const std::regex selection(R"(\[Selection (.*) \])");
    static const std::regex range(R"(\[(Double|Integer range) (.*)\.\.\.(.*) \(inclusive\)\])");
    std::smatch             m;
    if (std::regex_match(d, m, selection))
      {
        std::string list = m[1];
        for (std::size_t k = list.find('|'); k != std::string::npos; k = list.find('|'))
          list.replace(k, 1, "', '");
        return "one of '" + list + "'";
      }
    if (d == "[Bool]")
      return "true or false";
    if (std::regex_match(d, m, range))
      {
        const std::string kind = m[1] == "Double" ? "a number" : "a whole number";
        const std::string low = m[2], high = m[3];
        const bool        no_low = low.find("MAX") != std::string::npos, no_high = high.find("MAX") != std::string::npos;
        if (no_low && no_high)
          return kind;
        if (no_high)
          return kind + " >= " + low;
        if (no_low)
          return kind + " <= " + high;
        return kind + " from " + low + " to " + high;
      }
    if (d == "[Double -MAX_DOUBLE...MAX_DOUBLE (inclusive)]" || d == "[Double]")
      return "a number";
    if (d.rfind("[List of <[Double", 0) == 0)
      return "a comma-separated list of numbers " + d;
    return d;
  }

  DeclaredEntries::DeclaredEntries(const dealii::ParameterHandler &prm)
    : root(std::make_unique<const Section>(declared(prm)))
  {}

  DeclaredEntries::~DeclaredEntries() = default;

  void DeclaredEntries::check_text(const std::string &text, const std::string &file_name) const
  {
    static const std::regex subsection_line(R"(subsection\s+(.*))");
    static const std::regex set_line(R"(set\s+([^=]*?)\s*=\s*(.*))");
    std::vector<const Section *> stack{root.get()};
    std::vector<std::string>     path;
    std::vector<unsigned int>    opened;
    for (const auto &[number, line] : logical_lines(text))
      {
        if (line.empty())
          continue;
        const std::string where = file_name + ":" + std::to_string(number);
        std::smatch       m;
        if (std::regex_match(line, m, subsection_line))
          {
            const std::string name = dealii::Utilities::trim(m[1]);
            stack.push_back(&enter(*stack.back(), path, name, where));
            path.push_back(name);
            opened.push_back(number);
          }
        else if (line == "end")
          {
            if (path.empty())
              fail(where, "'end' without an open subsection");
            stack.pop_back();
            path.pop_back();
            opened.pop_back();
          }
        else if (std::regex_match(line, m, set_line))
          check_entry(*stack.back(), path, m[1], dealii::Utilities::trim(m[2]), where, *root);
        else if (line.rfind("include ", 0) != 0)
          fail(where, "expected 'set Entry = value', 'subsection Name' or 'end', found '" + line + "'");
      }
    if (!path.empty())
      fail(file_name + ":" + std::to_string(opened.back()),
           "subsection '" + path.back() + "' is never closed (an 'end' is missing)");
  }

  void DeclaredEntries::check_assignment(const std::string &assignment, const std::string &origin) const
  {
    const auto eq = assignment.find('=');
    if (eq == std::string::npos)
      fail(origin + " '" + assignment + "'", "expected Section/Entry=value");
    auto parts = dealii::Utilities::split_string_list(assignment.substr(0, eq), '/');
    if (parts.size() < 2)
      fail(origin + " '" + assignment + "'", "expected Section/Entry=value");
    const Section           *here = root.get();
    std::vector<std::string> path;
    const std::string        where = origin + " '" + assignment + "'";
    for (std::size_t k = 0; k + 1 < parts.size(); ++k)
      {
        here = &enter(*here, path, parts[k], where);
        path.push_back(parts[k]);
      }
    check_entry(*here, path, parts.back(), dealii::Utilities::trim(assignment.substr(eq + 1)), where, *root);
  }

  void validate_parameter_text(const dealii::ParameterHandler &prm, const std::string &text,
                               const std::string &file_name)
  {
    DeclaredEntries(prm).check_text(text, file_name);
  }

  void validate_assignment(const dealii::ParameterHandler &prm, const std::string &assignment,
                           const std::string &origin)
  {
    DeclaredEntries(prm).check_assignment(assignment, origin);
  }
} // namespace nappe

#include <deal.II/base/utilities.h>

#include <nappe/io/case_file.h>
#include <nappe/io/parameter_validation.h>

#include <filesystem>
#include <fstream>
#include <sstream>

namespace nappe
{
  namespace fs = std::filesystem;

  namespace
  {
    /// Enters the sections of "A/B/Entry" in @p prm, calls @p f with the entry name, leaves them again.
    template <class F>
    auto at_entry(dealii::ParameterHandler &prm, const std::string &path, F &&f)
    {
      auto parts = dealii::Utilities::split_string_list(path, '/');
      const std::string entry = parts.back();
      parts.pop_back();
      std::size_t entered = 0;
      try
        {
          for (const auto &section : parts)
            prm.enter_subsection(section), ++entered;
          auto result = f(entry);
          for (; entered > 0; --entered)
            prm.leave_subsection();
          return result;
        }
      catch (...)
        {
          for (; entered > 0; --entered)
            prm.leave_subsection();
          throw;
        }
    }
  } // namespace

  const std::vector<std::string> &file_entries()
  {
    static const std::vector<std::string> entries = {"Domain/Mesh file", "Topography/Height map/File",
                                                     "Topography/STL/File", "Output/Directory"};
    return entries;
  }

  std::string entry_text(dealii::ParameterHandler &prm, const std::string &entry)
  {
    try
      {
        return at_entry(prm, entry, [&](const std::string &name) { return prm.get(name); });
      }
    catch (const std::exception &)
      {
        AssertThrow(false, dealii::ExcMessage("'" + entry + "' is not an entry of this parameter file."));
        return {};
      }
  }

  void resolve_relative_paths(dealii::ParameterHandler &prm, const std::string &directory)
  {
    for (const auto &entry : file_entries())
      try
        {
          at_entry(prm, entry, [&](const std::string &name) {
            const std::string value = prm.get(name);
            if (!value.empty() && fs::path(value).is_relative())
              prm.set(name, (fs::path(directory) / value).lexically_normal().string());
            return 0;
          });
        }
      catch (const dealii::ParameterHandler::ExcEntryUndeclared &)
        {
          // a handler without this entry (e.g. a sweep file)
        }
  }

  void read_parameter_file(dealii::ParameterHandler &prm, const std::string &path)
  {
    read_parameter_file(prm, path, DeclaredEntries(prm));
  }

  void read_parameter_file(dealii::ParameterHandler &prm, const std::string &path, const DeclaredEntries &declared)
  {
    // The overloads with an error code: a name the system refuses (e.g. too long) is a missing file here.
    std::error_code       error;
    const fs::file_status status = fs::status(path, error);
    std::string problem = "no such file";
    if (fs::exists(status))
      problem = "not a regular file";
    else if (error && error != std::errc::no_such_file_or_directory)
      problem = error.message();
    AssertThrow(fs::is_regular_file(status),
                dealii::ExcMessage("cannot read the parameter file '" + path + "': " + problem));
    std::ifstream      in(path);
    std::ostringstream text;
    text << in.rdbuf();
    AssertThrow(in, dealii::ExcMessage("cannot read the parameter file '" + path + "'."));
    declared.check_text(text.str(), path);
    prm.parse_input_from_string(text.str(), path);
    const std::string directory = fs::absolute(path).parent_path().string();
    resolve_relative_paths(prm, directory);
  }

  void read_parameter_text(dealii::ParameterHandler &prm, const std::string &text, const std::string &name)
  {
    validate_parameter_text(prm, text, name);
    prm.parse_input_from_string(text, name);
  }
} // namespace nappe

#include <nappe/runs/plotter.h>

#include <cstdlib>
#include <filesystem>

namespace nappe
{
  namespace fs = std::filesystem;

  namespace
  {
    std::string shell_quoted(const std::string &text)
    {
      std::string q = "'";
      for (const char c : text)
        q += c == '\'' ? std::string("'\\''") : std::string(1, c);
      return q + "'";
    }
  } // namespace

  std::string plot_interpreter()
  {
    if (const char *python = std::getenv("NAPPE_PYTHON"); python && *python)
      return python;
    const std::string configured = NAPPE_PLOT_PYTHON;
    std::error_code   ignored;
    return !configured.empty() && fs::exists(configured, ignored) ? configured : "python3";
  }

  std::string plot_script(const std::string &name)
  {
    const char     *data = std::getenv("NAPPE_DATA_DIR");
    std::error_code ignored; // a variable naming no usable folder is skipped
    for (const std::string &dir : {std::string(data ? data : ""), std::string(NAPPE_INSTALLED_DATA_DIR),
                                  std::string(NAPPE_SCRIPTS_DIR)})
      if (!dir.empty() && fs::exists(fs::path(dir) / name, ignored))
        return (fs::path(dir) / name).string();
    return {};
  }

  bool run_plot_script(const std::string &name, const std::vector<std::string> &arguments, std::ostream &log)
  {
    const std::string script = plot_script(name);
    if (script.empty())
      {
        log << "warning: no plots: " << name << " was not found (set NAPPE_DATA_DIR)\n";
        return false;
      }
    std::string command = shell_quoted(plot_interpreter()) + " " + shell_quoted(script);
    for (const auto &a : arguments)
      command += " " + shell_quoted(a);
    log << "Plotting: " << command << "\n" << std::flush;
    if (std::system(command.c_str()) != 0)
      {
        log << "warning: the plotting script failed; the tables are complete (set NAPPE_PYTHON to a Python "
               "with matplotlib)\n";
        return false;
      }
    return true;
  }
} // namespace nappe

#pragma once

#include <ostream>
#include <string>
#include <vector>

namespace nappe
{
  /**
   * The Python interpreter for the plotting scripts: $NAPPE_PYTHON if set, else the interpreter with
   * matplotlib that CMake found when nappe was configured, else "python3" on the PATH.
   */
  std::string plot_interpreter();

  /// The path of a script shipped in scripts/ (source tree, or the installed data directory); empty if missing.
  std::string plot_script(const std::string &name);

  /**
   * Runs the plotting script @p name with @p arguments; returns false and tells @p log why if the
   * interpreter or the script is missing or the script fails.
   */
  bool run_plot_script(const std::string &name, const std::vector<std::string> &arguments, std::ostream &log);
} // namespace nappe

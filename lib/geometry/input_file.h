#pragma once
// Private helper of lib/geometry: the checks every reader makes before it opens an input file.
#include <deal.II/base/exceptions.h>

#include <filesystem>
#include <string>

namespace nappe::internal
{
  /**
   * Throws, naming the file and what kind of file was expected, unless @p filename is an existing
   * regular file (a directory, a device such as /dev/zero or a pipe would otherwise be read as an
   * endless or meaningless stream). @p kind is e.g. "STL" or "height map".
   */
  inline void require_regular_file(const std::string &filename, const std::string &kind)
  {
    namespace fs = std::filesystem;
    std::error_code   error;
    const fs::file_status status = fs::status(filename, error);
    std::string           problem;
    if (!fs::exists(status))
      problem = "does not exist (working directory '" + fs::current_path(error).string() + "')";
    else if (fs::is_directory(status))
      problem = "is a directory";
    else if (!fs::is_regular_file(status))
      problem = "is not a regular file (a device, pipe or socket)";
    AssertThrow(problem.empty(), dealii::ExcMessage(kind + " file '" + filename + "' " + problem +
                                                    "; expected the path of a readable file"));
  }
} // namespace nappe::internal

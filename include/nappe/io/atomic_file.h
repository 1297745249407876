#pragma once

#include <functional>
#include <ostream>
#include <string>

namespace nappe
{
  /**
   * Writes a file so that it never exists half-written: @p write fills "<path>.tmp<pid>", which is
   * renamed to @p path only when the stream is good and closed. Throws with the path on failure.
   */
  void write_atomically(const std::string &path, const std::function<void(std::ostream &)> &write);
} // namespace nappe

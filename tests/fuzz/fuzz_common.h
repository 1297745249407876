#pragma once
// Shared part of nappe's fuzz targets (libFuzzer, see tests/fuzz/README.md). Each target turns the
// fuzzer's bytes into an input file (or text), runs one reader on it and, if the reader accepts it,
// uses the result. The oracle, besides AddressSanitizer and UndefinedBehaviorSanitizer:
//  - rejection must be nappe's (or deal.II's) own exception (dealii::ExceptionBase); a bare
//    std::exception such as std::out_of_range("stoi"), std::bad_alloc or a filesystem error is a finding;
//  - its message as the drivers print it (user_message) must be readable: no control characters, no
//    deal.II assertion block (source location, violated condition, stack trace), and for nappe's own
//    file readers a single line that names the file or entry;
//  - anything accepted must give finite results where the target evaluates it.
// A finding prints the reason and aborts, so that libFuzzer saves the input.
#include <deal.II/base/exceptions.h>

#include <nappe/base/collective.h>

#include <cctype>
#include <cmath>
#include <cstdint>
#include <cstdio>
#include <cstdlib>
#include <filesystem>
#include <functional>
#include <fstream>
#include <sstream>
#include <string>
#include <unistd.h>

namespace nappe::fuzz
{
  /// The input being run, saved with a finding (some libraries' signal handlers keep libFuzzer from
  /// saving it itself).
  inline std::string &current_input()
  {
    static std::string input;
    return input;
  }

  [[noreturn]] inline void finding(const std::string &why)
  {
    std::fprintf(stderr, "\nnappe fuzz finding: %s\n", why.c_str());
    const char       *dir  = std::getenv("NAPPE_FUZZ_FINDINGS");
    const std::string path = std::string(dir ? dir : "/tmp") + "/finding-" +
                             std::to_string(std::hash<std::string>()(current_input()));
    std::ofstream(path, std::ios::binary) << current_input();
    std::fprintf(stderr, "nappe fuzz finding: input saved as %s\n", path.c_str());
    std::abort();
  }

  /// A scratch directory of this process (libFuzzer may run several processes side by side).
  inline const std::filesystem::path &scratch_directory()
  {
    static const std::filesystem::path dir = [] {
      // Memory-backed where available: every execution writes its input there.
      const std::filesystem::path base = std::filesystem::is_directory("/dev/shm") ? "/dev/shm" : std::filesystem::temp_directory_path();
      auto d = base / ("nappe-fuzz-" + std::to_string(::getpid()));
      std::filesystem::create_directories(d);
      std::atexit([] {
        std::error_code ignored;
        std::filesystem::remove_all(scratch_directory(), ignored);
      });
      return d;
    }();
    return dir;
  }

  /// Writes the bytes to scratch_directory()/name and returns the path.
  inline std::string scratch_file(const std::string &name, const uint8_t *data, const size_t size)
  {
    const std::string path = (scratch_directory() / name).string();
    std::ofstream(path, std::ios::binary | std::ios::trunc).write(reinterpret_cast<const char *>(data), size);
    return path;
  }

  /// What rules the message of a rejection must follow.
  struct MessageRules
  {
    /// The message must contain this (the file name or the entry), unless empty.
    std::string must_name;
    /// nappe's own readers give one line; deal.II's parameter errors span several.
    bool one_line = true;
    /// The input, where its text may be quoted in a message (a quoted "Stacktrace" is not a finding).
    std::string input;
  };

  /// Checks a rejection against the oracle above; a violation is a finding.
  inline void check_rejection(const std::exception &e, const MessageRules &rules)
  {
    const auto *deal = dynamic_cast<const dealii::ExceptionBase *>(&e);
    if (!deal)
      finding(std::string("a reader threw a bare std::exception: ") + e.what());
    // The reader's own text (before user_message escapes control characters) and what a driver prints.
    std::ostringstream raw_stream;
    deal->print_info(raw_stream);
    std::string raw = raw_stream.str();
    while (!raw.empty() && std::isspace(static_cast<unsigned char>(raw.front())))
      raw.erase(raw.begin());
    while (!raw.empty() && std::isspace(static_cast<unsigned char>(raw.back())))
      raw.pop_back();
    const std::string shown = user_message(e);
    if (raw.empty())
      finding("empty error message");
    for (const char c : rules.one_line ? raw : shown)
      if ((static_cast<unsigned char>(c) < 0x20 && c != '\n') || c == 0x7f || (rules.one_line && c == '\n'))
        finding("control character or line break " + std::to_string(int(c)) + " in the message: " + shown);
    for (const char *library_text : {"An error occurred in line", "violated condition", "Stacktrace"})
      if (raw.find(library_text) != std::string::npos && rules.input.find(library_text) == std::string::npos)
        finding("library assertion text in the message: " + shown);
    if (!rules.must_name.empty() && raw.find(rules.must_name) == std::string::npos)
      finding("the message does not name '" + rules.must_name + "': " + shown);
  }

  /// Runs @p read; a std::exception is checked as a rejection, anything else propagates (a crash).
  template <typename Read>
  void run_reader(Read &&read, const MessageRules &rules)
  {
    current_input() = rules.input;
    try
      {
        read();
      }
    catch (const std::exception &e)
      {
        check_rejection(e, rules);
      }
  }

  inline void require_finite(const double value, const char *what)
  {
    if (!std::isfinite(value))
      finding(std::string("an accepted input gives a non-finite ") + what);
  }

  /// Component by component (a norm of large finite components may overflow by itself).
  template <typename Vector>
  void require_finite(const Vector &v, const char *what)
  {
    for (unsigned int d = 0; d < 2; ++d)
      require_finite(v[d], what);
  }
} // namespace nappe::fuzz

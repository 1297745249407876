#pragma once

// Test helpers: the message of the exception a call throws, as thrown, as a driver prints it, or with
// deal.II's line wrapping undone.
#include <nappe/base/collective.h>

#include <cctype>
#include <exception>
#include <functional>
#include <string>

namespace nappe::test_support
{
  /// The what() of the exception @p f throws, or "" if it returns normally.
  inline std::string message_of(const std::function<void()> &f)
  {
    try
      {
        f();
      }
    catch (const std::exception &e)
      {
        return e.what();
      }
    return "";
  }

  /// What a driver prints for the exception @p f throws (nappe::user_message), or "" if none.
  inline std::string user_message_of(const std::function<void()> &f)
  {
    try
      {
        f();
      }
    catch (const std::exception &e)
      {
        return user_message(e);
      }
    return "";
  }

  /// The what() of the exception @p f throws with every run of white space collapsed to one blank
  /// (deal.II wraps long messages over several lines), or "" if none.
  inline std::string collapsed_message_of(const std::function<void()> &f)
  {
    std::string out;
    for (const char c : message_of(f))
      if (!std::isspace(static_cast<unsigned char>(c)))
        out += c;
      else if (!out.empty() && out.back() != ' ')
        out += ' ';
    return out;
  }
} // namespace nappe::test_support

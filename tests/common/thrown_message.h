#pragma once

// Test helper: the message of the exception a call throws.
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
} // namespace nappe::test_support

#pragma once

#include <string>

namespace nappe
{
  /// The sentence every report and summary carries: results are model estimates.
  const std::string &model_caution();
} // namespace nappe

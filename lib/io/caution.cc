#include <nappe/io/caution.h>

namespace nappe
{
  const std::string &model_caution()
  {
    static const std::string text = "Model estimates: confirm by measurement before fabrication decisions; lab work "
                                    "follows local safety rules and the institution's practice.";
    return text;
  }
} // namespace nappe

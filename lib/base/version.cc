#include <nappe/base/version.h>

namespace nappe
{
  std::string version() { return NAPPE_VERSION_STRING; }
} // namespace nappe

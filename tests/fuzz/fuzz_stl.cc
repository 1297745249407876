// Fuzz target: STL files, ASCII or binary (StlTopography), then the accepted surface is evaluated on a
// grid over its footprint.
#include <nappe/geometry/stl_topography.h>

#include "fuzz_common.h"

extern "C" int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size)
{
  const std::string input(reinterpret_cast<const char *>(data), size);
  using namespace nappe;
  const std::string file = fuzz::scratch_file("surface.stl", data, size);
  fuzz::run_reader(
    [&] {
      StlTopography::Options o;
      o.outside = size % 2 == 0 ? StlTopography::Outside::constant : StlTopography::Outside::error;
      const StlTopography    stl(file, o);
      const dealii::Point<2> a = stl.footprint_lower(), b = stl.footprint_upper();
      for (unsigned int i = 0; i <= 6; ++i)
        for (unsigned int j = 0; j <= 6; ++j)
          {
            const dealii::Point<2> p(a[0] + (b[0] - a[0]) * i / 6.0, a[1] + (b[1] - a[1]) * j / 6.0);
            fuzz::require_finite(stl.height(p), "STL height");
            fuzz::require_finite(stl.gradient(p), "STL slope");
          }
      (void)stl.description();
    },
    {"surface.stl", true, input});
  return 0;
}

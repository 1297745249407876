// Fuzz target: plain-text height maps (HeightMap::read) in the matrix and the xyz format, then the
// accepted map is evaluated inside and just outside the scan, levelled and smoothed.
#include <nappe/geometry/height_map.h>

#include "fuzz_common.h"

namespace
{
  using namespace nappe;

  void evaluate(const HeightMap &map)
  {
    const dealii::Point<2> a = map.origin(), b = map.last_node();
    for (unsigned int i = 0; i <= 4; ++i)
      for (unsigned int j = 0; j <= 4; ++j)
        {
          const dealii::Point<2> p(a[0] + (b[0] - a[0]) * i / 4.0, a[1] + (b[1] - a[1]) * j / 4.0);
          fuzz::require_finite(map.height(p), "height inside the scan");
          fuzz::require_finite(map.gradient(p), "slope inside the scan");
        }
    // Just outside: periodic and clamped maps answer, 'error' maps reject (a checked message).
    const dealii::Point<2> outside(b[0] + map.spacing()[0], a[1] - map.spacing()[1]);
    fuzz::require_finite(map.height(outside), "height outside the scan");
  }
} // namespace

extern "C" int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size)
{
  const std::string input(reinterpret_cast<const char *>(data), size);
  const std::string file = fuzz::scratch_file("map.txt", data, size);
  for (const auto format : {HeightMap::ReadOptions::Format::matrix, HeightMap::ReadOptions::Format::xyz})
    fuzz::run_reader(
      [&] {
        HeightMap::ReadOptions o;
        o.format           = format;
        o.spacing          = dealii::Tensor<1, 2>({2e-9, 3e-9});
        o.origin           = dealii::Point<2>(-5e-9, 7e-9);
        o.extension        = static_cast<HeightMap::Extension>(size % 3);
        o.first_row_at_top = size % 2 == 1;
        HeightMap map      = HeightMap::read(file, o);
        evaluate(map);
        map.level_plane();
        map.smooth(0.7 * map.spacing()[0]);
        evaluate(map);
      },
      {"map.txt", true, input});
  return 0;
}

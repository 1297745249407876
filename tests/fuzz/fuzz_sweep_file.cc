// Fuzz target: sweep files of nappe-sweep (read_sweep), beside a small valid base case (case.prm). The
// reader checks that every point of the sweep is a valid case, so this also reaches the case reader.
// The records a sweep writes per point have their own target (fuzz_sweep_record.cc).
#include <nappe/io/sweep_file.h>

#include "fuzz_common.h"
#include "fuzz_inputs.h"

extern "C" int LLVMFuzzerInitialize(int *, char ***)
{
  nappe::fuzz::write_companion_files();
  return 0;
}

extern "C" int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size)
{
  const std::string input(reinterpret_cast<const char *>(data), size);
  using namespace nappe;
  const std::string file = fuzz::scratch_file("sweep.prm", data, size);
  fuzz::run_reader(
    [&] {
      const SweepSpec spec = read_sweep(file);
      for (const SweepAxis &axis : spec.axes)
        for (const std::string &value : axis.values)
          if (value.empty())
            fuzz::finding("an accepted sweep axis holds an empty value");
    },
    {"", false, input});
  return 0;
}

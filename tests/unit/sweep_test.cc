// Design sweeps as library calls (io/sweep_file.h, io/sweep_records.h, runs/sweep_run.h): reading a
// sweep file, fingerprints of a point's inputs, resumption that keeps only records computed from the
// same inputs, and the lock of an output folder. The case (our own scenario) is a clamped 100 nm
// square sheet under pressure, two points of a few hundred unknowns each.
#include <nappe/base/collective.h>
#include <nappe/io/sweep_file.h>
#include <nappe/io/sweep_records.h>
#include <nappe/runs/sweep_run.h>

#include <gtest/gtest.h>

#include <unistd.h>

#include <filesystem>
#include <fstream>
#include <sstream>

using namespace nappe;
namespace fs = std::filesystem;

namespace
{
  const char *case_text = R"(
subsection Sheet
  set Material = graphene
end
subsection Domain
  set Shape = rectangle
  set Length x = 100
  set Length y = 100
  set Coarse cells x = 2
  set Coarse cells y = 2
  set Global refinements = 1
end
subsection Edges
  set Conditions = all: clamped/fixed
end
subsection Loads
  set Pressure = 10
end
)";

  /// A scratch folder with case.prm and sweep.prm (the axis values given), removed afterwards.
  struct Scratch
  {
    fs::path dir;
    Scratch(const std::string &values, const std::string &extra = "")
      : dir(fs::temp_directory_path() / ("nappe_sweep_test_" + std::to_string(::getpid())))
    {
      fs::remove_all(dir);
      fs::create_directories(dir);
      std::ofstream(dir / "case.prm") << case_text;
      std::ofstream(dir / "sweep.prm") << "subsection Sweep\n  set Case file = case.prm\n  set Output directory = out\n"
                                       << extra << "  subsection Axis 1\n    set Entries = Loads/Pressure\n"
                                       << "    set Unit = kPa\n    set Values = " << values << "\n  end\nend\n";
    }
    ~Scratch() { fs::remove_all(dir); }
    std::string sweep() const { return (dir / "sweep.prm").string(); }
  };

  std::string message_of(const std::function<void()> &f)
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
} // namespace

TEST(SweepFile, ReadsAxesAndPlacesTheOutputNextToTheSweepFile)
{
  const Scratch   s("10, 20, 40");
  const SweepSpec spec = read_sweep(s.sweep());
  ASSERT_EQ(spec.n_points(), 3u);
  EXPECT_FALSE(spec.axes[0].categorical);
  EXPECT_EQ(spec.axes[0].values[2], "40");
  EXPECT_EQ(fs::path(spec.output_directory), (s.dir / "out").lexically_normal());
  EXPECT_DOUBLE_EQ(point_case(spec, 2).problem.model.loads.pressure, 20e3);
}

TEST(SweepFile, RejectsRepeatedValuesAndOversizedSweepsBeforeAnyWork)
{
  const Scratch repeated("10, 20, 10");
  EXPECT_NE(message_of([&] { read_sweep(repeated.sweep()); }).find("listed twice"), std::string::npos);
  const Scratch     huge("from 0.5 to 2 in 100000000 steps");
  const std::string m = message_of([&] { read_sweep(huge.sweep()); });
  EXPECT_NE(m.find("Point limit"), std::string::npos) << m;
  const Scratch limited("10, 20, 30", "  set Point limit = 2\n");
  EXPECT_NE(message_of([&] { read_sweep(limited.sweep()); }).find("Point limit = 2"), std::string::npos);
}

TEST(SweepFile, FingerprintFollowsEveryInputThatChangesAResult)
{
  const Scratch     s("10, 20");
  const SweepSpec   spec = read_sweep(s.sweep());
  const std::string a1 = point_fingerprint(spec, 1), a2 = point_fingerprint(spec, 2);
  EXPECT_EQ(a1, point_fingerprint(spec, 1));
  EXPECT_NE(a1, a2);
  std::ofstream(s.dir / "case.prm", std::ios::app) << "subsection Sheet\n  set Material = MoS2\nend\n";
  EXPECT_NE(point_fingerprint(read_sweep(s.sweep()), 1), a1);
}

TEST(SweepRun, ResumesOnlyRecordsComputedFromTheSameInputs)
{
  const Scratch       s("10, 20");
  const SweepSpec     spec  = read_sweep(s.sweep());
  const SweepProgress first = run_sweep(spec, MPI_COMM_SELF, 1, nullptr);
  EXPECT_EQ(first.computed, 1u);
  EXPECT_FALSE(first.complete);
  const SweepProgress second = run_sweep(spec, MPI_COMM_SELF, 100, nullptr);
  EXPECT_EQ(second.kept, 1u);
  EXPECT_EQ(second.computed, 1u);
  EXPECT_TRUE(second.complete);
  EXPECT_EQ(second.failed, 0u);

  // A changed case recomputes every point.
  std::ofstream(s.dir / "case.prm", std::ios::app) << "subsection Sheet\n  set Material = MoS2\nend\n";
  const SweepSpec     changed = read_sweep(s.sweep());
  const SweepProgress third   = run_sweep(changed, MPI_COMM_SELF, 100, nullptr);
  EXPECT_EQ(third.kept, 0u);
  EXPECT_EQ(third.computed, 2u);

  // A truncated record is recomputed.
  const std::string record = point_record_path(changed, 2);
  fs::resize_file(record, fs::file_size(record) / 2);
  const SweepProgress fourth = run_sweep(changed, MPI_COMM_SELF, 100, nullptr);
  EXPECT_EQ(fourth.kept, 1u);
  EXPECT_EQ(fourth.computed, 1u);
  EXPECT_TRUE(fs::exists(fs::path(changed.output_directory) / "sweep.csv"));
  EXPECT_FALSE(fs::exists(fs::path(changed.output_directory) / "sweep.lock"));
}

TEST(SweepRun, AFolderLockedByALiveProcessIsRefused)
{
  const Scratch   s("10");
  const SweepSpec spec = read_sweep(s.sweep());
  fs::create_directories(spec.output_directory);
  char host[256] = {};
  gethostname(host, sizeof(host) - 1);
  std::ofstream(fs::path(spec.output_directory) / "sweep.lock") << ::getppid() << " " << host << "\n";
  const std::string m = message_of([&] { run_sweep(spec, MPI_COMM_SELF, 100, nullptr); });
  EXPECT_NE(m.find("being written by process " + std::to_string(::getppid())), std::string::npos) << m;
  EXPECT_TRUE(fs::exists(fs::path(spec.output_directory) / "sweep.lock")); // not ours to remove
}

// Design sweeps as library calls (io/sweep_file.h, io/sweep_records.h, runs/sweep_run.h): reading a
// sweep file, fingerprints of a point's inputs, resumption that keeps only records computed from the
// same inputs, the lock of an output folder, per-point material data, and a sweep over a period that
// stays right because the cell follows the topography. The cases (our own scenarios) are a clamped
// 100 nm square sheet under pressure and a graphene strip on a grating, a few hundred unknowns each.
#include <nappe/analysis/state_summary.h>
#include <nappe/base/collective.h>
#include <nappe/io/case_file.h>
#include <nappe/io/parameter_override.h>
#include <nappe/io/sweep_file.h>
#include <nappe/io/sweep_records.h>
#include <nappe/physics/material_catalogue.h>
#include <nappe/runs/case_run.h>
#include <nappe/runs/sweep_run.h>

#include <common/thrown_message.h>

#include <gtest/gtest.h>

#include <unistd.h>

#include <algorithm>
#include <filesystem>
#include <fstream>
#include <sstream>

using namespace nappe;
using test_support::user_message_of;
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

  const char *grating_text = R"(
subsection Sheet
  set Material = graphene
end
subsection Domain
  set Shape = rectangle
  set Length y = 1.25
  set Periodic = true
  set Periods per cell = 1
  set Coarse cells x = 16
  set Global refinements = 0
end
subsection Edges
  set Conditions =
end
subsection Substrate
  set Enabled = true
end
subsection Topography
  set Type = sinusoidal grating
  subsection Sinusoidal grating
    set Amplitude = 1
    set Wavelength = 20
  end
end
subsection Adhesion
  set Work of adhesion = from catalogue
  set Substrate material = SiO2
  set Equilibrium separation = 0.5
end
subsection Solver
  set Load steps = 1
end
)";

  /// A scratch folder with case.prm (@p case_file) and sweep.prm (one axis over @p entry with @p values),
  /// removed afterwards.
  struct Scratch
  {
    fs::path dir;
    Scratch(const std::string &values, const std::string &extra = "", const std::string &entry = "Loads/Pressure",
            const char *case_file = case_text)
      : dir(fs::temp_directory_path() / ("nappe_sweep_test_" + std::to_string(::getpid())))
    {
      fs::remove_all(dir);
      fs::create_directories(dir);
      std::ofstream(dir / "case.prm") << case_file;
      std::ofstream(dir / "sweep.prm") << "subsection Sweep\n  set Case file = case.prm\n  set Output directory = out\n"
                                       << extra << "  subsection Axis 1\n    set Entries = " << entry << "\n"
                                       << "    set Values = " << values << "\n  end\nend\n";
    }
    ~Scratch() { fs::remove_all(dir); }
    std::string sweep() const { return (dir / "sweep.prm").string(); }
  };

  /// Writes @p text as the record of @p point and returns why the reader refuses it ("" if it keeps it).
  std::string refusal(const SweepSpec &spec, const std::vector<std::string> &columns, const unsigned int point,
                      const std::string &text)
  {
    std::ofstream(point_record_path(spec, point), std::ios::trunc) << text;
    std::string why;
    return read_point_record(spec, columns, point, why) ? "" : why;
  }

  /// @p text with the first @p from replaced by @p to.
  std::string replaced(std::string text, const std::string &from, const std::string &to)
  {
    const auto at = text.find(from);
    EXPECT_NE(at, std::string::npos) << from;
    return at == std::string::npos ? text : text.replace(at, from.size(), to);
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
  EXPECT_NE(user_message_of([&] { read_sweep(repeated.sweep()); }).find("listed twice"), std::string::npos);
  const Scratch     huge("from 0.5 to 2 in 100000000 steps");
  const std::string m = user_message_of([&] { read_sweep(huge.sweep()); });
  EXPECT_NE(m.find("Point limit"), std::string::npos) << m;
  const Scratch limited("10, 20, 30", "  set Point limit = 2\n");
  EXPECT_NE(user_message_of([&] { read_sweep(limited.sweep()); }).find("Point limit = 2"), std::string::npos);
}

TEST(SweepFile, NamesTheFirstPointWhoseCaseIsInvalid)
{
  // Every point is checked when the file is read (one handler serves all points).
  const Scratch     s("graphene, MoS2, unobtainium, hBN", "", "Sheet/Material");
  const std::string m = user_message_of([&] { read_sweep(s.sweep()); });
  EXPECT_NE(m.find("point 3 is not a valid case"), std::string::npos) << m;
  EXPECT_NE(m.find("unobtainium"), std::string::npos) << m;
  const Scratch     valid("graphene, MoS2, WSe2", "", "Sheet/Material");
  const SweepSpec   spec = read_sweep(valid.sweep());
  EXPECT_EQ(point_case(spec, 3).problem.model.material.name, "WSe2");
  EXPECT_EQ(point_case(spec, 1).problem.model.material.name, "graphene");
}

TEST(SweepFile, ACaseFileNameTooLongForTheSystemIsAMissingFile)
{
  // Found by the sweep-file fuzz target: the file system's "File name too long" escaped as a bare
  // std::filesystem error instead of nappe's message naming the entry.
  const Scratch s("10, 20");
  const std::string name(300, 'c');
  std::ofstream(s.dir / "long.prm") << "subsection Sweep\n  set Case file = " << name << "\n  subsection Axis 1\n"
                                    << "    set Entries = Loads/Pressure\n    set Values = 1, 2\n  end\nend\n";
  const std::string m = user_message_of([&] { read_sweep((s.dir / "long.prm").string()); });
  EXPECT_NE(m.find("Sweep/Case file: '"), std::string::npos) << m;
  EXPECT_NE(m.find("does not exist (File name too long)"), std::string::npos) << m;
  const std::string c = user_message_of([&] {
    dealii::ParameterHandler prm;
    read_parameter_file(prm, (s.dir / name).string());
  });
  EXPECT_NE(c.find("cannot read the parameter file"), std::string::npos) << c;
  EXPECT_NE(c.find("File name too long"), std::string::npos) << c;
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

// A resumed sweep keeps a point whose record it reads back and copies the record's row into sweep.csv,
// so a record whose row the writer could not have written for that point (damaged, or edited by hand
// while its fingerprint still matches) must be refused and the point computed again.
TEST(SweepRecords, KeepOnlyTheRowWrittenForTheirPoint)
{
  const Scratch   s("10, 20");
  const SweepSpec spec    = read_sweep(s.sweep());
  const auto      columns = sweep_value_columns(spec);
  PointRecord     r;
  r.point       = 1;
  r.fingerprint = "0123456789abcdef";
  r.ok          = true;
  r.values.assign(columns.size(), 0.25);
  r.message = "a note\twith a tab";
  fs::create_directories(fs::path(point_record_path(spec, 1)).parent_path());
  write_point_record(spec, columns, r);
  std::string why;
  const auto  stored = read_point_record(spec, columns, 1, why);
  ASSERT_TRUE(stored) << why;
  EXPECT_EQ(stored->fingerprint, r.fingerprint);
  EXPECT_EQ(stored->row.find('\t'), std::string::npos) << "control characters are blanked in the table";

  std::ostringstream written;
  written << std::ifstream(point_record_path(spec, 1)).rdbuf();
  const std::string text = written.str();
  EXPECT_EQ(refusal(spec, columns, 1, text), "");
  EXPECT_NE(refusal(spec, columns, 1, replaced(text, ",0.25,", ",nan,")).find("not a finite number"),
            std::string::npos);
  EXPECT_NE(refusal(spec, columns, 1, replaced(text, "status ok", "status failed")).find("status"),
            std::string::npos);
  EXPECT_NE(refusal(spec, columns, 1, replaced(text, "status ok", "status okay")).find("malformed"),
            std::string::npos);
  EXPECT_NE(refusal(spec, columns, 1, replaced(text, "row 1,10,", "row 1,20,")).find("axis values"),
            std::string::npos);
  EXPECT_NE(refusal(spec, columns, 2, text).find("another point's number"), std::string::npos);
}

TEST(SweepRun, APointOnASurfaceTooSteepForASheetModelFailsNamingTheSlope)
{
  // The checks nappe-solve makes before solving apply to every point: a 500 nm amplitude on a 20 nm
  // grating (slope 157) used to be computed and reported "ok".
  const Scratch     s("1, 500", "", "Topography/Sinusoidal grating/Amplitude", grating_text);
  const SweepSpec   spec  = read_sweep(s.sweep());
  const PointRecord steep = compute_sweep_point(spec, 2);
  EXPECT_FALSE(steep.ok);
  EXPECT_NE(steep.message.find("steeper than 84"), std::string::npos) << steep.message;
}

TEST(SweepRun, AFolderLockedByALiveProcessIsRefused)
{
  const Scratch   s("10");
  const SweepSpec spec = read_sweep(s.sweep());
  fs::create_directories(spec.output_directory);
  char host[256] = {};
  gethostname(host, sizeof(host) - 1);
  std::ofstream(fs::path(spec.output_directory) / "sweep.lock") << ::getppid() << " " << host << "\n";
  const std::string m = user_message_of([&] { run_sweep(spec, MPI_COMM_SELF, 100, nullptr); });
  EXPECT_NE(m.find("being written by process " + std::to_string(::getppid())), std::string::npos) << m;
  EXPECT_TRUE(fs::exists(fs::path(spec.output_directory) / "sweep.lock")); // not ours to remove
}

// A changed work of adhesion recomputes every point, and the numbers follow it.
TEST(SweepRun, ChangedWorkOfAdhesionRecomputesEveryPoint)
{
  const Scratch s("0.5, 1", "", "Topography/Sinusoidal grating/Amplitude", grating_text);
  const SweepSpec     spec  = read_sweep(s.sweep());
  const PointRecord   before = compute_sweep_point(spec, 2);
  ASSERT_TRUE(run_sweep(spec, MPI_COMM_SELF, 100, nullptr).complete);
  std::ofstream(s.dir / "case.prm", std::ios::app) << "subsection Adhesion\n  set Work of adhesion = 0.05\nend\n";
  const SweepSpec     changed = read_sweep(s.sweep());
  const SweepProgress rerun   = run_sweep(changed, MPI_COMM_SELF, 100, nullptr);
  EXPECT_EQ(rerun.kept, 0u);
  EXPECT_EQ(rerun.computed, 2u);
  const PointRecord after = compute_sweep_point(changed, 2);
  EXPECT_DOUBLE_EQ(after.work_of_adhesion, 0.05);
  EXPECT_NE(after.values.back(), before.values.back()) << "energy per area must follow Γ";
}

// A sweep over the sheet material takes each pair's Γ from the catalogue and each material's fracture
// strain (share/materials.prm: graphene on SiO2 0.45 J/m², Koenig et al., Nature Nanotechnology 6, 543
// (2011); MoS2 on SiO2 0.22 J/m²; fracture strains as listed there), and writes the axis by name.
TEST(SweepRun, MaterialAxisUsesEachPairsWorkOfAdhesionAndFractureStrain)
{
  const Scratch   s("graphene, MoS2", "", "Sheet/Material", grating_text);
  const SweepSpec spec = read_sweep(s.sweep());
  ASSERT_TRUE(spec.axes[0].categorical);
  const MaterialCatalogue catalogue;
  for (unsigned int p = 1; p <= 2; ++p)
    {
      const std::string material = spec.axes[0].values[p - 1];
      const PointRecord r        = compute_sweep_point(spec, p);
      EXPECT_TRUE(r.ok) << r.message;
      EXPECT_DOUBLE_EQ(r.work_of_adhesion, catalogue.work_of_adhesion(material, "SiO2")) << material;
      EXPECT_DOUBLE_EQ(r.fracture_strain, catalogue.material(material).fracture_strain) << material;
      EXPECT_EQ(sweep_table_row(spec, r).substr(0, 4 + material.size()), std::to_string(p) + ",\"" + material + "\"");
    }
}

// With Periods per cell = 1 the cell follows the grating, so a sweep over the wavelength gives the same
// numbers as cases written by hand with the cell length set to each wavelength.
TEST(SweepRun, SweepOverThePeriodMatchesHandWrittenCases)
{
  const Scratch   s("20, 30", "", "Topography/Sinusoidal grating/Wavelength", grating_text);
  const SweepSpec spec = read_sweep(s.sweep());
  for (unsigned int p = 1; p <= 2; ++p)
    {
      const std::string wavelength = spec.axes[0].values[p - 1];
      dealii::ParameterHandler prm;
      declare_sheet_case_parameters(prm);
      read_parameter_text(prm, grating_text, "hand-written case");
      apply_override(prm, "Domain/Periods per cell=0");
      apply_override(prm, "Domain/Length x=" + wavelength);
      apply_override(prm, "Topography/Sinusoidal grating/Wavelength=" + wavelength);
      const SheetCase   hand  = parse_sheet_case(prm);
      const PointRecord swept = compute_sweep_point(spec, p);
      const CaseRun     run   = run_sheet_case(hand, MPI_COMM_SELF, nullptr, false);
      ASSERT_TRUE(swept.ok && run.result.converged) << swept.message << run.result.message;
      const auto values = summary_values(run.result.measures, &*run.result.conformation);
      for (std::size_t k = 0; k < values.size(); ++k)
        EXPECT_DOUBLE_EQ(swept.values[k], values[k]) << "wavelength " << wavelength << ", column " << k;
    }
}

TEST(SweepFile, ColumnsKeepTheElectronicEstimatesThatEveryMaterialOfTheSweepHas)
{
  // MoS2 and WS2 both have a published biaxial gap coefficient (share/materials.prm): the gap-shift extremes are
  // columns. graphene has a pseudo-magnetic field and no gap: mixed with MoS2 neither column is kept, the strain
  // columns are.
  const auto has = [](const std::vector<std::string> &columns, const std::string &name) {
    return std::find(columns.begin(), columns.end(), name) != columns.end();
  };
  {
    const Scratch s("MoS2, WS2", "", "Sheet/Material");
    const auto    columns = sweep_value_columns(read_sweep(s.sweep()));
    EXPECT_TRUE(has(columns, "max_gap_shift_meV"));
    EXPECT_TRUE(has(columns, "min_gap_shift_meV"));
  }
  {
    const Scratch s("graphene, MoS2", "", "Sheet/Material");
    const auto    columns = sweep_value_columns(read_sweep(s.sweep()));
    EXPECT_FALSE(has(columns, "max_gap_shift_meV"));
    EXPECT_FALSE(has(columns, "max_pseudo_magnetic_field_K_T"));
    EXPECT_TRUE(has(columns, "max_principal_strain"));
    EXPECT_EQ(columns.back(), "energy_J_per_m2");
  }
}

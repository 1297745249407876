// Fuzz target: the per-point records of nappe-sweep (read_point_record). A resumed sweep keeps a point
// whose record it accepts and copies the record's row into sweep.csv, so an accepted record must hold
// the row the writer gives for that point. The bytes become the record of points 1 and 2 of three
// sweeps beside the companion files (fuzz_inputs.h), all writing into records/:
//  - "pressure": the clamped disk of case.prm over a numeric axis, one solve per point;
//  - "failing": the same with the Γ thresholds, which fail for want of a substrate;
//  - "materials": a graphene strip on a grating over a categorical axis (sheet material), with the
//    Γ thresholds (three more columns).
// The seeds in corpus/sweep_record/ are records that nappe-sweep wrote for these sweeps.
// Besides the common oracle: a rejection's reason (it follows "point N: recomputing," in the log) must
// be one clean line; an accepted record's row must have the header's number of fields, the point's
// number and axis values, the status of the record's status line, an empty or positive finite Γ and
// fracture strain, finite numbers in the value columns of a point that succeeded (empty ones if it
// failed), empty or finite thresholds, a quoted message and no control characters.
#include <nappe/io/sweep_file.h>
#include <nappe/io/sweep_records.h>
#include <nappe/runs/sweep_run.h>

#include "fuzz_common.h"
#include "fuzz_inputs.h"

#include <vector>

namespace
{
  using namespace nappe;

  const char *grating_case = R"(subsection Domain
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

  const char *pressure_sweep = R"(subsection Sweep
  set Case file = case.prm
  set Output directory = records
  subsection Axis 1
    set Entries = Loads/Pressure
    set Values = 0.5, 1
  end
end
)";

  // The same disk with thresholds: it has no substrate, so every point fails (a record of a failure).
  const char *failing_sweep = R"(subsection Sweep
  set Case file = case.prm
  set Output directory = records
  set Thresholds = true
  subsection Axis 1
    set Entries = Loads/Pressure
    set Values = 0.5, 1
  end
end
)";

  const char *materials_sweep = R"(subsection Sweep
  set Case file = grating.prm
  set Output directory = records
  set Thresholds = true
  subsection Axis 1
    set Entries = Sheet/Material
    set Values = graphene, MoS2
  end
end
)";

  struct Sweep
  {
    SweepSpec                spec;
    std::vector<std::string> columns;
  };

  std::vector<Sweep> &sweeps()
  {
    static std::vector<Sweep> s;
    return s;
  }

  /// The fields of a table row; a quoted field keeps its quotes.
  std::vector<std::string> fields_of(const std::string &row)
  {
    std::vector<std::string> fields(1);
    bool                     in_quotes = false;
    for (const char ch : row)
      {
        if (ch == '"')
          in_quotes = !in_quotes;
        if (ch == ',' && !in_quotes)
          fields.emplace_back();
        else
          fields.back() += ch;
      }
    return fields;
  }

  bool is_finite_number(const std::string &field)
  {
    if (field.empty())
      return false;
    char        *end = nullptr;
    const double v   = std::strtod(field.c_str(), &end);
    return *end == '\0' && std::isfinite(v);
  }

  void require(const bool condition, const std::string &what, const std::string &row)
  {
    if (!condition)
      fuzz::finding("an accepted record has " + what + ": " + row);
  }

  void check_accepted(const Sweep &sweep, const unsigned int point, const StoredRecord &stored)
  {
    const SweepSpec &spec = sweep.spec;
    const std::string &row = stored.row;
    for (const char ch : row)
      require(static_cast<unsigned char>(ch) >= 0x20 && ch != 0x7f, "a control character in its row", row);
    const auto f = fields_of(row);
    require(f.size() == fields_of(sweep_table_header(spec, sweep.columns)).size(), "the wrong number of fields", row);
    std::size_t i = 0;
    require(f[i++] == std::to_string(point), "another point's number", row);
    const auto indices = spec.indices(point);
    for (std::size_t a = 0; a < spec.axes.size(); ++a)
      {
        const std::string &value = spec.axes[a].values[indices[a]];
        require(f[i++] == (spec.axes[a].categorical ? "\"" + value + "\"" : value), "another point's axis value",
                row);
      }
    require(f[i++] == (stored.ok ? "ok" : "failed"), "a status other than its status line", row);
    require(stored.ok || f[i].empty(), "a regime for a failed point", row);
    ++i;
    for (const char *what : {"work of adhesion", "fracture strain"})
      {
        require(f[i].empty() || (is_finite_number(f[i]) && std::strtod(f[i].c_str(), nullptr) > 0),
                std::string("a ") + what + " that is not a positive finite number", row);
        ++i;
      }
    for (std::size_t c = 0; c < sweep.columns.size(); ++c, ++i)
      require(stored.ok ? is_finite_number(f[i]) : f[i].empty(),
              stored.ok ? "a value that is not a finite number" : "a value for a failed point", row);
    if (spec.thresholds)
      for (std::size_t t = 0; t < 3; ++t, ++i)
        require(f[i].empty() || is_finite_number(f[i]), "a threshold that is not a finite number", row);
    const std::string &message = f[i];
    require(message.size() >= 2 && message.front() == '"' && message.back() == '"' &&
              message.find('"', 1) == message.size() - 1,
            "a message that is not one quoted field", row);
  }

  void check_reason(const std::string &why)
  {
    if (why.empty())
      fuzz::finding("a record was refused without a reason");
    for (const char ch : why)
      if (static_cast<unsigned char>(ch) < 0x20 || ch == 0x7f)
        fuzz::finding("a control character or line break in the reason a record was refused: " + why);
  }
} // namespace

extern "C" int LLVMFuzzerInitialize(int *, char ***)
{
  fuzz::write_companion_files();
  std::ofstream("grating.prm") << grating_case;
  std::ofstream("pressure.prm") << pressure_sweep;
  std::ofstream("failing.prm") << failing_sweep;
  std::ofstream("materials.prm") << materials_sweep;
  for (const char *file : {"pressure.prm", "failing.prm", "materials.prm"})
    {
      Sweep s;
      s.spec    = read_sweep(file);
      s.columns = sweep_value_columns(s.spec);
      sweeps().push_back(s);
    }
  std::filesystem::create_directories(std::filesystem::path(sweeps().front().spec.output_directory) / "points");
  return 0;
}

extern "C" int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size)
{
  const std::string input(reinterpret_cast<const char *>(data), size);
  const SweepSpec  &any = sweeps().front().spec;
  for (const unsigned int point : {1u, 2u})
    std::ofstream(point_record_path(any, point), std::ios::binary | std::ios::trunc).write(input.data(), size);
  for (const Sweep &sweep : sweeps())
    for (const unsigned int point : {1u, 2u})
      fuzz::run_reader(
        [&] {
          std::string why;
          if (const auto stored = read_point_record(sweep.spec, sweep.columns, point, why))
            check_accepted(sweep, point, *stored);
          else
            check_reason(why);
        },
        {"point-000", true, input});
  return 0;
}

#include <deal.II/base/timer.h>
#include <deal.II/base/utilities.h>

#include <nappe/analysis/adhesion_limits.h>
#include <nappe/analysis/design_sweep.h>
#include <nappe/io/atomic_file.h>
#include <nappe/io/command_line.h>
#include <nappe/io/json_writer.h>
#include <nappe/io/limits_report.h>
#include <nappe/io/sheet_case.h>
#include <nappe/io/sheet_run.h>

#include <cmath>
#include <filesystem>
#include <fstream>
#include <iomanip>
#include <sstream>

namespace nappe
{
  using dealii::ExcMessage;
  namespace fs = std::filesystem;

  namespace
  {
    const char *const caution = "Model estimates: confirm by measurement before fabrication decisions.";

    /// Most points a sweep file may define (common practice, no source: every point is a full solve, and
    /// a larger count is a typing mistake such as 'in 100000000 steps' that would exhaust memory first).
    constexpr unsigned int max_sweep_points = 10000;

    void declare_axis(dealii::ParameterHandler &prm, const std::string &name)
    {
      prm.enter_subsection(name);
      prm.declare_entry("Entries", "", dealii::Patterns::Anything(),
                        "Case-file entries set to each value, separated by ';', e.g. "
                        "'Topography/Sinusoidal grating/Wavelength; Domain/Length x'. Empty: no such axis.");
      prm.declare_entry("Name", "", dealii::Patterns::Anything(), "Name of the axis in tables and plots.");
      prm.declare_entry("Unit", "", dealii::Patterns::Anything(),
                        "Unit of the values: the unit the case file documents for the entries (e.g. nm, J/m^2).");
      prm.declare_entry("Values", "", dealii::Patterns::Anything(),
                        "Comma-separated values, or 'from A to B in N steps' (evenly spaced, N >= 2) [Unit]; or "
                        "comma-separated names (e.g. materials of the catalogue): a categorical axis.");
      prm.leave_subsection();
    }

    std::vector<double> parse_values(const std::string &text, const std::string &where)
    {
      std::istringstream in(text);
      std::string        from, to, in_word, steps_word;
      double             a = 0, b = 0;
      unsigned int       n = 0;
      if (text.rfind("from", 0) == 0)
        {
          AssertThrow((in >> from >> a >> to >> b >> in_word >> n >> steps_word) && to == "to" && in_word == "in" &&
                        n >= 2 && n <= max_sweep_points && std::isfinite(b - a),
                      ExcMessage(where + ": expected 'from A to B in N steps' with finite A, B and 2 <= N <= " +
                                 std::to_string(max_sweep_points) + ", found '" + text + "'."));
          std::vector<double> v;
          for (unsigned int i = 0; i < n; ++i)
            v.push_back(a + (b - a) * i / (n - 1));
          return v;
        }
      std::vector<double> v;
      for (const auto &item : dealii::Utilities::split_string_list(text, ','))
        {
          std::size_t used = 0;
          try
            {
              v.push_back(std::stod(item, &used));
            }
          catch (...)
            {
              used = 0;
            }
          if (used != item.size())
            return {}; // not all numbers: a categorical axis
          AssertThrow(std::isfinite(v.back()), ExcMessage(where + ": expected finite numbers, found '" + item + "'."));
        }
      AssertThrow(!v.empty(), ExcMessage(where + ": expected at least one value."));
      return v;
    }

    SweepAxis parse_axis(dealii::ParameterHandler &prm, const std::string &name)
    {
      SweepAxis axis;
      prm.enter_subsection(name);
      axis.entries = dealii::Utilities::split_string_list(prm.get("Entries"), ';');
      axis.name    = prm.get("Name");
      axis.unit    = prm.get("Unit");
      if (!axis.entries.empty())
        {
          axis.values = parse_values(prm.get("Values"), "Sweep/" + name + "/Values");
          if (axis.values.empty())
            {
              axis.labels = dealii::Utilities::split_string_list(prm.get("Values"), ',');
              for (std::size_t i = 0; i < axis.labels.size(); ++i)
                axis.values.push_back(i + 1);
            }
        }
      prm.leave_subsection();
      if (axis.name.empty() && !axis.entries.empty())
        axis.name = axis.entries.front();
      return axis;
    }

    std::string number(double v)
    {
      std::ostringstream s;
      s << std::setprecision(10) << v;
      return s.str();
    }

    std::string point_name(unsigned int point)
    {
      std::ostringstream s;
      s << "point-" << std::setw(4) << std::setfill('0') << point;
      return s.str();
    }

    /// The case of one point: base file, fixed overrides, then the axis values.
    SheetCase point_case(const SweepSpec &spec, unsigned int point)
    {
      dealii::ParameterHandler prm;
      declare_sheet_case_parameters(prm);
      prm.parse_input(spec.case_file);
      for (const auto &o : spec.overrides)
        apply_override(prm, o);
      const auto indices = spec.indices(point);
      for (std::size_t a = 0; a < spec.axes.size(); ++a)
        for (const auto &entry : spec.axes[a].entries)
          apply_override(prm, entry + "=" + spec.axes[a].text(indices[a]));
      SheetCase c     = parse_sheet_case(prm);
      c.write_results = false;
      return c;
    }

    std::string csv_header(const SweepSpec &spec)
    {
      std::string h = "point";
      for (std::size_t a = 0; a < spec.axes.size(); ++a)
        h += ",axis_" + std::to_string(a + 1);
      h += ",status,regime,conformed_fraction,peak_principal_strain,max_areal_strain,max_shear_strain,max_gap_nm,"
           "energy_J_per_m2";
      if (spec.thresholds)
        h += ",gamma_hold_J_per_m2,gamma_snap_J_per_m2,gamma_eq_J_per_m2";
      return h + ",message";
    }

    /// The measured state of a point as CSV fields (after the axes).
    struct PointRecord
    {
      bool        ok = false;
      std::string regime, message;
      std::vector<double> measures; ///< fraction, strains, gap [nm], energy [J/m²]
      std::vector<std::string> thresholds;
    };

    std::string threshold_field(const AdhesionThreshold &t) { return t.found ? number(t.value()) : ""; }

    std::string quoted(std::string text)
    {
      for (auto &ch : text)
        if (ch == '"' || ch == '\n')
          ch = '\'';
      return "\"" + text + "\"";
    }

    PointRecord compute_with_thresholds(const SheetCase &c, const std::string &path_file)
    {
      PointRecord          r;
      AdhesionPathSettings s = c.limits;
      const double         gamma = c.adhesion->law().work_of_adhesion();
      s.stops                    = {gamma};
      s.lowest_work_of_adhesion  = std::min(s.lowest_work_of_adhesion, gamma);
      s.highest_work_of_adhesion = std::max(s.highest_work_of_adhesion, gamma);
      const AdhesionLimits limits = find_adhesion_limits(c, s, MPI_COMM_SELF, nullptr);
      write_adhesion_paths_csv(path_file, limits);
      const AdhesionPath &path = c.protocol == Protocol::laid_down ? limits.raising : limits.lowering;
      const AdhesionPathPoint *p = point_at(path, gamma);
      r.thresholds = {threshold_field(limits.hold), threshold_field(limits.snap), threshold_field(limits.equal_energy)};
      r.ok         = limits.lowering.complete && limits.raising.complete && p;
      if (!r.ok)
        {
          r.message = !limits.lowering.complete ? limits.lowering.message : limits.raising.message;
          return r;
        }
      r.regime   = verdict(*p, s.target_fraction);
      r.measures = {p->conformed_fraction, p->peak_principal_strain, p->max_areal_strain, p->max_shear_strain,
                    p->max_gap * 1e9, p->energy_per_area.total()};
      return r;
    }

    PointRecord compute_single(const SheetCase &c)
    {
      PointRecord          r;
      const SheetRunResult result = run_sheet_case(c, MPI_COMM_SELF, nullptr);
      r.ok                        = result.converged;
      if (!r.ok)
        {
          r.message = result.message;
          return r;
        }
      const double area = c.domain.area();
      const auto  &m    = result.measures;
      const double fraction = result.conformation ? result.conformation->conformed_fraction : 0.0;
      const double gap      = result.conformation ? result.conformation->max_gap * 1e9 : 0.0;
      r.regime   = result.conformation ? conformation_verdict(fraction) : "";
      r.measures = {fraction, m.max_principal_strain.value, m.max_areal_strain.value, m.max_shear_strain.value, gap,
                    result.energy.total() / area};
      return r;
    }

    std::string record_line(const SweepSpec &spec, unsigned int point, const PointRecord &r)
    {
      std::string line = std::to_string(point);
      for (const double v : spec.values(point))
        line += "," + number(v);
      line += r.ok ? ",ok," + r.regime : ",failed,";
      for (std::size_t i = 0; i < 6; ++i)
        line += "," + (r.ok ? number(r.measures[i]) : std::string());
      if (spec.thresholds)
        for (std::size_t i = 0; i < 3; ++i)
          line += "," + (r.thresholds.size() == 3 ? r.thresholds[i] : std::string());
      return line + "," + quoted(r.message);
    }

    /// Computes one point and writes its record; returns whether it succeeded.
    bool run_point(const SweepSpec &spec, unsigned int point)
    {
      const fs::path dir  = fs::path(spec.output_directory) / "points";
      const std::string base = (dir / point_name(point)).string();
      PointRecord r;
      try
        {
          const SheetCase c = point_case(spec, point);
          r = spec.thresholds ? compute_with_thresholds(c, base + "_path.csv") : compute_single(c);
        }
      catch (const std::exception &e)
        {
          r.ok      = false;
          r.message = user_message(e);
        }
      write_atomically(base + ".csv", [&](std::ostream &out) { out << record_line(spec, point, r) << "\n"; });
      return r.ok;
    }

    void write_sweep_json(const SweepSpec &spec, const std::string &path)
    {
      const SheetCase base = point_case(spec, 1);
      write_atomically(path, [&](std::ostream &out) {
        JsonWriter json(out);
        json.begin_object();
        json.value("title", spec.title);
        json.value("note", caution);
        json.value("case_file", spec.case_file);
        json.begin_array("axes");
        for (const auto &a : spec.axes)
          {
            json.begin_object();
            std::string entries;
            for (const auto &e : a.entries)
              entries += (entries.empty() ? "" : "; ") + e;
            json.value("parameter", entries);
            json.value("name", a.name);
            json.value("unit", a.unit);
            json.begin_array("values");
            for (const double v : a.values)
              json.value("", v);
            json.end_array();
            if (!a.labels.empty())
              {
                json.begin_array("labels");
                for (const auto &l : a.labels)
                  json.value("", l);
                json.end_array();
              }
            json.end_object();
          }
        json.end_array();
        json.value("work_of_adhesion_J_per_m2", base.adhesion ? base.adhesion->law().work_of_adhesion() : 0.0);
        if (base.model.material.fracture_strain > 0)
          json.value("fracture_strain", base.model.material.fracture_strain);
        else
          json.null("fracture_strain");
        json.value("target_fraction", base.limits.target_fraction);
        json.value("thresholds", spec.thresholds);
        json.end_object();
      });
    }

    void assemble(const SweepSpec &spec)
    {
      const fs::path dir = spec.output_directory;
      write_atomically((dir / "sweep.csv").string(), [&](std::ostream &out) {
        out << csv_header(spec) << "\n";
        for (unsigned int p = 1; p <= spec.n_points(); ++p)
          {
            std::ifstream in(dir / "points" / (point_name(p) + ".csv"));
            std::string   line;
            AssertThrow(std::getline(in, line), ExcMessage("sweep: the record of point " + std::to_string(p) +
                                                           " cannot be read from " + (dir / "points").string()));
            out << line << "\n";
          }
      });
      write_sweep_json(spec, (dir / "sweep.json").string());
    }
  } // namespace

  unsigned int SweepSpec::n_points() const
  {
    unsigned int n = 1;
    for (const auto &a : axes)
      n *= a.values.size();
    return n;
  }

  std::string SweepAxis::text(std::size_t i) const { return labels.empty() ? number(values[i]) : labels[i]; }

  std::vector<std::size_t> SweepSpec::indices(unsigned int point) const
  {
    std::vector<std::size_t> v;
    unsigned int             index = point - 1;
    for (const auto &a : axes)
      {
        v.push_back(index % a.values.size());
        index /= a.values.size();
      }
    return v;
  }

  std::vector<double> SweepSpec::values(unsigned int point) const
  {
    std::vector<double> v;
    const auto          idx = indices(point);
    for (std::size_t a = 0; a < axes.size(); ++a)
      v.push_back(axes[a].values[idx[a]]);
    return v;
  }

  void declare_sweep_parameters(dealii::ParameterHandler &prm)
  {
    prm.enter_subsection("Sweep");
    prm.declare_entry("Title", "design sweep", dealii::Patterns::Anything(), "Title of tables and plots.");
    prm.declare_entry("Case file", "", dealii::Patterns::Anything(),
                      "The base case (a nappe case file), relative to the sweep file's directory.");
    prm.declare_entry("Case overrides", "", dealii::Patterns::Anything(),
                      "'Section/Entry=value' assignments applied to every point, separated by ';'.");
    prm.declare_entry("Output directory", "sweep", dealii::Patterns::Anything(),
                      "Where the records, tables and plots go, relative to the working directory.");
    prm.declare_entry("Thresholds", "false", dealii::Patterns::Bool(),
                      "true: every point follows both Gamma paths (Gamma_hold, Gamma_eq, Gamma_snap); false: one solve "
                      "at the case's Gamma.");
    declare_axis(prm, "Axis 1");
    declare_axis(prm, "Axis 2");
    prm.leave_subsection();
  }

  SweepSpec read_sweep(const std::string &sweep_file)
  {
    dealii::ParameterHandler prm;
    declare_sweep_parameters(prm);
    prm.parse_input(sweep_file);
    SweepSpec spec;
    prm.enter_subsection("Sweep");
    spec.title = prm.get("Title");
    const fs::path case_file = prm.get("Case file");
    AssertThrow(!case_file.empty(), ExcMessage(sweep_file + ": Sweep/Case file: expected the base case file."));
    spec.case_file = (case_file.is_absolute() ? case_file : fs::path(sweep_file).parent_path() / case_file).string();
    spec.overrides        = dealii::Utilities::split_string_list(prm.get("Case overrides"), ';');
    spec.output_directory = prm.get("Output directory");
    spec.thresholds       = prm.get_bool("Thresholds");
    for (const std::string axis : {"Axis 1", "Axis 2"})
      if (SweepAxis a = parse_axis(prm, axis); !a.entries.empty())
        spec.axes.push_back(a);
    prm.leave_subsection();
    AssertThrow(!spec.axes.empty(), ExcMessage(sweep_file + ": Sweep/Axis 1/Entries: expected at least one entry."));
    AssertThrow(fs::is_regular_file(spec.case_file),
                ExcMessage(sweep_file + ": Sweep/Case file: '" + spec.case_file + "' does not exist or is not a file."));
    AssertThrow(spec.n_points() <= max_sweep_points,
                ExcMessage(sweep_file + ": the sweep has " + std::to_string(spec.n_points()) + " points; expected at most " +
                           std::to_string(max_sweep_points) + "."));
    for (unsigned int p = 1; p <= spec.n_points(); ++p)
      try
        {
          point_case(spec, p);
        }
      catch (const std::exception &e)
        {
          AssertThrow(false, ExcMessage(sweep_file + ": point " + std::to_string(p) + " is not a valid case: " +
                                        user_message(e)));
        }
    return spec;
  }

  SweepProgress run_sweep(const SweepSpec &spec, MPI_Comm comm, unsigned int max_new_points, std::ostream *log)
  {
    const unsigned int rank = dealii::Utilities::MPI::this_mpi_process(comm);
    const unsigned int size = dealii::Utilities::MPI::n_mpi_processes(comm);
    const fs::path     dir  = fs::path(spec.output_directory) / "points";
    // Every rank creates it (idempotent) and all agree on failure, so that no rank waits for one that threw.
    std::error_code error;
    fs::create_directories(dir, error);
    const bool created = fs::is_directory(dir);
    AssertThrow(dealii::Utilities::MPI::min(created ? 1 : 0, comm) == 1,
                ExcMessage("Sweep/Output directory: cannot create '" + dir.string() + "'" +
                           (error ? ": " + error.message() : std::string()) + "."));

    SweepProgress progress;
    progress.total = spec.n_points();
    std::vector<unsigned int> missing;
    for (unsigned int p = 1; p <= progress.total; ++p)
      if (fs::exists(dir / (point_name(p) + ".csv")))
        ++progress.already_done;
      else if (missing.size() < max_new_points)
        missing.push_back(p);
    MPI_Barrier(comm); // every rank has its list before any record is written

    dealii::Timer timer;
    unsigned int  mine = 0, done = 0, failed = 0;
    for (std::size_t i = rank; i < missing.size(); i += size)
      ++mine;
    for (std::size_t i = rank; i < missing.size(); i += size)
      {
        const unsigned int p  = missing[i];
        const bool         ok = run_point(spec, p);
        ++done;
        failed += !ok;
        if (log)
          {
            const double left = timer.wall_time() / done * (mine - done);
            *log << "[" << (size > 1 ? "rank " + std::to_string(rank) + ": " : std::string()) << done << "/" << mine
                 << " points, " << failed << " failed, " << std::fixed << std::setprecision(0) << timer.wall_time()
                 << " s elapsed, ~" << left << " s left] point " << p << (ok ? " done" : " FAILED") << "\n"
                 << std::defaultfloat << std::flush;
          }
      }
    progress.computed = dealii::Utilities::MPI::sum(done, comm);
    progress.failed   = dealii::Utilities::MPI::sum(failed, comm);
    MPI_Barrier(comm);
    unsigned int recorded = 0;
    for (unsigned int p = 1; p <= progress.total; ++p)
      recorded += fs::exists(dir / (point_name(p) + ".csv"));
    progress.complete = recorded == progress.total;
    if (progress.complete && rank == 0)
      assemble(spec);
    return progress;
  }

  std::pair<std::string, std::string> sweep_plotter()
  {
    const char *python_env = std::getenv("NAPPE_PYTHON");
    const std::string python = python_env ? python_env : (fs::exists("/usr/bin/python3") ? "/usr/bin/python3" : "");
    for (const std::string &dir : {std::string(std::getenv("NAPPE_DATA_DIR") ? std::getenv("NAPPE_DATA_DIR") : ""),
                                  std::string(NAPPE_INSTALLED_DATA_DIR), std::string(NAPPE_SCRIPTS_DIR)})
      if (!dir.empty() && fs::exists(fs::path(dir) / "plot_sweep.py"))
        return {python, (fs::path(dir) / "plot_sweep.py").string()};
    return {python, ""};
  }
} // namespace nappe

#include <deal.II/base/mpi.h>
#include <deal.II/base/timer.h>

#include <nappe/analysis/adhesion_limits.h>
#include <nappe/analysis/state_summary.h>
#include <nappe/base/collective.h>
#include <nappe/io/case_checks.h>
#include <nappe/io/limits_report.h>
#include <nappe/physics/adhesion_potential.h>
#include <nappe/runs/case_run.h>
#include <nappe/runs/sweep_lock.h>
#include <nappe/runs/sweep_run.h>

#include <algorithm>
#include <cmath>
#include <filesystem>
#include <iomanip>
#include <sstream>

namespace nappe
{
  namespace fs = std::filesystem;

  namespace
  {
    std::string number(double v)
    {
      std::ostringstream s;
      s << std::setprecision(10) << v;
      return s.str();
    }

    /// The values of the sweep's @p columns (energy last, not included) from a point's own named values.
    std::vector<double> sweep_values(const std::vector<std::string> &columns, const std::vector<std::string> &names,
                                     const std::vector<double> &values)
    {
      std::vector<double> picked;
      for (std::size_t k = 0; k + 1 < columns.size(); ++k)
        {
          const auto it = std::find(names.begin(), names.end(), columns[k]);
          AssertThrow(it != names.end(), dealii::ExcMessage("sweep column '" + columns[k] + "' was not measured"));
          picked.push_back(values[it - names.begin()]);
        }
      return picked;
    }

    void compute_single(const SheetCase &c, const std::vector<std::string> &columns, PointRecord &r)
    {
      const CaseRun run = run_sheet_case(c, MPI_COMM_SELF, nullptr, false);
      r.ok              = run.result.converged;
      if (!r.ok)
        {
          r.message = run.result.message;
          return;
        }
      const auto &conformation = run.result.conformation;
      r.values = sweep_values(columns, summary_columns(c.problem.model),
                              summary_values(run.result.measures, conformation ? &*conformation : nullptr));
      r.values.push_back(run.result.energy.total() / c.problem.domain.area());
      if (conformation)
        r.regime = regime_name(classify_regime(*conformation, c.limits.target_fraction));
    }

    void compute_with_thresholds(const SheetCase &c, const std::vector<std::string> &columns,
                                 const std::string &path_file, PointRecord &r)
    {
      const double         gamma    = r.work_of_adhesion;
      const AdhesionLimits limits   = find_adhesion_limits(c.problem, with_stops(c.limits, {gamma}), MPI_COMM_SELF);
      write_adhesion_paths_csv(path_file, limits);
      const bool          laid_down = c.problem.start == StartProtocol::laid_down;
      const AdhesionPath &path      = laid_down ? limits.raising : limits.lowering;
      const AdhesionPathPoint *p    = point_at(path, gamma);
      r.ok = limits.lowering.complete && limits.raising.complete && p;
      if (!r.ok)
        {
          r.message = !limits.lowering.complete ? limits.lowering.message : limits.raising.message;
          return;
        }
      std::vector<std::string> notes;
      for (const auto &[t, name] : {std::pair{&limits.hold, "Γ_hold"}, {&limits.snap, "Γ_snap"},
                                    {&limits.equal_energy, "Γ_eq"}})
        {
          r.thresholds.push_back(t->found ? number(t->value()) : std::string());
          if (!t->found)
            notes.push_back(std::string(name) + " not found: " + t->how);
        }
      for (const auto &n : notes)
        r.message += (r.message.empty() ? "" : "; ") + n;
      r.regime = regime_name(classify_regime(path, *p, c.limits.target_fraction));
      r.values = sweep_values(columns, path.value_names, p->values);
      r.values.push_back(p->energy_per_area.total());
    }

    /// Which points this run computes: rank 0 reads the records, says why each is computed, and
    /// every rank receives the list.
    std::vector<unsigned int> points_to_compute(const SweepSpec &spec, const std::vector<std::string> &columns,
                                                unsigned int max_new, SweepProgress &progress, MPI_Comm comm,
                                                std::ostream *log)
    {
      std::vector<unsigned int> todo;
      if (dealii::Utilities::MPI::this_mpi_process(comm) == 0)
        for (unsigned int p = 1; p <= spec.n_points(); ++p)
          {
            std::string why;
            const auto  stored = read_point_record(spec, columns, p, why);
            if (stored && stored->ok && stored->fingerprint == point_fingerprint(spec, p))
              {
                ++progress.kept;
                continue;
              }
            if (stored)
              why = stored->fingerprint != point_fingerprint(spec, p) ? "its inputs changed since it was computed"
                                                                      : "it failed before";
            if (todo.size() < max_new)
              {
                todo.push_back(p);
                if (log && why != "no record")
                  *log << "point " << p << ": recomputing, " << why << "\n";
              }
          }
      progress.kept = dealii::Utilities::MPI::broadcast(comm, progress.kept, 0);
      return dealii::Utilities::MPI::broadcast(comm, todo, 0);
    }

    /// Collects the rows of a finished sweep (rank 0); false if a point lacks a valid record.
    bool collect_rows(const SweepSpec &spec, const std::vector<std::string> &columns, std::vector<std::string> &rows,
                      unsigned int &failed)
    {
      for (unsigned int p = 1; p <= spec.n_points(); ++p)
        {
          std::string why;
          const auto  stored = read_point_record(spec, columns, p, why);
          if (!stored || stored->fingerprint != point_fingerprint(spec, p))
            return false;
          failed += !stored->ok;
          rows.push_back(stored->row);
        }
      return true;
    }
  } // namespace

  std::vector<std::string> sweep_value_columns(const SweepSpec &spec)
  {
    // Which quantities a point measures depends on categorical values (e.g. the electronic estimates on the
    // material), so the table keeps the columns every combination of categorical values has.
    auto columns = summary_columns(point_case(spec, 1).problem.model);
    for (unsigned int point = 2; point <= spec.n_points(); ++point)
      {
        const auto index            = spec.indices(point);
        bool       numeric_at_first = true;
        for (std::size_t a = 0; a < spec.axes.size(); ++a)
          numeric_at_first = numeric_at_first && (spec.axes[a].categorical || index[a] == 0);
        if (!numeric_at_first)
          continue;
        const auto other = summary_columns(point_case(spec, point).problem.model);
        columns.erase(std::remove_if(columns.begin(), columns.end(),
                                     [&](const std::string &name) {
                                       return std::find(other.begin(), other.end(), name) == other.end();
                                     }),
                      columns.end());
      }
    columns.push_back("energy_J_per_m2");
    return columns;
  }

  PointRecord compute_sweep_point(const SweepSpec &spec, unsigned int point)
  {
    PointRecord r;
    r.point            = point;
    r.fingerprint      = point_fingerprint(spec, point);
    const auto columns = sweep_value_columns(spec);
    try
      {
        const SheetCase c = point_case(spec, point);
        // The checks nappe-solve makes before solving (a slope no sheet model admits, a topography that
        // is not finite, a mesh beyond the memory limit): such a point fails with their message.
        check_case_inputs(c, resolution_report(c));
        r.fracture_strain = c.problem.model.material.fracture_strain;
        if (const AdhesionPotential *a = c.problem.model.adhesion())
          r.work_of_adhesion = a->law().work_of_adhesion();
        if (spec.thresholds)
          {
            std::string path_file = point_record_path(spec, point);
            path_file.replace(path_file.size() - 4, 4, "_path.csv");
            compute_with_thresholds(c, columns, path_file, r);
          }
        else
          compute_single(c, columns, r);
      }
    catch (const std::exception &e)
      {
        r.ok      = false;
        r.message = user_message(e);
      }
    // The record reader refuses a non-finite value (it would be recomputed on every resume): such a point
    // is recorded as failed, and the table never shows NaN.
    for (std::size_t i = 0; r.ok && i < r.values.size(); ++i)
      if (!std::isfinite(r.values[i]))
        {
          r.ok      = false;
          r.message = "the value of " + columns[i] + " is not a finite number (a defect of nappe: please report it)";
        }
    if (!r.ok)
      r.values.assign(columns.size(), 0.0);
    return r;
  }

  SweepProgress run_sweep(const SweepSpec &spec, MPI_Comm comm, unsigned int max_new_points, std::ostream *log)
  {
    const unsigned int rank = dealii::Utilities::MPI::this_mpi_process(comm);
    const unsigned int size = dealii::Utilities::MPI::n_mpi_processes(comm);
    const SweepLock    lock(spec.output_directory, comm);
    const auto         columns = sweep_value_columns(spec);
    SweepProgress      progress;
    progress.total = spec.n_points();
    const std::vector<unsigned int> todo =
      points_to_compute(spec, columns, max_new_points, progress, comm, rank == 0 ? log : nullptr);

    dealii::Timer timer;
    unsigned int  mine = 0, done = 0;
    for (std::size_t i = rank; i < todo.size(); i += size)
      ++mine;
    for (std::size_t i = rank; i < todo.size(); i += size)
      {
        const PointRecord r = compute_sweep_point(spec, todo[i]);
        write_point_record(spec, columns, r);
        ++done;
        if (log)
          {
            const double left = timer.wall_time() / done * (mine - done);
            *log << "[" << (size > 1 ? "rank " + std::to_string(rank) + ": " : std::string()) << done << "/" << mine
                 << " points, " << std::fixed << std::setprecision(0) << timer.wall_time() << " s elapsed, ~" << left
                 << " s left] point " << todo[i] << (r.ok ? " done" : " FAILED: " + r.message) << "\n"
                 << std::defaultfloat << std::flush;
          }
      }
    progress.computed = dealii::Utilities::MPI::sum(done, comm);
    MPI_Barrier(comm);
    run_collectively(comm, [&] {
      if (rank != 0)
        return;
      std::vector<std::string> rows;
      progress.complete = collect_rows(spec, columns, rows, progress.failed);
      if (progress.complete)
        write_sweep_table(spec, columns, rows);
    });
    progress.complete = dealii::Utilities::MPI::broadcast(comm, progress.complete, 0);
    progress.failed   = dealii::Utilities::MPI::broadcast(comm, progress.failed, 0);
    return progress;
  }
} // namespace nappe

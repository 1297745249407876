#pragma once

#include <nappe/io/sweep_records.h>

#include <mpi.h>

#include <ostream>

namespace nappe
{
  /// What a sweep run did; the counts are over all ranks.
  struct SweepProgress
  {
    unsigned int total    = 0; ///< points of the sweep
    unsigned int kept     = 0; ///< points whose record matched their inputs and was kept
    unsigned int computed = 0; ///< points computed by this run (new, changed, damaged or failed before)
    unsigned int failed   = 0; ///< points whose final record is a failure
    bool         complete = false; ///< every point has a valid record; sweep.csv and sweep.json are written
  };

  /**
   * Runs the points that have no valid record for their current inputs: a record is kept only if it
   * is complete, belongs to this table, succeeded and carries the fingerprint of the point's inputs
   * (point_fingerprint()); otherwise the point is computed again and the log says why. MPI ranks
   * share out the points (each point on MPI_COMM_SELF). Each finished point is written atomically, so
   * an interrupted sweep resumes. The output directory is locked while a run owns it (a second run
   * into the same folder is refused). @p max_new_points limits the points computed in this run (for
   * tests of resumption). When every point has a valid record, rank 0 writes sweep.csv and
   * sweep.json. Collective.
   */
  SweepProgress run_sweep(const SweepSpec &spec, MPI_Comm comm, unsigned int max_new_points, std::ostream *log);

  /// The record of one point, computed on MPI_COMM_SELF (a failure is a record, not an exception).
  PointRecord compute_sweep_point(const SweepSpec &spec, unsigned int point);

  /// The value columns of the sweep's table: the state summary columns (state_summary.h) that the
  /// models of all points have (the electronic estimates depend on the material, so a categorical
  /// material axis keeps only those every material has), and the energy per area.
  std::vector<std::string> sweep_value_columns(const SweepSpec &spec);
} // namespace nappe

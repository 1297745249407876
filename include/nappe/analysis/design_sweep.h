#pragma once

#include <deal.II/base/parameter_handler.h>

#include <mpi.h>

#include <ostream>
#include <string>
#include <vector>

namespace nappe
{
  /// One axis of a design sweep: case-file entries that all take each of the values in turn.
  struct SweepAxis
  {
    std::vector<std::string> entries; ///< "Section/…/Entry", in the case file's units
    std::string              name;    ///< for tables and plots
    std::string              unit;    ///< the entries' unit, as the case file documents it
    std::vector<double>      values;
    /// A categorical axis (text values such as material names): the names; values are then 1, 2, ….
    std::vector<std::string> labels;

    /// The text an entry is set to for the i-th value.
    std::string text(std::size_t i) const;
  };

  /**
   * A design sweep over one or two case parameters: a base case file, fixed overrides, and axes.
   * Points are the Cartesian product of the axis values, numbered from 1 with axis 1 fastest.
   * With thresholds, every point follows both Γ paths (Γ_hold, Γ_eq, Γ_snap, as nappe-limits);
   * without, every point is one solve at the case's Γ (as nappe-solve).
   */
  struct SweepSpec
  {
    std::string              title;
    std::string              case_file;
    std::vector<std::string> overrides; ///< "Section/Entry=value" applied to every point
    std::vector<SweepAxis>   axes;
    std::string              output_directory;
    bool                     thresholds = false;

    unsigned int        n_points() const;
    /// The axis values of point @p point (1-based); on a categorical axis the value's number 1, 2, ….
    std::vector<double> values(unsigned int point) const;
    /// The positions of point @p point (1-based) on the axes (0-based).
    std::vector<std::size_t> indices(unsigned int point) const;
  };

  /// Declares the subsection "Sweep" of a sweep file (entries documented, with units).
  void declare_sweep_parameters(dealii::ParameterHandler &prm);

  /// Reads a sweep file; relative paths in it are relative to @p sweep_file's directory.
  /// Checks that every point's case parses, naming the point and the entry if not.
  SweepSpec read_sweep(const std::string &sweep_file);

  struct SweepProgress
  {
    unsigned int total = 0, already_done = 0, computed = 0, failed = 0;
    bool         complete = false; ///< every point has a record
  };

  /**
   * Runs the points that have no record yet, MPI ranks across points (point p on rank (p−1) mod
   * n, each point on MPI_COMM_SELF). Each finished point is written atomically as
   * points/point-NNNN.csv (and, with thresholds, points/point-NNNN_path.csv), so an interrupted
   * sweep resumes where it stopped. @p max_new_points limits the points computed in this run (all
   * ranks together; for tests of resumption). When every point has a record, rank 0 writes
   * sweep.csv and sweep.json. Progress lines go to @p log.
   */
  SweepProgress run_sweep(const SweepSpec &spec, MPI_Comm comm, unsigned int max_new_points, std::ostream *log);

  /// The interpreter and plotting script for sweeps: (python, script); empty strings if not found.
  std::pair<std::string, std::string> sweep_plotter();
} // namespace nappe

#pragma once

#include <deal.II/base/parameter_handler.h>

#include <nappe/io/sheet_case.h>

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
    /// The values as the case file takes them: numbers, or names on a categorical axis (e.g. materials).
    std::vector<std::string> values;
    bool                     categorical = false;

    std::size_t size() const { return values.size(); }
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
    std::string              sweep_file;
    std::string              case_file;
    std::vector<std::string> overrides; ///< "Section/Entry=value" applied to every point
    std::vector<SweepAxis>   axes;
    std::string              output_directory;
    bool                     thresholds = false;
    unsigned int             point_limit = 0; ///< the most points a sweep may have (Sweep/Point limit)

    unsigned int n_points() const;
    /// The positions of point @p point (1-based) on the axes (0-based).
    std::vector<std::size_t> indices(unsigned int point) const;
  };

  /// Declares the subsection "Sweep" of a sweep file (entries documented, with units).
  void declare_sweep_parameters(dealii::ParameterHandler &prm);

  /**
   * Reads a sweep file; relative paths in it are relative to @p sweep_file's directory. Refuses,
   * naming the entry, a sweep with more points than its point limit, repeated values on an axis,
   * or a point whose case does not parse (naming the point).
   */
  SweepSpec read_sweep(const std::string &sweep_file);

  /// The case-file handler of one point: base case file, fixed overrides, then the axis values.
  void point_parameters(const SweepSpec &spec, unsigned int point, dealii::ParameterHandler &prm);

  /// The parsed case of one point.
  SheetCase point_case(const SweepSpec &spec, unsigned int point);

  /**
   * A fingerprint (64-bit FNV-1a, hexadecimal) of everything that determines a point's result: the
   * program version, whether thresholds are computed, the point's fully resolved case parameters and
   * the contents of every existing file they name (meshes, height maps, STL) and of the material
   * catalogue. Two records with the same fingerprint were computed from the same inputs.
   */
  std::string point_fingerprint(const SweepSpec &spec, unsigned int point);
} // namespace nappe

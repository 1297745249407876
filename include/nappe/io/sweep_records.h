#pragma once

#include <nappe/io/sweep_file.h>

#include <optional>
#include <string>
#include <vector>

namespace nappe
{
  /// What one sweep point produced: a row of the sweep table, with the fingerprint of its inputs.
  struct PointRecord
  {
    unsigned int point = 0;
    std::string  fingerprint; ///< point_fingerprint() of the inputs it was computed from
    bool         ok = false;
    std::string  regime;
    double       work_of_adhesion = 0.0; ///< of the point's case [J/m²]
    double       fracture_strain  = 0.0; ///< of the point's sheet material; 0 if unknown [-]
    std::vector<double>      values;     ///< in the order of the value columns, in their units
    std::vector<std::string> thresholds; ///< Γ_hold, Γ_snap, Γ_eq [J/m²] as text, empty where not found
    std::string              message;    ///< why it failed, or notes (e.g. why a threshold was not found)
  };

  /// The header of the sweep table: point, axes, status, regime, Γ, fracture strain, @p value_columns,
  /// thresholds (if the sweep computes them), message.
  std::string sweep_table_header(const SweepSpec &spec, const std::vector<std::string> &value_columns);

  /// The row of @p record under sweep_table_header(); categorical axis values by name.
  std::string sweep_table_row(const SweepSpec &spec, const PointRecord &record);

  /// points/point-NNNN.rec in the sweep's output directory.
  std::string point_record_path(const SweepSpec &spec, unsigned int point);

  /// Writes a point's record atomically: its fingerprint, the table header it belongs to and its row.
  void write_point_record(const SweepSpec &spec, const std::vector<std::string> &value_columns,
                          const PointRecord &record);

  /// A stored record as read back: the fingerprint, whether it was ok, and its table row.
  struct StoredRecord
  {
    std::string fingerprint;
    bool        ok = false;
    std::string row;
  };

  /**
   * Reads a point's record; nothing if the file is missing, truncated or malformed, was written for
   * another table header (a sweep file whose axes or columns changed), or holds a row that
   * sweep_table_row() could not have written for @p point (another point's number or axis values, a
   * status other than the record's, a number that is not finite, a control character: a damaged or
   * hand-edited record). @p why says which, in one line.
   */
  std::optional<StoredRecord> read_point_record(const SweepSpec &spec, const std::vector<std::string> &value_columns,
                                                unsigned int point, std::string &why);

  /// sweep.csv (header and the stored rows in point order) and sweep.json (the sweep's description).
  void write_sweep_table(const SweepSpec &spec, const std::vector<std::string> &value_columns,
                         const std::vector<std::string> &rows);
} // namespace nappe

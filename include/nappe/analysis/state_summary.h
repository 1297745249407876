#pragma once

#include <nappe/analysis/conformation.h>
#include <nappe/analysis/sheet_measures.h>
#include <nappe/solvers/adhesion_path.h>

#include <string>
#include <vector>

namespace nappe
{
  /**
   * The scalars that summarise one solved state, as named columns "<key><unit suffix>" (e.g.
   * "max_gap_nm", "max_principal_strain") with values in the unit the name states: on a substrate
   * the conformed fraction, its split into contact over raised parts and over the floor, the share
   * of the floor touched and the largest gap, then the extremes of every quantity of the table
   * (sheet_quantities.h) that applies to the model. One list for path CSVs, sweep tables and plots.
   */
  std::vector<std::string> summary_columns(const SheetModel &model);

  /// The values of summary_columns() for measured extremes and (on a substrate) conformation.
  std::vector<double> summary_values(const SheetMeasures &measures, const ConformationMeasures *conformation);

  /// Measures every state of an adhesion path with summary_values() (for follow_adhesion_path).
  PathMeasure summary_path_measure(const SheetModel &model);

  /**
   * One definition of the sheet's regime on its substrate, for every report, table and map (our
   * definitions; the floor is defined in conformation.h).
   */
  enum class Regime
  {
    conforms,          ///< conformed fraction ≥ the target (Adhesion limits/Target conformed fraction)
    tents,             ///< rests on the raised parts; touches less than 1 % of the floor
    touches_floor,     ///< below the target, but touches at least 1 % of the floor
    suspended          ///< in contact over less than 5 % of its area: bridges, or has let go
  };

  /// The regime from the conformed fraction, the share of the floor touched and the target fraction.
  Regime      classify_regime(double conformed_fraction, double floor_touched, double target_fraction);
  Regime      classify_regime(const ConformationMeasures &m, double target_fraction);
  /// "conforms", "tents on the tops", "touches the floor", "suspended".
  std::string regime_name(Regime regime);
  /// The regime of a state an adhesion path recorded with summary_path_measure().
  Regime      classify_regime(const AdhesionPath &path, const AdhesionPathPoint &point, double target_fraction);
} // namespace nappe

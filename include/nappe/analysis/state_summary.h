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
   * the conformed fraction and the largest gap, then the extremes of every quantity of the table
   * (sheet_quantities.h) that applies to the model. One list for path CSVs, sweep tables and plots.
   */
  std::vector<std::string> summary_columns(const SheetModel &model);

  /// The values of summary_columns() for measured extremes and (on a substrate) conformation.
  std::vector<double> summary_values(const SheetMeasures &measures, const ConformationMeasures *conformation);

  /// Measures every state of an adhesion path with summary_values() (for follow_adhesion_path).
  PathMeasure summary_path_measure(const SheetModel &model);

  /// One definition of the sheet's regime on its substrate, for every report, table and map.
  enum class Regime
  {
    conforms,            ///< conformed fraction ≥ the target (Adhesion limits/Target conformed fraction)
    partially_conformed, ///< in contact over at least 5 % of its area, but below the target
    suspended            ///< in contact over less than 5 % (our definition)
  };

  Regime      classify_regime(double conformed_fraction, double target_fraction);
  std::string regime_name(Regime regime);
} // namespace nappe

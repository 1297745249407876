#include <nappe/analysis/state_summary.h>
#include <nappe/base/units.h>

namespace nappe
{
  namespace
  {
    const double suspended_below = 0.05; ///< contact share under which a sheet is "suspended" (our definition)
  } // namespace

  std::vector<std::string> summary_columns(const SheetModel &model)
  {
    std::vector<std::string> names;
    if (model.adhesion())
      names = {"conformed_fraction", "max_gap_nm"};
    for (const SheetQuantity *q : quantities_for(model))
      if (q->extreme != Extreme::none)
        names.push_back(q->extreme_key + q->unit_suffix());
    return names;
  }

  std::vector<double> summary_values(const SheetMeasures &measures, const ConformationMeasures *conformation)
  {
    std::vector<double> values;
    if (conformation)
      values = {conformation->conformed_fraction, conformation->max_gap / units::nanometer};
    for (const auto &e : measures.extremes)
      values.push_back(e.extreme.value / e.quantity->si_per_unit);
    return values;
  }

  PathMeasure summary_path_measure(const SheetModel &model)
  {
    PathMeasure m;
    m.names   = summary_columns(model);
    m.measure = [](const SheetSystem &system, const Vector &state, const LoadLevel &level) {
      const ConformationMeasures c = measure_conformation(system, state, level, 1);
      return StateSummary{c.conformed_fraction, summary_values(measure_sheet(system, state, level), &c)};
    };
    return m;
  }

  Regime classify_regime(double fraction, double target)
  {
    if (fraction >= target)
      return Regime::conforms;
    return fraction >= suspended_below ? Regime::partially_conformed : Regime::suspended;
  }

  std::string regime_name(Regime regime)
  {
    switch (regime)
      {
        case Regime::conforms: return "conforms";
        case Regime::partially_conformed: return "partially conformed";
        default: return "suspended";
      }
  }
} // namespace nappe

#include <nappe/analysis/state_summary.h>
#include <nappe/base/units.h>

namespace nappe
{
  namespace
  {
    const double suspended_below = 0.05; ///< contact share under which a sheet is "suspended" (our definition)
    const double floor_untouched = 0.01; ///< share of the floor under which it counts as untouched (ours)
  } // namespace

  std::vector<std::string> summary_columns(const SheetModel &model)
  {
    std::vector<std::string> names;
    if (model.adhesion())
      names = {"conformed_fraction", "raised_contact_fraction", "floor_contact_fraction", "floor_touched",
               "max_gap_nm"};
    for (const SheetQuantity *q : quantities_for(model))
      if (q->extreme != Extreme::none)
        names.push_back(q->extreme_key + q->unit_suffix());
    return names;
  }

  std::vector<double> summary_values(const SheetMeasures &measures, const ConformationMeasures *conformation)
  {
    std::vector<double> values;
    if (conformation)
      values = {conformation->conformed_fraction, conformation->raised_contact_fraction(),
                conformation->floor_contact_fraction(), conformation->floor_touched(),
                conformation->max_gap / units::nanometer};
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
    m.fraction = [](const SheetSystem &system, const Vector &state, const LoadLevel &) {
      return graded_conformed_fraction(system, state);
    };
    return m;
  }

  Regime classify_regime(double fraction, double floor_touched, double target)
  {
    if (fraction >= target)
      return Regime::conforms;
    if (fraction < suspended_below)
      return Regime::suspended;
    return floor_touched < floor_untouched ? Regime::tents : Regime::touches_floor;
  }

  Regime classify_regime(const ConformationMeasures &m, double target)
  {
    return classify_regime(m.conformed_fraction, m.floor_touched(), target);
  }

  Regime classify_regime(const AdhesionPath &path, const AdhesionPathPoint &point, double target)
  {
    return classify_regime(point.conformed_fraction, path.value(point, "floor_touched"), target);
  }

  std::string regime_name(Regime regime)
  {
    switch (regime)
      {
        case Regime::conforms: return "conforms";
        case Regime::tents: return "tents on the tops";
        case Regime::touches_floor: return "touches the floor";
        default: return "suspended";
      }
  }
} // namespace nappe

#include <deal.II/base/exceptions.h>

#include <nappe/analysis/fabrication_check.h>
#include <nappe/analysis/state_summary.h>

#include <cmath>
#include <sstream>

namespace nappe
{
  std::string verdict(const AdhesionPath &path, const AdhesionPathPoint &state, double target)
  {
    return regime_name(classify_regime(path, state, target));
  }

  std::vector<double> verdict_work_of_adhesion_values(const FabricationCheckSettings &s)
  {
    AssertThrow(s.lowest_work_of_adhesion > 0 && s.highest_work_of_adhesion >= s.lowest_work_of_adhesion,
                dealii::ExcMessage("Fabrication check/Work of adhesion range: expected 0 < lowest <= highest."));
    AssertThrow(s.rows >= 1, dealii::ExcMessage("Fabrication check/Table rows: expected at least 1."));
    std::vector<double> values;
    const double        ratio = s.highest_work_of_adhesion / s.lowest_work_of_adhesion;
    for (unsigned int i = 0; i < s.rows; ++i)
      values.push_back(s.rows == 1 ? s.lowest_work_of_adhesion
                                   : s.lowest_work_of_adhesion * std::pow(ratio, double(i) / (s.rows - 1)));
    return values;
  }

  FabricationCheck fabrication_verdicts(const AdhesionLimits &limits, const FabricationCheckSettings &s,
                                        double fracture_strain)
  {
    FabricationCheck check;
    check.fracture_strain = fracture_strain;
    for (const double gamma : verdict_work_of_adhesion_values(s))
      {
        const AdhesionPathPoint *up = point_at(limits.raising, gamma), *down = point_at(limits.lowering, gamma);
        AssertThrow(up && down, dealii::ExcMessage("Fabrication check: the paths did not reach Γ = " +
                                                   std::to_string(gamma) + " J/m^2 (see the path messages)."));
        VerdictRow row{gamma, *up, *down, std::nullopt};
        if (limits.hold.found)
          row.margin = gamma / limits.hold.value();
        check.rows.push_back(row);
      }
    return check;
  }

  namespace
  {
    /// Safe: still conformed at the weakest Γ, and below the fracture strain there.
    bool is_safe(const SheetProblem &problem, const FabricationCheckSettings &s, AdhesionPathSettings path,
                 double fracture, MPI_Comm comm)
    {
      path.lowest_work_of_adhesion  = s.lowest_work_of_adhesion;
      path.highest_work_of_adhesion = s.highest_work_of_adhesion;
      path.stops.clear();
      const AdhesionPath lowering = follow_adhesion_path(problem, StartProtocol::grown_conformal, path,
                                                         summary_path_measure(problem.model), comm);
      if (!lowering.complete)
        return false;
      for (const auto &p : lowering.points)
        if (p.conformed_fraction < path.target_fraction ||
            (fracture > 0 && lowering.value(p, "max_principal_strain") > fracture))
          return false;
      return true;
    }
  } // namespace

  HeightBracket bracket_safe_height(const std::function<bool(double)> &safe, double start, unsigned int bisections)
  {
    HeightBracket b;
    double        h = start;
    for (unsigned int k = 0; k < 8 && !b.found(); ++k)
      if (safe(h))
        {
          b.safe = h;
          h *= 2;
        }
      else
        {
          b.unsafe = h;
          h *= 0.5;
        }
    if (!b.found())
      return b;
    for (unsigned int k = 0; k < bisections; ++k)
      {
        const double mid = 0.5 * (b.safe + b.unsafe);
        (safe(mid) ? b.safe : b.unsafe) = mid;
      }
    return b;
  }

  void scan_aspect_ratio(FabricationCheck &check, const FabricationCheckSettings &s, const AdhesionPathSettings &path,
                         const std::function<SheetProblem(double)> &problem_with_height, MPI_Comm comm,
                         unsigned int bisections, std::ostream *log)
  {
    AssertThrow(s.feature_width > 0 && s.feature_height > 0,
                dealii::ExcMessage("Fabrication check: the aspect-ratio scan needs a positive feature height "
                                   "and Feature width."));
    const auto safe = [&](double h) {
      const bool ok = is_safe(problem_with_height(h), s, path, check.fracture_strain, comm);
      if (log)
        *log << "  feature height " << h * 1e9 << " nm (aspect ratio " << h / s.feature_width << "): "
             << (ok ? "safe" : "not safe") << "\n";
      return ok;
    };
    const HeightBracket b = bracket_safe_height(safe, s.feature_height, bisections);
    if (!b.found())
      {
        check.aspect_ratio_note = b.safe == 0.0 ? "no safe height found down to 1/128 of the case's height"
                                                : "every height up to 128 times the case's height is safe";
        return;
      }
    const double safe_h = b.safe, unsafe_h = b.unsafe;
    check.largest_safe_aspect_ratio = safe_h / s.feature_width;
    std::ostringstream note;
    note << "bracketed between heights " << safe_h * 1e9 << " nm (safe) and " << unsafe_h * 1e9
         << " nm (not safe) at feature width " << s.feature_width * 1e9 << " nm";
    check.aspect_ratio_note = note.str();
  }
} // namespace nappe

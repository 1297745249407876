#include <nappe/base/units.h>
#include <nappe/base/version.h>
#include <nappe/io/atomic_file.h>
#include <nappe/io/caution.h>
#include <nappe/io/json_writer.h>
#include <nappe/io/limits_report.h>
#include <nappe/io/text_table.h>
#include <nappe/analysis/state_summary.h>
#include <nappe/physics/adhesion_potential.h>

#include <iomanip>
#include <sstream>

namespace nappe
{
  namespace
  {
    const AdhesionPotential &adhesion_of(const SheetCase &c) { return *c.problem.model.adhesion(); }

    double peak_strain(const AdhesionPath &path, const AdhesionPathPoint &p)
    {
      return path.value(p, "max_principal_strain");
    }

    void write_threshold(JsonWriter &json, const std::string &key, const std::string &meaning,
                         const AdhesionThreshold &t)
    {
      json.begin_object(key);
      json.value("meaning", meaning);
      json.value("found", t.found);
      if (t.found)
        {
          json.quantity("value", t.value(), "J/m^2");
          json.quantity("lower", t.lower, "J/m^2");
          json.quantity("upper", t.upper, "J/m^2");
        }
      json.value("how", t.how);
      json.end_object();
    }

    void write_path_statistics(JsonWriter &json, const std::string &key, const AdhesionPath &p)
    {
      unsigned int jumps = 0;
      for (const auto &pt : p.points)
        jumps += pt.after_jump;
      json.begin_object(key);
      json.value("states", static_cast<unsigned int>(p.points.size()));
      json.value("jumps", jumps);
      json.value("minimisations", p.solves);
      json.value("complete", p.complete);
      json.value("message", p.message);
      json.quantity("wall_time", p.wall_time, "s");
      json.value("mesh_adaptations", p.mesh_adaptations);
      json.value("largest_unknowns", static_cast<long long>(p.largest_unknowns));
      json.end_object();
    }

    void write_transitions(JsonWriter &json, const AdhesionLimits &limits)
    {
      json.begin_array("transitions");
      for (const auto &t : limits.transitions)
        {
          json.begin_object();
          json.value("path", t.lowering ? "down" : "up");
          json.quantity("gamma_lower", t.gamma_lower, "J/m^2");
          json.quantity("gamma_upper", t.gamma_upper, "J/m^2");
          json.value("kind", t.kind);
          json.value("regime_before", regime_name(t.regime_before));
          json.value("regime_after", regime_name(t.regime_after));
          json.quantity("fraction_before", t.fraction_before, "1");
          json.quantity("fraction_after", t.fraction_after, "1");
          json.quantity("raised_contact_before", t.raised_before, "1");
          json.quantity("raised_contact_after", t.raised_after, "1");
          json.quantity("floor_contact_before", t.floor_before, "1");
          json.quantity("floor_contact_after", t.floor_after, "1");
          json.quantity("energy_released", t.energy_released, "J/m^2");
          json.end_object();
        }
      json.end_array();
    }

    /// The transition (if any) that the path recorded on arriving at @p point.
    const AdhesionTransition *transition_at(const AdhesionLimits &limits, const AdhesionPath &path,
                                            const AdhesionPathPoint &point)
    {
      if (!point.after_jump)
        return nullptr;
      for (const auto &t : limits.transitions)
        if (t.lowering == path.lowering && t.gamma_after() == point.work_of_adhesion)
          return &t;
      return nullptr;
    }

    std::string fixed(double v, int digits)
    {
      std::ostringstream s;
      s << std::fixed << std::setprecision(digits) << v;
      return s.str();
    }

    std::string significant(double v, int digits)
    {
      std::ostringstream s;
      s << std::setprecision(digits) << v;
      return s.str();
    }

    void write_check(JsonWriter &json, const AdhesionLimits &limits, const FabricationCheck &check, double target)
    {
      json.begin_object("fabrication_check");
      json.quantity("fracture_strain", check.fracture_strain, "1");
      json.begin_array("rows");
      for (const auto &r : check.rows)
        {
          json.begin_object();
          json.quantity("work_of_adhesion", r.work_of_adhesion, "J/m^2");
          json.value("laid_down_verdict", verdict(limits.raising, r.transferred, target));
          json.quantity("laid_down_conformed_fraction", r.transferred.conformed_fraction, "1");
          json.quantity("laid_down_peak_principal_strain", peak_strain(limits.raising, r.transferred), "1");
          json.value("conformed_start_verdict", verdict(limits.lowering, r.grown, target));
          json.quantity("conformed_start_conformed_fraction", r.grown.conformed_fraction, "1");
          json.quantity("conformed_start_peak_principal_strain", peak_strain(limits.lowering, r.grown), "1");
          if (r.margin)
            json.quantity("margin_gamma_over_gamma_hold", *r.margin, "1");
          json.end_object();
        }
      json.end_array();
      if (check.largest_safe_aspect_ratio)
        json.quantity("largest_safe_aspect_ratio", *check.largest_safe_aspect_ratio, "1");
      json.value("aspect_ratio_note", check.aspect_ratio_note);
      json.end_object();
    }

    std::string threshold_text(const AdhesionThreshold &t)
    {
      std::ostringstream s;
      if (t.found)
        s << std::setprecision(4) << t.value() << " J/m² (" << t.value() / units::mev_per_angstrom2 << " meV/Å²) in ["
          << t.lower << ", " << t.upper << "] J/m²: " << t.how;
      else
        s << "not found: " << t.how;
      return s.str();
    }
  } // namespace

  void write_adhesion_paths_csv(const std::string &path, const AdhesionLimits &limits)
  {
    write_atomically(path, [&](std::ostream &out) {
      out << "path,gamma_J_per_m2,energy_J_per_m2,stretching_J_per_m2,bending_J_per_m2,adhesion_J_per_m2";
      for (const auto &name : limits.lowering.value_names)
        out << "," << name;
      out << ",after_jump,lowest_curvature,transition,energy_released_J_per_m2\n" << std::setprecision(10);
      for (const auto *p : {&limits.lowering, &limits.raising})
        for (const auto &pt : p->points)
          {
            out << (p->lowering ? "down" : "up") << "," << pt.work_of_adhesion << "," << pt.energy_per_area.total()
                << "," << pt.energy_per_area.stretching << "," << pt.energy_per_area.bending << ","
                << pt.energy_per_area.substrate;
            for (const double v : pt.values)
              out << "," << v;
            out << "," << (pt.after_jump ? 1 : 0) << ",";
            if (pt.lowest_curvature >= 0)
              out << pt.lowest_curvature;
            if (const AdhesionTransition *t = transition_at(limits, *p, pt))
              out << "," << t->kind << "," << t->energy_released << "\n";
            else
              out << ",,\n";
          }
    });
  }

  void write_limits_json(const std::string &path, const SheetCase &c, const AdhesionLimits &limits,
                         const FabricationCheck *check)
  {
    write_atomically(path, [&](std::ostream &out) {
      JsonWriter json(out);
      json.begin_object();
      json.value("program", "nappe " + version());
      json.value("case", c.title);
      json.value("note", model_caution());
      json.value("material", c.problem.model.material.name);
      json.value("topography", adhesion_of(c).topography().description());
      json.value("adhesion_law", adhesion_of(c).law().name());
      json.quantity("case_work_of_adhesion", adhesion_of(c).law().work_of_adhesion(), "J/m^2");
      json.quantity("equilibrium_gap", adhesion_of(c).law().equilibrium_gap() * 1e9, "nm");
      json.quantity("lowest_work_of_adhesion", c.limits.lowest_work_of_adhesion, "J/m^2");
      json.quantity("highest_work_of_adhesion", c.limits.highest_work_of_adhesion, "J/m^2");
      json.quantity("target_conformed_fraction", c.limits.target_fraction, "1");
      json.quantity("relative_tolerance", c.limits.relative_tolerance, "1");
      write_threshold(json, "gamma_hold", "smallest Gamma at which the conformed sheet stays conformed (Gamma lowered)",
                      limits.hold);
      write_threshold(json, "gamma_eq", "Gamma at which the conformed and the laid-down branch have equal energy",
                      limits.equal_energy);
      write_threshold(json, "gamma_snap", "smallest Gamma that pulls a laid-down sheet into conformation (Gamma raised)",
                      limits.snap);
      if (limits.hold.found && limits.snap.found && limits.snap.value() >= limits.hold.value())
        json.quantity("hysteresis", limits.snap.value() - limits.hold.value(), "J/m^2");
      if (limits.hold.found)
        json.quantity("margin_case_gamma_over_gamma_hold",
                      adhesion_of(c).law().work_of_adhesion() / limits.hold.value(), "1");
      json.quantity("largest_conformed_fraction", limits.largest.fraction, "1");
      json.quantity("largest_fraction_work_of_adhesion", limits.largest.work_of_adhesion, "J/m^2");
      json.value("largest_fraction_path", limits.largest.lowering ? "down" : "up");
      write_transitions(json, limits);
      write_path_statistics(json, "lowering_path", limits.lowering);
      write_path_statistics(json, "raising_path", limits.raising);
      if (check)
        write_check(json, limits, *check, c.limits.target_fraction);
      json.end_object();
    });
  }

  void print_limits_summary(const SheetCase &c, const AdhesionLimits &limits, std::ostream &out)
  {
    const double gamma = adhesion_of(c).law().work_of_adhesion();
    out << "\n== " << c.title << " ==\n" << std::setprecision(4);
    out << "Works of adhesion (range " << c.limits.lowest_work_of_adhesion << " to " << c.limits.highest_work_of_adhesion
        << " J/m², conformed = fraction ≥ " << 100 * c.limits.target_fraction << " %):\n";
    out << "  Γ_hold (conformed sheet lets go as Γ is lowered):  " << threshold_text(limits.hold) << "\n";
    out << "  Γ_eq   (conformed and laid-down states equal):     " << threshold_text(limits.equal_energy) << "\n";
    out << "  Γ_snap (laid-down sheet pulled into conformation): " << threshold_text(limits.snap) << "\n";
    if (limits.hold.found && limits.snap.found && limits.snap.value() >= limits.hold.value())
      out << "  Hysteresis Γ_snap − Γ_hold: " << limits.snap.value() - limits.hold.value() << " J/m²\n";
    else if (limits.hold.found && limits.snap.found)
      out << "  Hysteresis: not defined, Γ_snap < Γ_hold (the two paths bracket no bistable range)\n";
    if (limits.hold.found)
      out << "  Case Γ = " << gamma << " J/m²: margin Γ/Γ_hold = " << gamma / limits.hold.value() << " ("
          << (gamma >= limits.hold.value() ? "holds a conformed sheet" : "does not hold a conformed sheet") << ")\n";
    if (limits.largest.fraction < c.limits.target_fraction)
      out << "  Largest conformed fraction reached: " << 100 * limits.largest.fraction << " % ("
          << (limits.largest.lowering ? "lowering" : "raising") << " path, Γ = " << limits.largest.work_of_adhesion
          << " J/m²)\n";
    print_transitions(limits, out);
    for (const auto *p : {&limits.lowering, &limits.raising})
      {
        out << "  " << (p->lowering ? "Lowering" : "Raising ") << " path: " << p->points.size() << " states, "
            << p->solves << " minimisations, " << p->wall_time << " s";
        if (p->mesh_adaptations > 0)
          out << ", mesh adapted " << p->mesh_adaptations << " time(s), at most " << p->largest_unknowns
              << " unknowns";
        out << (p->complete ? "\n" : "; stopped early: " + p->message + "\n");
      }
  }

  void print_transitions(const AdhesionLimits &limits, std::ostream &out)
  {
    if (limits.transitions.empty())
      {
        out << "  No jumps along either path (every change was continuous).\n";
        return;
      }
    out << "  Transitions (the branch ends somewhere in the Γ bracket and the sheet jumps):\n";
    std::vector<std::vector<std::string>> rows = {{"path", "Γ bracket [J/m²]", "kind", "conformed [%]",
                                                   "raised + floor contact [%]", "released [J/m²]"}};
    for (const auto &t : limits.transitions)
      rows.push_back({t.lowering ? "lowering" : "raising",
                      significant(t.gamma_lower, 4) + " – " + significant(t.gamma_upper, 4), t.kind,
                      fixed(100 * t.fraction_before, 1) + " → " + fixed(100 * t.fraction_after, 1),
                      fixed(100 * t.raised_before, 1) + " + " + fixed(100 * t.floor_before, 1) + " → " +
                        fixed(100 * t.raised_after, 1) + " + " + fixed(100 * t.floor_after, 1),
                      significant(t.energy_released, 3)});
    print_table(rows, out, "    ");
    out << std::defaultfloat << std::setprecision(4);
  }

  void print_fabrication_check(const SheetCase &c, const AdhesionLimits &limits, const FabricationCheck &check,
                               std::ostream &out)
  {
    const double target = c.limits.target_fraction;
    const auto  &name   = c.problem.model.material.name;
    out << "\nFabrication check: " << name << " on " << adhesion_of(c).topography().description() << "\n";
    std::vector<std::vector<std::string>> rows = {{"Γ [J/m²]", "laid down (transfer)", "fraction", "peak strain",
                                                   "starting conformed", "fraction", "peak strain", "Γ/Γ_hold"}};
    for (const auto &r : check.rows)
      rows.push_back({fixed(r.work_of_adhesion, 3), verdict(limits.raising, r.transferred, target),
                      fixed(100 * r.transferred.conformed_fraction, 1) + " %",
                      fixed(100 * peak_strain(limits.raising, r.transferred), 2) + " %",
                      verdict(limits.lowering, r.grown, target), fixed(100 * r.grown.conformed_fraction, 1) + " %",
                      fixed(100 * peak_strain(limits.lowering, r.grown), 2) + " %",
                      r.margin ? fixed(*r.margin, 2) : std::string("n/a")});
    print_table(rows, out);
    out << "  (fraction: conformed fraction; peak strain: peak principal strain)\n" << std::defaultfloat;
    if (check.fracture_strain > 0)
      out << "  Fracture strain of " << name << ": " << 100 * check.fracture_strain << " %\n";
    else
      out << "  Fracture strain of " << name << ": unknown (not in the catalogue)\n";
    if (check.largest_safe_aspect_ratio)
      out << "  Largest safe aspect ratio (height/width): " << std::setprecision(3) << *check.largest_safe_aspect_ratio
          << " (" << check.aspect_ratio_note << ")\n";
    else if (!check.aspect_ratio_note.empty())
      out << "  Largest safe aspect ratio: not found (" << check.aspect_ratio_note << ")\n";
    out << "  " << model_caution() << "\n";
  }
} // namespace nappe

#include <nappe/analysis/state_summary.h>
#include <nappe/base/units.h>
#include <nappe/base/version.h>
#include <nappe/io/atomic_file.h>
#include <nappe/io/caution.h>
#include <nappe/io/json_writer.h>
#include <nappe/io/sheet_report.h>
#include <nappe/physics/adhesion_potential.h>

#include <algorithm>
#include <cmath>
#include <iomanip>
#include <sstream>

namespace nappe
{
  namespace
  {
    const double nm = units::nanometer;

    // Printed values below these are the round-off of a sheet that is not deformed (a flat conformed
    // sheet used to print a peak strain of 4e-32 %) and are printed as 0: far below anything measurable,
    // far above double-precision noise (common practice, no source).
    const double strain_resolution          = 1e-10;                      // 1
    const double length_resolution          = 1e-15;                      // m
    const double electronic_resolution      = 1e-9 * units::electronvolt; // J
    const double field_resolution           = 1e-6;                       // T
    const double relative_energy_resolution = 1e-12;                      // of the largest term

    /// @p value, or 0 where its magnitude is below @p resolution.
    double shown(const double value, const double resolution)
    {
      return std::abs(value) < resolution ? 0.0 : value;
    }

    std::string regime_of(const SheetCase &c, const ConformationMeasures &m)
    {
      return regime_name(classify_regime(m, c.limits.target_fraction));
    }

    void write_conformation(JsonWriter &json, const SheetCase &c, const ConformationMeasures &m)
    {
      const AdhesionPotential &a = *c.problem.model.adhesion();
      json.begin_object("conformation");
      json.value("verdict", regime_of(c, m));
      json.value("definition", "share of the sheet's projected area with gap <= gap of peak adhesion traction");
      json.quantity("conformed_fraction", m.conformed_fraction, "1");
      json.quantity("raised_contact_fraction", m.raised_contact_fraction(), "1");
      json.quantity("floor_contact_fraction", m.floor_contact_fraction(), "1");
      json.quantity("floor_touched", m.floor_touched(), "1");
      json.value("floor_definition", "substrate height in the lower half of its range over the sheet");
      json.quantity("conformed_area", m.conformed_area / (nm * nm), "nm^2");
      json.quantity("sheet_area", m.sheet_area / (nm * nm), "nm^2");
      json.quantity("max_gap", m.max_gap / nm, "nm");
      json.value("suspended_regions", static_cast<unsigned int>(m.suspended_regions.size()));
      double suspended_area = 0.0;
      for (const auto &r : m.suspended_regions)
        suspended_area += r.area;
      json.quantity("suspended_area", suspended_area / (nm * nm), "nm^2");
      json.value("adhesion_law", a.law().name());
      json.quantity("work_of_adhesion", a.law().work_of_adhesion(), "J/m^2");
      json.quantity("equilibrium_gap", a.law().equilibrium_gap() / nm, "nm");
      json.quantity("peak_traction_gap", a.law().peak_traction_gap() / nm, "nm");
      json.value("gap_measure", a.gap_measure() == GapMeasure::normal ? "normal" : "vertical");
      json.value("topography", a.topography().description());
      json.value("protocol", c.problem.start == StartProtocol::laid_down ? "laid down" : "grown conformal");
      json.end_object();
    }

    void write_extremes(JsonWriter &json, const SheetMeasures &measures)
    {
      json.begin_object("extremes");
      for (const auto &e : measures.extremes)
        {
          json.begin_object(e.quantity->extreme_key);
          json.value("value", e.extreme.value / e.quantity->si_per_unit);
          json.value("unit", e.quantity->unit);
          json.quantity("x", e.extreme.location[0] / nm, "nm");
          json.quantity("y", e.extreme.location[1] / nm, "nm");
          json.end_object();
        }
      json.end_object();
    }

    /// The load path's steps, without the minimisations on adapted meshes that follow it.
    unsigned int load_steps(const SheetResult &r)
    {
      return r.path.steps.size() - (r.meshes.empty() ? 0 : r.meshes.size() - 1);
    }

    void write_solver(JsonWriter &json, const SheetCase &c, const SheetResult &r)
    {
      const MinimizerReport &last = r.path.final_state();
      json.begin_object("solver");
      json.value("converged", r.converged);
      json.value("load_steps", load_steps(r));
      json.value("step_cuts", r.path.step_cuts);
      json.value("newton_iterations", r.path.newton_iterations);
      json.quantity("final_residual", last.residual, "N");
      json.quantity("residual_tolerance", last.tolerance, "N");
      json.value("hessian_negative_pivots", last.negative_pivots);
      json.value("hessian_zero_pivots", last.zero_pivots);
      json.value("stability", last.negative_pivots > 0 ? "unstable" :
                              last.zero_pivots > 0    ? "neutrally stable minimum (Hessian positive semi-definite)" :
                                                        "stable minimum (Hessian positive definite)");
      const SolverSettings used = resolved(c.problem.solver, r.unknowns, r.meshes.size() > 1);
      json.value("linear_solver", used.linear_solver);
      json.value("stability_certificate", used.certificate);
      json.quantity("wall_time", r.path.wall_time, "s");
      json.end_object();
    }

    /// The meshes of an adaptive solve, coarsest first, each with its state's error estimate.
    void write_mesh_adaptation(JsonWriter &json, const SheetResult &r)
    {
      if (r.meshes.size() < 2)
        return;
      json.begin_array("mesh_adaptation");
      for (const MeshCycle &m : r.meshes)
        {
          json.begin_object();
          json.value("cells", m.cells);
          json.value("degrees_of_freedom", static_cast<long long>(m.unknowns));
          json.value("newton_iterations", m.newton_iterations);
          json.quantity("error_indicator_sum", m.estimated_error, "J");
          json.end_object();
        }
      json.end_array();
    }

    void print_mesh_adaptation(const SheetResult &r, std::ostream &out)
    {
      if (r.meshes.size() < 2)
        return;
      const MeshCycle &first = r.meshes.front(), &last = r.meshes.back();
      out << "Mesh: adapted " << r.meshes.size() - 1 << " time(s), " << first.cells << " -> " << last.cells
          << " cells, " << first.unknowns << " -> " << last.unknowns << " unknowns; error indicator sum "
          << first.estimated_error / 1e-18 << " -> " << last.estimated_error / 1e-18
          << " aJ (guides refinement, not an error bound)\n";
    }

    void write_lattice_export(JsonWriter &json, const SheetCase &c, const LatticeExportReport &r)
    {
      json.begin_object("strained_lattice");
      json.quantity("zigzag_angle", c.electronics.zigzag_angle * 180.0 / M_PI, "deg");
      json.value("atoms", static_cast<long long>(r.n_atoms));
      json.value("periodic", r.periodic);
      if (r.periodic)
        json.quantity("residual_strain", r.supercell.largest_residual_strain(), "1");
      json.value("atoms_off_sheet", static_cast<long long>(r.n_off_sheet));
      json.begin_array("files");
      for (const auto &f : r.files)
        json.value("", f);
      json.end_array();
      json.end_object();
    }

    void write_summary(const SheetCase &c, const SheetResult &r, const LatticeExportReport *lattice, std::ostream &out)
    {
      const SheetModel &model = c.problem.model;
      JsonWriter        json(out);
      json.begin_object();
      json.value("program", "nappe " + version());
      json.value("case", c.title);
      json.value("note", model_caution());
      json.begin_object("sheet");
      json.value("material", model.material.name);
      json.quantity("youngs_modulus_2d", model.material.youngs_modulus_2d, "N/m");
      json.quantity("poisson_ratio", model.material.poisson_ratio, "1");
      json.quantity("bending_rigidity", model.material.bending_rigidity / units::electronvolt, "eV");
      if (model.material.fracture_strain > 0) // 0: unknown, and then absent rather than a number
        json.quantity("fracture_strain", model.material.fracture_strain, "1");
      json.end_object();
      json.begin_object("discretization");
      json.value("cells", static_cast<long long>(r.cells));
      json.value("degrees_of_freedom", static_cast<long long>(r.unknowns));
      json.value("element_degree", model.discretization.degree);
      json.value("mpi_ranks", r.ranks);
      json.end_object();
      json.begin_object("energy");
      json.quantity("stretching", r.energy.stretching, "J");
      json.quantity("bending", r.energy.bending, "J");
      json.quantity("substrate", r.energy.substrate, "J");
      json.quantity("external_work", r.energy.external_work, "J");
      json.quantity("total", r.energy.total(), "J");
      json.end_object();
      write_extremes(json, r.measures);
      if (r.conformation)
        write_conformation(json, c, *r.conformation);
      if (lattice)
        write_lattice_export(json, c, *lattice);
      json.begin_array("warnings");
      for (const auto &w : r.warnings)
        json.value("", w);
      json.end_array();
      write_solver(json, c, r);
      write_mesh_adaptation(json, r);
      json.end_object();
    }
  } // namespace

  void write_sheet_summary(const std::string &path, const SheetCase &c, const SheetResult &r,
                           const LatticeExportReport *lattice)
  {
    write_atomically(path, [&](std::ostream &out) { write_summary(c, r, lattice, out); });
  }

  void write_substrate_tables(const std::string &stem, const ConformationMeasures &m)
  {
    write_atomically(stem + "_strain_histogram.csv", [&](std::ostream &out) {
      out << "quantity,bin_low,bin_high,area_fraction\n" << std::setprecision(8);
      for (const auto &h : m.histograms)
        for (std::size_t b = 0; b < h.area.size(); ++b)
          out << h.quantity << "," << h.bin_edges[b] << "," << h.bin_edges[b + 1] << "," << h.area[b] / m.sheet_area
              << "\n";
    });
    write_atomically(stem + "_suspended_regions.csv", [&](std::ostream &out) {
      out << "region,area_nm2,max_gap_nm,x_nm,y_nm\n" << std::setprecision(8);
      for (std::size_t i = 0; i < m.suspended_regions.size(); ++i)
        {
          const auto &r = m.suspended_regions[i];
          out << i + 1 << "," << r.area / (nm * nm) << "," << r.max_gap / nm << "," << r.max_gap_location[0] / nm
              << "," << r.max_gap_location[1] / nm << "\n";
        }
    });
  }

  void write_field_map(const std::string &path, const GridSamples &samples)
  {
    write_atomically(path, [&](std::ostream &out) {
      out << "x_nm,y_nm";
      for (const SheetQuantity *q : samples.quantities)
        out << "," << q->name << q->unit_suffix();
      out << "\n" << std::setprecision(8);
      for (std::size_t k = 0; k < samples.points.size(); ++k)
        {
          out << samples.points[k][0] / nm << "," << samples.points[k][1] / nm;
          for (const double v : samples.values[k])
            out << "," << v;
          out << "\n";
        }
    });
  }

  namespace
  {
    std::string percent(double fraction)
    {
      std::ostringstream s;
      s << std::setprecision(3) << 100 * fraction << " %";
      return s.str();
    }

    /// The sheet's state in the trade's words, with the contact split into raised parts and floor.
    std::string sheet_state(const SheetCase &c, const ConformationMeasures &m)
    {
      const std::string contact = "in contact over " + percent(m.conformed_fraction) + " of its area (" +
                                  percent(m.raised_contact_fraction()) + " on raised parts, " +
                                  percent(m.floor_contact_fraction()) + " on the floor)";
      switch (classify_regime(m, c.limits.target_fraction))
        {
          case Regime::conforms: return "conforms to the substrate — " + contact;
          case Regime::tents: return "rests on the raised features (tents); the floor is untouched — " + contact;
          case Regime::touches_floor: return "touches the floor over " + percent(m.floor_touched()) + " of it — " + contact;
          default: return "suspended: bridges the features or has let go — " + contact;
        }
    }
  } // namespace

  namespace
  {
    /// The extreme of @p key, if the table measured it for this sheet.
    const LocatedValue *measured(const SheetMeasures &m, const std::string &key)
    {
      for (const auto &e : m.extremes)
        if (e.quantity->extreme_key == key)
          return &e.extreme;
      return nullptr;
    }

    std::string at(const LocatedValue &v)
    {
      std::ostringstream s;
      s << std::setprecision(4) << "(" << v.location[0] / nm << ", " << v.location[1] / nm << ") nm";
      return s.str();
    }

    /// The electronic estimates the table measured (pseudo-magnetic field, deformation potential, gap shift).
    void print_electronic_estimates(const SheetMeasures &m, std::ostream &out)
    {
      bool any = false;
      if (const auto *B = measured(m, "max_pseudo_magnetic_field_K"))
        out << "Pseudo-magnetic field:  largest |B| " << shown(std::abs(B->value), field_resolution) << " T at "
            << at(*B) << " (valley K: B = " << shown(B->value, field_resolution) << " T; valley K' has -B)\n",
          any = true;
      const auto range = [&](const char *label, const std::string &name, double unit, const char *unit_name) {
        const auto *lo = measured(m, "min_" + name), *hi = measured(m, "max_" + name);
        if (!lo || !hi)
          return;
        const double low = shown(lo->value, electronic_resolution), high = shown(hi->value, electronic_resolution);
        if (low == 0.0 && high == 0.0)
          out << label << "0 " << unit_name << " everywhere\n";
        else
          out << label << low / unit << " to " << high / unit << " " << unit_name << " (lowest at " << at(*lo)
              << ", highest at " << at(*hi) << ")\n";
        any = true;
      };
      range("Deformation potential:  ", "deformation_potential", units::electronvolt, "eV");
      range("Optical gap shift:      ", "gap_shift", 1e-3 * units::electronvolt, "meV");
      if (any)
        out << "  (first-order continuum estimates, not band structures: confirm with electronic-structure "
               "calculations and measurement; docs/electronics.md)\n";
    }
  } // namespace

  void print_sheet_summary(const SheetCase &c, const SheetResult &r, const std::vector<std::string> &files,
                           std::ostream &out)
  {
    out << "\n== " << c.title << " ==\n";
    if (!r.converged)
      {
        out << "NO RESULT: " << r.message << "\n";
        return;
      }
    const auto &m = r.measures;
    out << std::setprecision(4);
    if (r.conformation)
      {
        const auto &cm = *r.conformation;
        out << "Sheet: " << sheet_state(c, cm) << "\n";
        out << "       " << cm.suspended_regions.size() << " suspended region(s), largest gap " << cm.max_gap / nm
            << " nm\n";
      }
    const auto &w = m.at("max_deflection"), &e1 = m.at("max_principal_strain");
    out << "Max deflection:         " << shown(w.value, length_resolution) / nm << " nm at (" << w.location[0] / nm << ", " << w.location[1] / nm
        << ") nm\n";
    if (const double peak = shown(e1.value, strain_resolution); peak != 0.0)
      out << "Peak principal strain:  " << 100 * peak << " % at " << at(e1);
    else
      out << "Peak principal strain:  0 % (unstrained)";
    const SheetMaterial &sheet = c.problem.model.material;
    if (sheet.fracture_strain > 0)
      out << "; fracture strain of " << sheet.name << " " << 100 * sheet.fracture_strain << " %";
    else
      out << "; fracture strain of " << sheet.name << " unknown";
    out << "\n";
    for (const auto &warning : r.warnings)
      out << "WARNING: " << warning << "\n";
    out << "Largest areal strain:   " << 100 * shown(m.at("max_areal_strain").value, strain_resolution) << " %\n";
    out << "Largest shear strain:   " << 100 * shown(m.at("max_shear_strain").value, strain_resolution) << " %\n";
    print_electronic_estimates(m, out);
    const auto  &E      = r.energy;
    const double scale  = std::max({std::abs(E.stretching), std::abs(E.bending), std::abs(E.substrate),
                                    std::abs(E.external_work)});
    const auto   energy = [&](const double value) { return shown(value, relative_energy_resolution * scale) / 1e-18; };
    out << "Energy (aJ): stretching " << energy(E.stretching) << ", bending " << energy(E.bending) << ", substrate "
        << energy(E.substrate) << ", external work " << energy(E.external_work) << ", total " << energy(E.total())
        << "\n";
    print_mesh_adaptation(r, out);
    const SolverSettings used       = resolved(c.problem.solver, r.unknowns, r.meshes.size() > 1);
    const bool           by_inertia = used.certificate == "LDLT inertia";
    const unsigned int   zeros      = r.path.final_state().zero_pivots;
    if (zeros > 0)
      out << "Solver: neutrally stable equilibrium (Hessian positive semi-definite with " << zeros
          << " zero eigenvalue(s): the sheet can move along a symmetry of the cell, e.g. a wrinkle sliding, "
             "without changing its energy; ";
    else
      out << (by_inertia ? "Solver: certified stable equilibrium (Hessian positive definite; " :
                           "Solver: stable equilibrium (lowest Hessian eigenvalue positive by LOBPCG, not a proof; ");
    out << r.path.newton_iterations
        << " Newton iterations in " << load_steps(r) << " load step(s)"
        << (r.meshes.size() > 1 ? " and " + std::to_string(r.meshes.size() - 1) + " adapted mesh(es)" : "") << ", "
        << used.linear_solver << ", "
        << r.path.wall_time << " s)\n";
    for (const auto &f : files)
      out << f << "\n";
    out << model_caution() << "\n";
  }
} // namespace nappe

#include <deal.II/distributed/tria.h>

#include <nappe/base/units.h>
#include <nappe/io/case_checks.h>
#include <nappe/physics/adhesion_potential.h>

#include <cmath>
#include <iomanip>
#include <sstream>

namespace nappe
{
  namespace
  {
    std::string number(double v, int digits = 3)
    {
      std::ostringstream s;
      s << std::setprecision(digits) << v;
      return s.str();
    }

    /// A warning unless low ≤ value ≤ high; @p cause_low / @p cause_high say what was likely meant.
    void check_range(std::vector<std::string> &warnings, const std::string &entry, double value, double low,
                     double high, const std::string &unit, const std::string &cause_low, const std::string &cause_high)
    {
      if (value >= low && value <= high)
        return;
      warnings.push_back(entry + " = " + number(value) + " " + unit + " is " + (value < low ? "below" : "above") +
                         " the " + number(low) + "–" + number(high) + " " + unit + " the trade uses; " +
                         (value < low ? cause_low : cause_high));
    }

    /// The adhesion front's length ℓ = (4D/k)^{1/4}, k = φ''(h₀) [m].
    double front_length(const SheetProblem &p)
    {
      const AdhesionLaw &law = p.model.adhesion()->law();
      double             phi, dphi, stiffness;
      law.evaluate(law.equilibrium_gap(), phi, dphi, stiffness);
      return std::pow(4.0 * p.model.material.bending_rigidity / stiffness, 0.25);
    }

    /// Cells and the largest element side of the case's mesh, from its coarse mesh (no refinement).
    std::pair<unsigned long long, double> mesh_size(const SheetDomain &domain)
    {
      SheetDomain coarse        = domain;
      coarse.global_refinements = 0;
      dealii::parallel::distributed::Triangulation<2> tria(MPI_COMM_SELF);
      make_sheet_mesh(tria, coarse);
      double longest = 0.0;
      for (const auto &cell : tria.active_cell_iterators())
        for (const unsigned int f : cell->face_indices())
          longest = std::max(longest, cell->face(f)->measure());
      const double refine = std::pow(2.0, domain.global_refinements);
      return {static_cast<unsigned long long>(tria.n_global_active_cells() * refine * refine), longest / refine};
    }
  } // namespace

  std::vector<std::string> plausibility_warnings(const SheetCase &c)
  {
    std::vector<std::string> w;
    const SheetProblem      &p  = c.problem;
    const double             nm = units::nanometer;
    const std::string metres = "a value in metres typed into an nm entry?";
    const std::string huge   = "a value in µm or mm typed into an nm entry?";
    if (p.domain.shape == SheetDomain::Shape::disk)
      check_range(w, "Domain/Radius", p.domain.radius / nm, 0.1, 1e6, "nm", metres, huge);
    else
      {
        check_range(w, "Domain/Length x", p.domain.length_x / nm, 0.1, 1e6, "nm", metres, huge);
        check_range(w, "Domain/Length y", p.domain.length_y / nm, 0.1, 1e6, "nm", metres, huge);
      }
    const SheetMaterial &m = p.model.material;
    check_range(w, "Sheet/Young's modulus 2D", m.youngs_modulus_2d, 1, 1000, "N/m",
                "a 3D modulus in GPa was perhaps meant (Y = E·t)?", "a 3D modulus in Pa typed as a 2D modulus in N/m?");
    check_range(w, "Sheet/Bending rigidity", m.bending_rigidity / units::electronvolt, 0.1, 100, "eV",
                "a value in J or nN·nm typed as eV?", "a value in meV typed as eV?");
    if (const AdhesionPotential *a = p.model.adhesion())
      {
        check_range(w, "Adhesion/Work of adhesion", a->law().work_of_adhesion(), 0.005, 5, "J/m^2",
                    "a value in J/m^2 typed into meV/A^2, or a typo?",
                    "mJ/m^2 meant? (450 mJ/m^2 = 0.45 J/m^2: set Adhesion/Work of adhesion unit = mJ/m^2)");
        check_range(w, "Adhesion/Equilibrium separation", a->law().equilibrium_gap() / nm, 0.1, 3, "nm",
                    "a value in metres or Å typed into an nm entry?", "a value in Å typed into an nm entry?");
      }
    return w;
  }

  ResolutionReport resolution_report(const SheetCase &c)
  {
    ResolutionReport r;
    const SheetProblem &p          = c.problem;
    const unsigned int  degree     = p.model.discretization.degree;
    const double        nm         = units::nanometer;
    std::tie(r.cells, r.element_size) = mesh_size(p.domain);
    const double per_side = degree * std::sqrt(double(r.cells)) + 1;
    r.unknowns            = static_cast<unsigned long long>(3 * per_side * per_side);
    const double relative = r.unknowns / 148e3; // the measured reference size
    r.step_time           = 4.0 * std::pow(relative, 1.3);
    r.memory              = 1.0e9 * std::pow(relative, 1.2);
    r.lines.push_back("mesh: " + std::to_string(r.cells) + " Q" + std::to_string(degree) + " cells, element size " +
                      number(r.element_size / nm) + " nm, about " + std::to_string(r.unknowns) + " unknowns");
    r.lines.push_back("estimated cost per Newton step on one core: " + number(r.step_time, 2) + " s, " +
                      number(r.memory / 1e9, 2) + " GB (from measured MUMPS scaling; more ranks divide the memory)");
    if (!p.model.adhesion())
      return r;
    for (const auto &f : p.model.adhesion()->topography().features())
      {
        const double elements = f.length / r.element_size;
        r.lines.push_back(f.name + " " + number(f.length / nm) + " nm: " + number(elements, 2) + " elements (needs " +
                          number(f.elements_needed, 2) + ")");
        if (elements < f.elements_needed)
          r.warnings.push_back("the topography's " + f.name + " (" + number(f.length / nm) + " nm) is resolved by " +
                               number(elements, 2) + " elements, fewer than " + number(f.elements_needed, 2) +
                               ": the substrate is seen coarser than it is; raise Domain/Global refinements");
      }
    const double front = front_length(p), spacing = r.element_size / degree;
    r.lines.push_back("adhesion front length (4D/k)^(1/4) = " + number(front / nm) + " nm: " +
                      number(front / spacing, 2) + " node spacings");
    if (spacing > front)
      r.warnings.push_back("the adhesion front (length " + number(front / nm) + " nm) is narrower than the node "
                           "spacing " + number(spacing / nm) + " nm: where the sheet lets go of the substrate the "
                           "conformed fraction and the thresholds carry a discretisation error; check them at one "
                           "more Domain/Global refinement");
    return r;
  }
} // namespace nappe

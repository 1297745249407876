#include <deal.II/distributed/tria.h>

#include <nappe/base/units.h>
#include <nappe/io/case_checks.h>
#include <nappe/base/collective.h>
#include <nappe/physics/adhesion_potential.h>

#include <unistd.h>

#include <cmath>
#include <filesystem>
#include <fstream>
#include <iomanip>
#include <sstream>

namespace nappe
{
  namespace fs = std::filesystem;

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

  namespace
  {
    /// MemAvailable of /proc/meminfo [bytes]; 0 if unknown.
    double available_memory()
    {
      std::ifstream in("/proc/meminfo");
      std::string   key;
      double        kb = 0.0;
      while (in >> key)
        {
          if (key == "MemAvailable:")
            return (in >> kb) ? kb * 1024.0 : 0.0;
          in.ignore(1 << 10, '\n');
        }
      return 0.0;
    }

    void check_output_directory(const std::string &directory)
    {
      std::error_code ignored; // a name the system refuses (e.g. too long) is a missing folder
      AssertThrow(fs::is_directory(directory, ignored),
                  dealii::ExcMessage("Output/Directory: '" + directory + "' does not exist (create it first)."));
      const fs::path probe = fs::path(directory) / (".nappe-write-test-" + std::to_string(::getpid()));
      std::ofstream(probe.string()) << "x";
      const bool writable = fs::exists(probe, ignored);
      fs::remove(probe, ignored);
      AssertThrow(writable, dealii::ExcMessage("Output/Directory: cannot write into '" + directory + "'."));
    }

    /// The topography on a grid over the sheet: finite everywhere and at a slope any sheet model allows.
    void check_topography(const SheetProblem &p)
    {
      const Topography &t = p.model.adhesion()->topography();
      const auto [lower, upper] = p.domain.bounding_box();
      const bool disk           = p.domain.shape == SheetDomain::Shape::disk;
      double     steepest       = 0.0;
      dealii::Point<2> where;
      for (unsigned int j = 0; j <= 100; ++j)
        for (unsigned int i = 0; i <= 100; ++i)
          {
            const dealii::Point<2> x(lower[0] + i * (upper[0] - lower[0]) / 100,
                                     lower[1] + j * (upper[1] - lower[1]) / 100);
            if (disk && x.norm() > p.domain.radius)
              continue;
            const std::string at = "(" + number(x[0] * 1e9, 6) + ", " + number(x[1] * 1e9, 6) + ") nm";
            double            s  = 0.0;
            dealii::Tensor<1, 2> slope;
            try
              {
                s     = t.height(x);
                slope = t.gradient(x);
              }
            catch (const std::exception &e)
              {
                AssertThrow(false, dealii::ExcMessage("Topography at " + at + ": " + user_message(e)));
              }
            AssertThrow(std::isfinite(s) && std::isfinite(slope[0]) && std::isfinite(slope[1]),
                        dealii::ExcMessage("Topography at " + at + ": the height or slope is not a finite number (" +
                                           t.description() + ")."));
            if (slope.norm() > steepest)
              {
                steepest = slope.norm();
                where    = x;
              }
          }
      AssertThrow(steepest <= 10.0,
                  dealii::ExcMessage("Topography: slope " + number(steepest) + " at (" + number(where[0] * 1e9) + ", " +
                                     number(where[1] * 1e9) + ") nm, steeper than 84°; no sheet model applies to such "
                                     "a surface (a depth or height in the wrong unit?): " + t.description()));
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

  namespace
  {
    // Measured on a clamped drum, one rank (benchmarks/README.md), as multiples of the reference size
    // of 148k unknowns: MUMPS ≈ N^1.3 in time, N^1.2 in memory; multilevel CG 0.36 GB at 148k and
    // 3.2 GB at 2.4M unknowns (≈ N^0.8), its time that of the solve and the certificate, about twice
    // the measured solve.
    double step_time_estimate(const std::string &linear_solver, double relative)
    {
      return linear_solver == "multilevel CG" ? 8.0 * std::pow(relative, 1.1) : 4.0 * std::pow(relative, 1.3);
    }

    double memory_estimate(const std::string &linear_solver, double relative)
    {
      return linear_solver == "multilevel CG" ? 0.4e9 * std::pow(std::max(relative, 0.25), 0.8) :
                                                1.0e9 * std::pow(relative, 1.2);
    }

    const double reference_unknowns = 148e3;
  } // namespace

  ResolutionReport resolution_report(const SheetCase &c)
  {
    ResolutionReport r;
    const SheetProblem &p          = c.problem;
    const unsigned int  degree     = p.model.discretization.degree;
    const double        nm         = units::nanometer;
    std::tie(r.cells, r.element_size) = mesh_size(p.domain);
    const double per_side = degree * std::sqrt(double(r.cells)) + 1;
    r.unknowns            = static_cast<unsigned long long>(3 * per_side * per_side);
    const double relative = r.unknowns / reference_unknowns;
    const bool           adaptive = p.adaptation.cycles > 0;
    const SolverSettings used     = resolved(p.solver, r.unknowns, adaptive);
    r.step_time               = step_time_estimate(used.linear_solver, relative);
    r.memory                  = memory_estimate(used.linear_solver, relative);
    r.lines.push_back("mesh: " + std::to_string(r.cells) + " Q" + std::to_string(degree) + " cells, element size " +
                      number(r.element_size / nm) + " nm, about " + std::to_string(r.unknowns) + " unknowns");
    r.lines.push_back("estimated cost per Newton step on one core: " + number(r.step_time, 2) + " s, " +
                      number(r.memory / 1e9, 2) + " GB (from the measured scaling of " + used.linear_solver +
                      (p.solver.linear_solver == "automatic" ? ", chosen automatically" : "") +
                      "; more ranks divide the memory)");
    const double finest = r.element_size / std::pow(2.0, p.adaptation.cycles);
    if (adaptive)
      r.lines.push_back("mesh adaptation: " + std::to_string(p.adaptation.cycles) +
                        " cycle(s) from this mesh, the finest element size " + number(finest / nm) +
                        " nm (the estimates above are for the first mesh; every adapted mesh is reported)");
    if (!p.model.adhesion())
      return r;
    for (const auto &f : p.model.adhesion()->topography().features())
      {
        const double elements = f.length / r.element_size;
        r.lines.push_back(f.name + " " + number(f.length / nm) + " nm: " + number(elements, 2) + " elements (needs " +
                          number(f.elements_needed, 2) + ")");
        if (elements < f.elements_needed * (1 - 1e-9)) // exactly one element per pixel is enough
          r.warnings.push_back("the topography's " + f.name + " (" + number(f.length / nm) + " nm) is resolved by " +
                               number(elements, 2) + " elements, fewer than " + number(f.elements_needed, 2) +
                               ": the substrate is seen coarser than it is; raise Domain/Global refinements");
        // The pseudo-magnetic field is a derivative of the strain and converges one order slower; 4 elements
        // across a feature (the resolution of the electronic demo scenarios) is common practice, no source.
        if (p.model.material.electronic.hopping_decay > 0 && elements < 4 * (1 - 1e-9))
          r.warnings.push_back("the pseudo-magnetic field follows the strain's gradient, and the topography's " +
                               f.name + " (" + number(f.length / nm) + " nm) spans only " + number(elements, 2) +
                               " elements: its peak |B| depends on the mesh; check it at one more Domain/Global "
                               "refinement");
      }
    // Adaptation refines every cell the front runs through, to the finest level.
    const double front = front_length(p), spacing = finest / degree;
    r.lines.push_back("adhesion front length (4D/k)^(1/4) = " + number(front / nm) + " nm: " +
                      number(front / spacing, 2) + " node spacings");
    if (spacing > front)
      r.warnings.push_back("the adhesion front (length " + number(front / nm) + " nm) is narrower than the node "
                           "spacing " + number(spacing / nm) + " nm: where the sheet lets go of the substrate the "
                           "conformed fraction, the thresholds and the strain peaks carry a discretisation error; "
                           "check them at one more Domain/Global refinement" +
                           (adaptive ? " or Mesh adaptation/Cycles" : ""));
    return r;
  }

  void check_case_inputs(const SheetCase &c, const ResolutionReport &resolution)
  {
    check_output_directory(c.output.directory);
    if (c.problem.model.adhesion())
      check_topography(c.problem);
    const double limit = c.memory_limit > 0 ? c.memory_limit : available_memory();
    if (limit <= 0 || resolution.memory <= limit)
      return;
    // Every rank has the same estimate, so every rank throws.
    const std::string solver =
      resolved(c.problem.solver, resolution.unknowns, c.problem.adaptation.cycles > 0).linear_solver;
    const double      multilevel = memory_estimate("multilevel CG", resolution.unknowns / reference_unknowns);
    const std::string switch_solver =
      solver == "direct LDLT" && multilevel <= limit && c.problem.adaptation.cycles == 0 ?
        "set Solver/Linear solver = multilevel CG (estimated " + number(multilevel / 1e9, 2) + " GB), " :
        "";
    AssertThrow(false, dealii::ExcMessage("the case needs an estimated " + number(resolution.memory / 1e9, 2) +
                             " GB for one Newton step (" + std::to_string(resolution.unknowns) + " unknowns, " +
                             solver + "), more than the " + number(limit / 1e9, 2) + " GB " +
                             (c.memory_limit > 0 ? "of Solver/Memory limit" : "this machine has available") + "; " +
                             switch_solver + "use fewer Domain/Global refinements, or raise Solver/Memory limit " +
                             "if you know better."));
  }
} // namespace nappe

#include <nappe/geometry/topography_factory.h>
#include <nappe/io/sheet_case.h>
#include <nappe/physics/adhesion_law_factory.h>
#include <nappe/solvers/hessian_solver.h>

namespace nappe
{
  using namespace dealii;

  namespace
  {
    /// "a|b|c" for a Patterns::Selection.
    std::string alternatives(const std::vector<std::string> &names)
    {
      std::string text;
      for (const auto &n : names)
        text += (text.empty() ? "" : "|") + n;
      return text;
    }

    void declare_tensor(ParameterHandler &prm, const std::string &name, const std::string &doc)
    {
      for (const std::string c : {"xx", "yy", "xy"})
        prm.declare_entry(name + " " + c, "0", Patterns::Double(-0.5, 0.5), doc + " component " + c + " [-]");
    }

    void declare_limit_parameters(ParameterHandler &prm)
    {
      prm.enter_subsection("Adhesion limits");
      prm.declare_entry("Lowest work of adhesion", "0.01", Patterns::Double(0),
                        "Lower end of the range of Gamma searched for the thresholds (nappe-limits) [unit of "
                        "Adhesion/Work of adhesion unit].");
      prm.declare_entry("Highest work of adhesion", "1", Patterns::Double(0),
                        "Upper end of the range of Gamma searched for the thresholds (nappe-limits) [unit of "
                        "Adhesion/Work of adhesion unit].");
      prm.declare_entry("Target conformed fraction", "0.99", Patterns::Double(0, 1),
                        "A state counts as conformed when its conformed fraction is at least this [-].");
      prm.declare_entry("Relative tolerance", "0.002", Patterns::Double(1e-6, 0.5),
                        "Thresholds are bracketed to [G1, G2] with ln(G2/G1) at most this [-].");
      prm.declare_entry("Initial step", "0.05", Patterns::Double(1e-6, 1),
                        "First continuation step in ln Gamma [-].");
      prm.declare_entry("Largest step", "0.1", Patterns::Double(1e-6, 2), "Largest step in ln Gamma [-].");
      prm.declare_entry("Largest fraction change", "0.02", Patterns::Double(1e-4, 1),
                        "A step stays on its branch only if its share of contact (the conformed fraction with a graded "
                        "edge, docs/theory.md) differs from the predicted one by at most this [-].");
      prm.declare_entry("Largest deflection change", "1", Patterns::Double(1e-3, 100),
                        "A step stays on its branch only if the deflection changes nowhere by more than this many "
                        "equilibrium separations h0 [-].");
      prm.declare_entry("Maximum solves", "600", Patterns::Integer(10, 100000),
                        "Minimisations one path may spend [-].");
      prm.leave_subsection();

      prm.enter_subsection("Fabrication check");
      prm.declare_entry("Enabled", "false", Patterns::Bool(),
                        "nappe-limits: add a verdict table over an interface's range of Gamma (and an aspect-ratio "
                        "scan if Feature height entry is set).");
      prm.declare_entry("Work of adhesion range", "0.2, 0.6", Patterns::List(Patterns::Double(0), 2, 2),
                        "Weakest and strongest expected Gamma of the interface [unit of Adhesion/Work of adhesion "
                        "unit].");
      prm.declare_entry("Table rows", "5", Patterns::Integer(1, 50), "Gamma values in the verdict table [-].");
      prm.declare_entry("Feature height entry", "", Patterns::Anything(),
                        "Case entry holding the feature height in nm, e.g. 'Topography/Pillar/Height'; empty: no "
                        "aspect-ratio scan.");
      prm.declare_entry("Feature width", "0", Patterns::Double(0),
                        "Lateral size the aspect ratio height/width refers to (wavelength, pillar diameter) [nm].");
      prm.leave_subsection();
    }

  } // namespace

  void declare_sheet_case_parameters(ParameterHandler &prm)
  {
    prm.enter_subsection("Case");
    prm.declare_entry("Title", "sheet case", Patterns::Anything(), "A name for the case, printed in reports.");
    prm.leave_subsection();

    prm.enter_subsection("Sheet");
    prm.declare_entry("Material", "custom", Patterns::Anything(),
                      "A name from the material catalogue (nappe-solve --list-materials), or 'custom' to use the "
                      "constants below.");
    prm.declare_entry("Young's modulus 2D", "340", Patterns::Double(0), "2D Young's modulus Y = E·t [N/m].");
    prm.declare_entry("Poisson's ratio", "0.165", Patterns::Double(-0.99, 0.5), "Poisson's ratio ν [-].");
    prm.declare_entry("Bending rigidity", "1.4", Patterns::Double(0), "Bending rigidity D [eV].");
    prm.declare_entry("Geometric nonlinearity", "true", Patterns::Bool(),
                      "Use the von Kármán strain (true) or the linear plate/membrane theory (false).");
    declare_tensor(prm, "Eigenstrain",
                   "Eigenstrain ε₀ (thermal or lattice mismatch); the flat sheet with u = 0 carries −ε₀, so a "
                   "negative value pre-tensions it.");
    prm.leave_subsection();

    prm.enter_subsection("Domain");
    prm.declare_entry("Shape", "disk", Patterns::Selection("rectangle|rhombus|disk|mesh file"),
                      "rectangle [0, Lx]×[0, Ly] (ids 0 left, 1 right, 2 bottom, 3 top); rhombus spanned by (a, 0) "
                      "and (a/2, a√3/2), the unit cell of a hexagonal array; disk of given radius centred at 0 (id 0); "
                      "mesh file: the Gmsh quadrilateral mesh named by 'Mesh file' (ids = its physical line tags; "
                      "a periodic one pairs 0/1 and 2/3, see meshes/README.md).");
    prm.declare_entry("Length x", "1000", Patterns::Double(0), "Rectangle side along x, or rhombus lattice constant [nm].");
    prm.declare_entry("Length y", "1000", Patterns::Double(0), "Rectangle side along y [nm].");
    prm.declare_entry("Radius", "500", Patterns::Double(0), "Disk radius [nm].");
    prm.declare_entry("Periodic", "false", Patterns::Bool(), "Periodic unit cell (rectangle, rhombus or mesh file).");
    prm.declare_entry("Periods per cell", "0", Patterns::Integer(0, 1000),
                      "Periodic cells: 0 = take the cell from Shape and the lengths; n >= 1 = make the cell n periods "
                      "of the topography's lattice along each direction (a rectangle n wavelengths long for a "
                      "grating, keeping Length y; n x n periods for an egg carton or a square array; a rhombus of "
                      "side n pitches for a hexagonal array), so that a sweep over a period stays right [-].");
    prm.declare_entry("Mesh file", "", Patterns::Anything(),
                      "Shape = mesh file: Gmsh .msh file (ASCII format 2.2 or 4.1, quadrilaterals), absolute or "
                      "relative to the case file's directory.");
    prm.declare_entry("Mesh scale", "1", Patterns::Double(0),
                      "Shape = mesh file: length of one mesh unit [nm]; coordinates in the file are multiplied by it.");
    prm.declare_entry("Coarse cells x", "1", Patterns::Integer(1, 64), "Coarse cells along x before refinement [-].");
    prm.declare_entry("Coarse cells y", "1", Patterns::Integer(1, 64), "Coarse cells along y before refinement [-].");
    prm.declare_entry("Global refinements", "4", Patterns::Integer(0, 10), "Uniform refinements of the coarse mesh [-].");
    prm.leave_subsection();

    prm.enter_subsection("Edges");
    prm.declare_entry("Conditions", "all: clamped/fixed", Patterns::Anything(),
                      "Comma-separated 'id: deflection/in-plane' with deflection in {free, simply supported, clamped} "
                      "and in-plane in {free, fixed}; 'all' means every boundary id. Ids not listed are free/free.");
    prm.leave_subsection();

    prm.enter_subsection("Loads");
    prm.declare_entry("Pressure", "0", Patterns::Double(), "Uniform pressure acting in +z [kPa].");
    prm.declare_entry("Point load", "0", Patterns::Double(), "Concentrated force in +z [nN]; 0 for none.");
    prm.declare_entry("Point load x", "0", Patterns::Double(), "x of the point load [nm].");
    prm.declare_entry("Point load y", "0", Patterns::Double(), "y of the point load [nm].");
    declare_tensor(prm, "Mean strain", "Prescribed mean in-plane strain E (u = E·x + periodic part)");
    prm.leave_subsection();

    prm.enter_subsection("Substrate");
    prm.declare_entry("Enabled", "false", Patterns::Bool(),
                      "Lay the sheet on the substrate described by subsections Topography and Adhesion.");
    prm.declare_entry("Gap measure", "normal", Patterns::Selection("vertical|normal"),
                      "Gap g = w − s (vertical) or (w − s)/√(1 + |∇s|²) (along the substrate normal, first order).");
    prm.declare_entry("Protocol", "laid down", Patterns::Selection("laid down|grown conformal"),
                      "laid down: the sheet starts flat above the substrate's top and is pulled in (transfer); "
                      "grown conformal: it starts on the surface at the equilibrium gap and relaxes.");
    prm.declare_entry("Initial clearance", "0", Patterns::Double(0),
                      "Laid down: initial height of the flat sheet above the equilibrium gap over the highest "
                      "point of the topography [nm].");
    prm.leave_subsection();
    TopographyFactory::declare_parameters(prm);
    declare_adhesion_parameters(prm);
    declare_limit_parameters(prm);
    declare_electronics_parameters(prm);

    prm.enter_subsection("Solver");
    prm.declare_entry("Element degree", "2", Patterns::Integer(2, 4), "Degree p of the Lagrange elements [-].");
    prm.declare_entry("Penalty factor", "2", Patterns::Double(0),
                      "C0 interior penalty factor η; the edge penalty is η·p(p+1)·D/h [-].");
    prm.declare_entry("Load steps", "4", Patterns::Integer(1, 10000), "Equal load increments from 0 to full load [-].");
    prm.declare_entry("Max Newton iterations", "80", Patterns::Integer(1, 10000),
                      "Per minimisation; a load step takes up to four more such budgets while the energy keeps "
                      "falling (an adhesion front on its way across the substrate) [-].");
    prm.declare_entry("Relative tolerance", "1e-9", Patterns::Double(0),
                      "Newton stops when |R| ≤ tolerance · (initial |R| of the step) [-].");
    prm.declare_entry("Memory limit", "0", Patterns::Double(0),
                      "A run whose estimated memory exceeds this is refused before it starts; 0 = the memory the "
                      "machine has available at the start [GB].");
    prm.declare_entry("Linear solver", SolverSettings().linear_solver,
                      Patterns::Selection(alternatives(hessian_solver_names())),
                      "How each Newton step solves with the Hessian: 'direct LDLT' is MUMPS' symmetric indefinite "
                      "factorisation; 'multilevel CG' is conjugate gradients with a geometric multigrid V-cycle on "
                      "the mesh's coarser refinements (less memory and time on large meshes, see "
                      "benchmarks/README.md); 'automatic' is the direct solver below " +
                        std::to_string(multilevel_crossover_unknowns) + " unknowns and the multilevel one from there on.");
    prm.declare_entry("Stability certificate", SolverSettings().certificate,
                      Patterns::Selection(alternatives(stability_certificate_names())),
                      "How a state is certified a stable minimum (no negative Hessian eigenvalue): 'LDLT inertia' "
                      "counts the negative pivots of the LDLT factorisation (Sylvester's law of inertia); "
                      "'multilevel LOBPCG' computes the lowest eigenvalue with the multilevel preconditioner, "
                      "without factorising (needs Linear solver = multilevel CG); 'automatic' is the one that goes "
                      "with the linear solver.");
    const MultilevelSettings multilevel;
    prm.declare_entry("Multilevel coarsest cells", std::to_string(multilevel.coarsest_cells),
                      Patterns::Integer(16, 100000),
                      "The multilevel solver coarsens the mesh by whole refinements until a level has at most this "
                      "many cells, and factorises that level [-].");
    prm.declare_entry("Multilevel iteration limit", std::to_string(multilevel.max_iterations),
                      Patterns::Integer(10, 100000),
                      "More CG iterations than this in one solve is a failure, reported with the last residual [-].");
    prm.leave_subsection();

    prm.enter_subsection("Mesh adaptation");
    const MeshAdaptationSettings adaptation;
    prm.declare_entry("Cycles", "0", Patterns::Integer(0, 6),
                      "After the solve on the uniform mesh: this many times estimate the error of the state, refine "
                      "where it is large (and at the adhesion front), coarsen where the sheet is smooth, and solve "
                      "again; each cycle may refine a cell once more. 0 = the uniform mesh only [-].");
    prm.declare_entry("Refined error share", std::to_string(adaptation.refined_share), Patterns::Double(0.05, 0.95),
                      "The fewest cells that carry this share of the estimated error are refined, counted separately "
                      "for the volume residuals (the adhesion front) and for the edge jumps (strain and curvature "
                      "concentrations) [-].");
    prm.declare_entry("Strain concentration share", std::to_string(adaptation.strain_concentration_share),
                      Patterns::Double(0.05, 1),
                      "Cells whose largest principal strain is at least this share of the sheet's peak strain are "
                      "refined as well, so that the reported peak is resolved [-].");
    prm.declare_entry("Coarsened error share", std::to_string(adaptation.coarsened_share), Patterns::Double(0, 0.3),
                      "The most cells that together carry at most this share of the estimated error are coarsened "
                      "(never below the uniform mesh) [-].");
    prm.leave_subsection();

    prm.enter_subsection("Output");
    prm.declare_entry("Directory", ".", Patterns::DirectoryName(),
                      "Where results are written (must exist), relative to the case file's directory.");
    prm.declare_entry("Base name", "", Patterns::FileName(),
                      "Prefix of the result files; empty: the case file's name without its extension.");
    prm.declare_entry("Write fields", "true", Patterns::Bool(), "Write VTU/PVTU fields for ParaView.");
    prm.leave_subsection();
  }

} // namespace nappe

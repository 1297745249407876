#pragma once

#include <nappe/geometry/sheet_domain.h>
#include <nappe/physics/sheet_model.h>
#include <nappe/solvers/energy_minimizer.h>
#include <nappe/solvers/hessian_solver.h>
#include <nappe/solvers/load_stepping.h>
#include <nappe/solvers/mesh_adaptation.h>

#include <memory>
#include <ostream>

namespace nappe
{
  /// How the sheet meets the substrate at the start of a solve.
  enum class StartProtocol
  {
    laid_down,      ///< starts flat at a height above the substrate's top and is pulled in (transfer)
    grown_conformal ///< starts on the surface at the equilibrium gap and relaxes (does it stay?)
  };

  /**
   * Everything the solver floor needs to find a sheet's equilibrium: the model (sheet, edges, loads,
   * discretisation and its one substrate), the domain and mesh, the Newton, load-step and linear
   * solver settings, and how the state starts. The case-file reader (io) builds one; a lab program
   * may fill it directly. Solvers and path following take a problem, never a case file.
   */
  struct SheetProblem
  {
    SheetModel           model;
    SheetDomain          domain;
    LoadSteppingSettings stepping;
    MinimizerSettings    newton;
    SolverSettings       solver;
    MeshAdaptationSettings adaptation;
    StartProtocol        start = StartProtocol::laid_down;
    /// Laid down: height of the flat sheet above the equilibrium gap over the topography's highest
    /// mesh vertex [m].
    double initial_clearance = 0.0;
  };

  /**
   * The starting state of the problem's protocol (owned vector): zero without an adhesion substrate;
   * laid down: flat at the topography's highest vertex + h₀ + clearance; grown conformal: on the
   * surface at the equilibrium gap h₀ (along the normal for the normal gap measure).
   */
  Vector initial_state(const SheetSystem &system, const SheetProblem &problem);

  /// A solved problem: the system, the final state (owned) and the load path that led there.
  struct SheetSolution
  {
    std::unique_ptr<SheetSystem> system;
    Vector                       state;
    LoadPathReport               path;
    /// The meshes the solve ran on, the first the domain's uniform one (one entry without adaptation).
    std::vector<MeshCycle> meshes;
  };

  /**
   * Builds the system, starts from initial_state() and follows the load path λ: 0 → 1 at the
   * adhesion factor @p adhesion_factor; then, for each adaptation cycle, estimates the error, adapts the
   * mesh (carrying the state over) and minimises again at full load. The state is a result only if
   * path.converged. Adaptation needs the direct linear solver ('automatic' chooses it): the multilevel
   * one coarsens by whole uniform refinements.
   */
  SheetSolution solve_sheet_problem(const SheetProblem &problem, MPI_Comm comm, std::ostream *log = nullptr,
                                    double adhesion_factor = 1.0);
} // namespace nappe

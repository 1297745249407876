#include <deal.II/base/function.h>
#include <deal.II/base/mpi.h>
#include <deal.II/base/timer.h>
#include <deal.II/numerics/vector_tools.h>

#include <nappe/physics/adhesion_potential.h>
#include <nappe/solvers/sheet_problem.h>

#include <functional>
#include <limits>

namespace nappe
{
  namespace
  {
    /// w(x) of the starting state; ũ = 0.
    class StartingHeight : public dealii::Function<2>
    {
    public:
      StartingHeight(std::function<double(const dealii::Point<2> &)> w) : dealii::Function<2>(3), w_(std::move(w)) {}
      double value(const dealii::Point<2> &p, const unsigned int component) const override
      {
        return component == 2 ? w_(p) : 0.0;
      }

    private:
      std::function<double(const dealii::Point<2> &)> w_;
    };

    double highest_substrate_point(const SheetSystem &system, const Topography &topography)
    {
      double top = -std::numeric_limits<double>::max();
      for (const auto &cell : system.dof_handler().active_cell_iterators())
        if (cell->is_locally_owned())
          for (const unsigned int v : cell->vertex_indices())
            top = std::max(top, topography.height(cell->vertex(v)));
      return dealii::Utilities::MPI::max(top, system.communicator());
    }
  } // namespace

  Vector initial_state(const SheetSystem &system, const SheetProblem &problem)
  {
    Vector                   state    = system.make_owned_vector();
    const AdhesionPotential *adhesion = problem.model.adhesion();
    if (!adhesion)
      return state;
    const Topography &s  = adhesion->topography();
    const double      h0 = adhesion->law().equilibrium_gap();
    std::function<double(const dealii::Point<2> &)> w;
    if (problem.start == StartProtocol::laid_down)
      {
        const double flat = highest_substrate_point(system, s) + h0 + problem.initial_clearance;
        w                 = [flat](const dealii::Point<2> &) { return flat; };
      }
    else if (adhesion->gap_measure() == GapMeasure::vertical)
      w = [&s, h0](const dealii::Point<2> &p) { return s.height(p) + h0; };
    else
      w = [&s, h0](const dealii::Point<2> &p) { return s.height(p) + h0 * std::sqrt(1.0 + s.gradient(p).norm_square()); };
    dealii::VectorTools::interpolate(system.mapping(), system.dof_handler(), StartingHeight(w), state);
    system.constraints().distribute(state);
    return state;
  }

  namespace
  {
    MeshCycle describe_mesh(const SheetSystem &system, unsigned int newton_iterations, double estimated_error)
    {
      return {system.dof_handler().get_triangulation().n_global_active_cells(), system.n_dofs(), newton_iterations,
              estimated_error};
    }

    /// The error estimate of @p solution's state; marks the cells of the next mesh if @p mark.
    double estimate_and_mark(SheetSolution &solution, const SheetProblem &problem, double adhesion_factor, bool mark)
    {
      SheetSystem &system  = *solution.system;
      Vector       ghosted = system.make_ghosted_vector();
      ghosted              = solution.state;
      const CellErrorIndicators indicators = estimate_cell_errors(system, ghosted, LoadLevel(1.0, adhesion_factor));
      if (mark)
        {
          const unsigned int uniform = problem.domain.global_refinements;
          mark_cells(system, indicators, problem.adaptation, uniform, uniform + problem.adaptation.cycles);
        }
      return indicators.total_squared;
    }

    /// One adaptation cycle: the marked mesh, the state carried over, and a minimisation at full load.
    void adapt_and_resolve(SheetSolution &solution, const SheetProblem &problem, unsigned int cycle,
                           std::ostream *log, double adhesion_factor)
    {
      SheetSystem &system = *solution.system;
      system.adapt(solution.state);
      if (log)
        *log << "  adapted mesh " << cycle << ": " << system.dof_handler().get_triangulation().n_global_active_cells()
             << " cells, " << system.n_dofs() << " unknowns\n";
      EnergyMinimizer minimizer(system, problem.newton, log, make_hessian_solvers(problem.solver, system));
      const MinimizerReport report = minimizer.minimize(solution.state, LoadLevel(1.0, adhesion_factor), 0.0);
      LoadPathReport &path = solution.path;
      path.newton_iterations += report.iterations;
      if (report.converged)
        {
          path.steps.push_back({1.0, report});
          return;
        }
      path.converged = false;
      path.message   = "Newton did not reach a stable state on adapted mesh " + std::to_string(cycle) + " (" +
                     report.message +
                     "). The state of the previous mesh did not carry over; try fewer Mesh adaptation/Cycles, a "
                     "smaller Refined error share, or a finer uniform start (Domain/Global refinements).";
    }
  } // namespace

  SheetSolution solve_sheet_problem(const SheetProblem &problem, MPI_Comm comm, std::ostream *log,
                                    double adhesion_factor)
  {
    dealii::Timer timer;
    SheetSolution solution;
    solution.system = std::make_unique<SheetSystem>(problem.model, problem.domain, comm);
    if (log)
      *log << "  solving: " << solution.system->dof_handler().get_triangulation().n_global_active_cells() << " cells, "
           << solution.system->n_dofs() << " unknowns, Q" << problem.model.discretization.degree << ", "
           << dealii::Utilities::MPI::n_mpi_processes(comm) << " MPI rank(s)\n";
    {
      EnergyMinimizer minimizer(*solution.system, problem.newton, log,
                                make_hessian_solvers(problem.solver, *solution.system));
      solution.state = initial_state(*solution.system, problem);
      solution.path  = follow_load_path(minimizer, solution.state, problem.stepping, log, adhesion_factor);
    }
    const unsigned int cycles = problem.adaptation.cycles;
    unsigned int       newton = 0;
    for (unsigned int cycle = 0; solution.path.converged; ++cycle)
      {
        const double error = cycles > 0 ? estimate_and_mark(solution, problem, adhesion_factor, cycle < cycles) : 0.0;
        solution.meshes.push_back(describe_mesh(*solution.system, solution.path.newton_iterations - newton, error));
        newton = solution.path.newton_iterations;
        if (cycle == cycles)
          break;
        adapt_and_resolve(solution, problem, cycle + 1, log, adhesion_factor);
      }
    if (cycles > 0)
      solution.path.wall_time = timer.wall_time();
    return solution;
  }
} // namespace nappe

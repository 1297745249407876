#include <deal.II/base/function.h>
#include <deal.II/base/mpi.h>
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

  SheetSolution solve_sheet_problem(const SheetProblem &problem, MPI_Comm comm, std::ostream *log,
                                    double adhesion_factor)
  {
    SheetSolution solution;
    solution.system = std::make_unique<SheetSystem>(problem.model, problem.domain, comm);
    if (log)
      *log << "  solving: " << solution.system->dof_handler().get_triangulation().n_global_active_cells() << " cells, "
           << solution.system->n_dofs() << " unknowns, Q" << problem.model.discretization.degree << ", "
           << dealii::Utilities::MPI::n_mpi_processes(comm) << " MPI rank(s)\n";
    EnergyMinimizer minimizer(*solution.system, problem.newton, log,
                              make_hessian_solvers(problem.solver, *solution.system));
    solution.state = initial_state(*solution.system, problem);
    solution.path  = follow_load_path(minimizer, solution.state, problem.stepping, log, adhesion_factor);
    return solution;
  }
} // namespace nappe

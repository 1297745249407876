// One Newton step (assembly of residual and Hessian + linear solve) by the sparse direct solver (MUMPS
// LDLᵀ) and by multilevel CG, on three cases: a clamped graphene drum deflected 20 nm, from 9.4k to 2.4M
// unknowns (global refinements 3 → 7); a periodic cell of graphene grown conformal on an egg carton
// (adhesion stiffness at the well), from 49k to 790k unknowns (refinements 5 → 7); and the periodic pillar
// cell of nappe-solve's demo at its solved state (tents on the pillars, in contact on their tops), from 12.7k
// to 198k unknowns (refinements 3 → 5; the solve before the timed step is not timed). Run one solver per
// process to read its peak memory:
//   multilevel_scaling --benchmark_filter='direct/drum'          (refinements 3–6; 7: ≈ 17 GB extrapolated)
//   multilevel_scaling --benchmark_filter='multilevel/drum'
//   multilevel_scaling --benchmark_filter='direct/egg_carton'    (and 'multilevel/egg_carton', likewise pillars)
// The counters give unknowns, CG iterations, levels and the peak resident memory [MB], summed over the ranks
// (one rank: the process' peak). The scaling plot: one run of both solvers with --benchmark_format=json, then
// benchmarks/plot_multilevel_scaling.py.
#include <deal.II/base/function.h>
#include <deal.II/base/mpi.h>
#include <deal.II/base/parameter_handler.h>
#include <deal.II/numerics/vector_tools.h>

#include <nappe/geometry/sinusoidal_topography.h>
#include <nappe/io/sheet_case.h>
#include <nappe/runs/pillar_demo.h>
#include <nappe/physics/adhesion_potential.h>
#include <nappe/physics/material_catalogue.h>
#include <nappe/physics/vdw_93_law.h>
#include <nappe/solvers/multilevel_hessian_solver.h>
#include <nappe/solvers/sheet_problem.h>
#include <nappe/solvers/symmetric_direct_solver.h>

#include <benchmark/benchmark.h>
#include <common/clamped_drum.h>
#include <sys/resource.h>

#include <functional>
#include <memory>
#include <string>

namespace
{
  const double radius = 500e-9, deflection = 20e-9;

  using nappe::bench::drum;
  using nappe::bench::drum_model;

  /// w = w₀(1 − r²/R²)², the clamped plate's shape, so that membrane and bending are coupled.
  class ClampedShape : public dealii::Function<2>
  {
  public:
    ClampedShape() : dealii::Function<2>(3) {}
    double value(const dealii::Point<2> &p, const unsigned int component) const override
    {
      const double s = 1.0 - p.square() / (radius * radius);
      return component == 2 ? deflection * s * s : 0.0;
    }
  };

  nappe::Vector deflected_state(const nappe::SheetSystem &system)
  {
    nappe::Vector owned = system.make_owned_vector();
    dealii::VectorTools::interpolate(system.mapping(), system.dof_handler(), ClampedShape(), owned);
    return owned;
  }

  /// Graphene grown conformal on a 2 nm / 20 nm egg carton (vdW 9-3 law, Γ of graphene on SiO2), in a
  /// periodic 20 nm cell of 2×2 coarse cells: a demo scenario.
  nappe::SheetProblem egg_carton_cell(unsigned int refinements)
  {
    const nappe::MaterialCatalogue catalogue;
    nappe::SheetProblem            p;
    p.model.material        = catalogue.material("graphene");
    p.domain.length_x       = p.domain.length_y = 20e-9;
    p.domain.coarse_cells_x = p.domain.coarse_cells_y = 2;
    p.domain.global_refinements                       = refinements;
    p.domain.periodic                                 = true;
    p.model.substrate = std::make_shared<nappe::AdhesionPotential>(
      std::make_shared<nappe::EggCarton>(2e-9, 20e-9),
      std::make_shared<nappe::Vdw93Law>(catalogue.work_of_adhesion("graphene", "SiO2"), 0.6e-9),
      nappe::GapMeasure::normal);
    p.start = nappe::StartProtocol::grown_conformal;
    return p;
  }

  double peak_memory_mb()
  {
    rusage usage;
    getrusage(RUSAGE_SELF, &usage);
    return dealii::Utilities::MPI::sum(usage.ru_maxrss / 1024.0, MPI_COMM_WORLD);
  }

  /// A Newton step's matrix and right-hand side: a system and the state (ghosted) it is linearised at.
  struct NewtonStep
  {
    NewtonStep(std::unique_ptr<nappe::SheetSystem> sheet, const nappe::Vector &owned_state)
      : system(std::move(sheet))
      , state(system->make_ghosted_vector())
      , residual(system->make_owned_vector())
      , step(system->make_owned_vector())
    {
      state = owned_state;
    }
    void assemble() { system->assemble(state, 1.0, residual, &system->hessian_matrix()); }

    std::unique_ptr<nappe::SheetSystem> system;
    nappe::Vector                       state, residual, step;
  };

  std::unique_ptr<nappe::SheetSystem> make_system(const nappe::SheetModel &model, const nappe::SheetDomain &domain)
  {
    return std::make_unique<nappe::SheetSystem>(model, domain, MPI_COMM_WORLD);
  }

  std::unique_ptr<NewtonStep> drum_step(unsigned int refinements)
  {
    auto system = make_system(drum_model(), drum(refinements));
    const nappe::Vector state = deflected_state(*system);
    return std::make_unique<NewtonStep>(std::move(system), state);
  }

  std::unique_ptr<NewtonStep> egg_carton_step(unsigned int refinements)
  {
    const nappe::SheetProblem p      = egg_carton_cell(refinements);
    auto                      system = make_system(p.model, p.domain);
    const nappe::Vector       state  = nappe::initial_state(*system, p);
    return std::make_unique<NewtonStep>(std::move(system), state);
  }

  std::unique_ptr<NewtonStep> pillar_step(unsigned int refinements)
  {
    dealii::ParameterHandler prm;
    nappe::declare_sheet_case_parameters(prm);
    prm.parse_input_from_string(nappe::pillar_demo_case());
    prm.enter_subsection("Domain");
    prm.set("Global refinements", std::to_string(refinements));
    prm.leave_subsection();
    prm.enter_subsection("Solver");
    prm.set("Linear solver", "direct LDLT");
    prm.leave_subsection();
    nappe::SheetSolution solved = nappe::solve_sheet_problem(nappe::parse_sheet_case(prm).problem, MPI_COMM_WORLD);
    AssertThrow(solved.path.converged, dealii::ExcMessage("pillar cell: " + solved.path.message));
    return std::make_unique<NewtonStep>(std::move(solved.system), solved.state);
  }

  using StepCase = std::unique_ptr<NewtonStep> (*)(unsigned int);

  void newton_step_direct(benchmark::State &state, StepCase make_step)
  {
    const auto                   d = make_step(state.range(0));
    nappe::SymmetricDirectSolver solver(MPI_COMM_WORLD);
    for (auto _ : state)
      {
        d->assemble();
        solver.factorize(d->system->hessian_matrix());
        solver.solve(d->residual, d->step);
      }
    state.counters["dofs"]           = d->system->n_dofs();
    state.counters["peak_memory_MB"] = peak_memory_mb();
  }

  void newton_step_multilevel(benchmark::State &state, StepCase make_step)
  {
    const auto                     d = make_step(state.range(0));
    nappe::MultilevelHessianSolver solver(*d->system);
    for (auto _ : state)
      {
        d->assemble();
        solver.linearize(d->state, 1.0);
        solver.prepare(d->system->hessian_matrix());
        solver.solve(d->residual, d->step);
      }
    state.counters["dofs"]           = d->system->n_dofs();
    state.counters["cg_iterations"]  = solver.last_iterations();
    state.counters["levels"]         = solver.n_levels();
    state.counters["peak_memory_MB"] = peak_memory_mb();
  }
} // namespace

BENCHMARK_CAPTURE(newton_step_direct, drum, drum_step)->DenseRange(3, 6)->Iterations(1)->Unit(benchmark::kSecond);
BENCHMARK_CAPTURE(newton_step_multilevel, drum, drum_step)
  ->DenseRange(3, 7)
  ->Iterations(1)
  ->Unit(benchmark::kSecond);
BENCHMARK_CAPTURE(newton_step_direct, egg_carton, egg_carton_step)
  ->DenseRange(5, 7)
  ->Iterations(1)
  ->Unit(benchmark::kSecond);
BENCHMARK_CAPTURE(newton_step_multilevel, egg_carton, egg_carton_step)
  ->DenseRange(5, 7)
  ->Iterations(1)
  ->Unit(benchmark::kSecond);
BENCHMARK_CAPTURE(newton_step_direct, pillars, pillar_step)->DenseRange(3, 5)->Iterations(1)->Unit(benchmark::kSecond);
BENCHMARK_CAPTURE(newton_step_multilevel, pillars, pillar_step)
  ->DenseRange(3, 5)
  ->Iterations(1)
  ->Unit(benchmark::kSecond);

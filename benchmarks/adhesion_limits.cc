// Speed of a threshold search (both Γ paths, Γ_hold, Γ_eq, Γ_snap) on a held graphene grating cell
// (our own scenario: period 40 nm, amplitude 2 nm, Q2) at 32, 64 and 128 cells per period. Target
// (common practice, no source): one threshold search of a 1D-like cell in under a minute on one core,
// so that a 16-point design sweep runs in a coffee break; issue 11: at most 60 minimisations and at
// least 4× less time than the earlier method at 64 and 128 cells per period.
//
// Second argument: 0 = predictor–corrector continuation with the trust-region minimiser (default),
// 1 = the earlier method (warm starts, bisection of the step, largest step 0.1 in ln Γ, shifted Newton
// with an energy line search), run side by side in the same process. The counters give the
// minimisations and the three thresholds [J/m²], which must agree within their brackets.
//
// On a shared machine one run's CPU time varies by up to ~20 %, so compare the methods over
// repetitions interleaved in random order (the "min" and "median" rows; the minimum is the run
// least disturbed by other work — common practice, no source):
//   adhesion_limits --benchmark_filter='refinements:2/' --benchmark_repetitions=5 \
//                   --benchmark_enable_random_interleaving=true
#include <deal.II/base/mpi.h>

#include <nappe/analysis/adhesion_limits.h>
#include <nappe/geometry/sinusoidal_topography.h>
#include <nappe/physics/adhesion_potential.h>
#include <nappe/physics/material_catalogue.h>
#include <nappe/physics/vdw_93_law.h>

#include <benchmark/benchmark.h>

#include <algorithm>

namespace
{
  nappe::SheetProblem held_grating(unsigned int refinements)
  {
    nappe::SheetProblem c;
    c.model.material            = nappe::MaterialCatalogue().material("graphene");
    c.domain.length_x           = 40e-9;
    c.domain.length_y           = 2.5e-9;
    c.domain.coarse_cells_x     = 16;
    c.domain.global_refinements = refinements;
    c.domain.periodic           = true;
    c.model.substrate = std::make_shared<nappe::AdhesionPotential>(
      std::make_shared<nappe::SinusoidalGrating>(2e-9, 40e-9), std::make_shared<nappe::Vdw93Law>(0.45, 0.5e-9),
      nappe::GapMeasure::normal);
    c.stepping.load_steps = 1;
    return c;
  }

  void threshold_search(benchmark::State &state)
  {
    nappe::SheetProblem         c = held_grating(state.range(0));
    nappe::AdhesionPathSettings range;
    range.lowest_work_of_adhesion  = 0.01;
    range.highest_work_of_adhesion = 3.0;
    if (state.range(1) == 1)
      {
        range.method         = nappe::ContinuationMethod::bisection;
        range.largest_step   = 0.1; // the earlier default
        c.newton.method      = nappe::MinimizerMethod::line_search;
      }
    nappe::AdhesionLimits limits;
    for (auto _ : state)
      limits = nappe::find_adhesion_limits(c, range, MPI_COMM_WORLD);
    state.counters["minimisations"] = limits.lowering.solves + limits.raising.solves;
    state.counters["hold"]          = limits.hold.found ? limits.hold.value() : 0.0;
    state.counters["eq"]            = limits.equal_energy.found ? limits.equal_energy.value() : 0.0;
    state.counters["snap"]          = limits.snap.found ? limits.snap.value() : 0.0;
    state.SetLabel(state.range(1) == 1 ? "earlier: bisection + line search" : "tangent predictor + trust region");
  }
} // namespace

BENCHMARK(threshold_search)
  ->ArgsProduct({{1, 2, 3}, {0, 1}})
  ->ArgNames({"refinements", "earlier"})
  ->Unit(benchmark::kSecond)
  ->ComputeStatistics("min", [](const std::vector<double> &v) { return *std::min_element(v.begin(), v.end()); })
  ->Iterations(1);

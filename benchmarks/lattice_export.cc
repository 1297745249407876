// Speed of the strained-lattice export (io/strained_lattice.h) at 10⁴–10⁶ atoms: site generation, point
// evaluation on the owning ranks (RemotePointEvaluation), per-atom fields and the gather to rank 0 (files not
// written), for a periodic graphene cell of growing size on a 64 × 64-cell Q2 mesh. Target (common practice,
// no source): 10⁶ atoms in under a minute on one core.
#include <deal.II/base/mpi.h>

#include <nappe/io/strained_lattice.h>
#include <nappe/physics/material_catalogue.h>

#include <benchmark/benchmark.h>

#include <cmath>

namespace
{
  void export_graphene_cell(benchmark::State &state)
  {
    nappe::SheetModel model;
    model.material          = nappe::MaterialCatalogue().material("graphene");
    const double       a    = model.material.lattice.lattice_constant;
    const unsigned int rows = state.range(0); // the cell holds rows × rows rectangular cells of 4 atoms
    nappe::SheetDomain domain;
    domain.shape              = nappe::SheetDomain::Shape::rectangle;
    domain.length_x           = rows * a;
    domain.length_y           = rows * std::sqrt(3.0) * a;
    domain.periodic           = true;
    domain.coarse_cells_x     = 4;
    domain.coarse_cells_y     = 4;
    domain.global_refinements = 4;
    const nappe::SheetSystem system(model, domain, MPI_COMM_WORLD);
    const nappe::Vector      fields = system.make_ghosted_vector();
    nappe::LatticeExportSettings settings;
    for (auto _ : state)
      {
        nappe::LatticeExportReport report;
        benchmark::DoNotOptimize(nappe::strained_lattice_atoms(system, fields, 1.0, settings, report));
        state.counters["atoms"] = report.n_atoms;
      }
  }
} // namespace

BENCHMARK(export_graphene_cell)->Arg(50)->Arg(160)->Arg(500)->Unit(benchmark::kMillisecond)->Iterations(1);

#include <deal.II/distributed/grid_refinement.h>

#include <nappe/solvers/mesh_adaptation.h>

namespace nappe
{
  void mark_cells(SheetSystem &system, const CellErrorIndicators &indicators, const MeshAdaptationSettings &settings,
                  unsigned int min_level, unsigned int max_level)
  {
    auto &mesh = system.mesh();
    namespace refinement = dealii::parallel::distributed::GridRefinement;
    refinement::refine_and_coarsen_fixed_fraction(mesh, indicators.squared, 0.0, settings.coarsened_share);
    for (const auto &cell : mesh.active_cell_iterators())
      cell->clear_refine_flag();
    refinement::refine_and_coarsen_fixed_fraction(mesh, indicators.residual, settings.refined_share, 0.0);
    refinement::refine_and_coarsen_fixed_fraction(mesh, indicators.jumps, settings.refined_share, 0.0);
    for (const auto &cell : mesh.active_cell_iterators())
      {
        if (!cell->is_locally_owned())
          continue;
        const unsigned int i = cell->active_cell_index();
        if (indicators.on_adhesion_front[i] ||
            indicators.peak_strain(i) >= settings.strain_concentration_share * indicators.sheet_peak_strain)
          {
            cell->clear_coarsen_flag();
            cell->set_refine_flag();
          }
        if (static_cast<unsigned int>(cell->level()) >= max_level)
          cell->clear_refine_flag();
        if (static_cast<unsigned int>(cell->level()) <= min_level)
          cell->clear_coarsen_flag();
      }
  }
} // namespace nappe

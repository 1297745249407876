#include <deal.II/distributed/grid_refinement.h>

#include <nappe/solvers/mesh_adaptation.h>

namespace nappe
{
  namespace
  {
    bool moving_feature(const CellErrorIndicators &indicators, const MeshAdaptationSettings &settings, unsigned int i)
    {
      return indicators.on_adhesion_front[i] ||
             indicators.peak_strain(i) >= settings.strain_concentration_share * indicators.sheet_peak_strain;
    }
  } // namespace

  void mark_cells(SheetSystem &system, const CellErrorIndicators &indicators, const MeshAdaptationSettings &settings,
                  unsigned int min_level, unsigned int max_level, bool bulk_refinement)
  {
    auto &mesh = system.mesh();
    namespace refinement = dealii::parallel::distributed::GridRefinement;
    refinement::refine_and_coarsen_fixed_fraction(mesh, indicators.squared, 0.0, settings.coarsened_share);
    for (const auto &cell : mesh.active_cell_iterators())
      cell->clear_refine_flag();
    if (bulk_refinement)
      {
        refinement::refine_and_coarsen_fixed_fraction(mesh, indicators.residual, settings.refined_share, 0.0);
        refinement::refine_and_coarsen_fixed_fraction(mesh, indicators.jumps, settings.refined_share, 0.0);
      }
    for (const auto &cell : mesh.active_cell_iterators())
      {
        if (!cell->is_locally_owned())
          continue;
        if (moving_feature(indicators, settings, cell->active_cell_index()))
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

  bool any_cell_marked(const SheetSystem &system, bool for_refinement)
  {
    bool marked = false;
    for (const auto &cell : system.dof_handler().get_triangulation().active_cell_iterators())
      if (cell->is_locally_owned() && (cell->refine_flag_set() || (!for_refinement && cell->coarsen_flag_set())))
        marked = true;
    return dealii::Utilities::MPI::logical_or(marked, system.communicator());
  }
} // namespace nappe

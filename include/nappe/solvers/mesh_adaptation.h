#pragma once

#include <nappe/solvers/sheet_error_estimator.h>

namespace nappe
{
  /// How a solve adapts its mesh to the state it finds (0 cycles: the domain's uniform mesh).
  struct MeshAdaptationSettings
  {
    /// Solve → estimate → mark → refine and coarsen → solve again, this many times [-].
    unsigned int cycles = 0;
    /// Bulk (Dörfler) marking: the fewest cells that carry this share of the volume residuals, and
    /// the fewest that carry this share of the edge jumps, are refined [-].
    double refined_share = 0.5;
    /// Cells whose largest principal strain is at least this share of the sheet's peak are refined
    /// (the strain concentrations, where a reported peak must be resolved) [-].
    double strain_concentration_share = 0.5;
    /// The most cells that together carry at most this share of Σ η_K² are coarsened [-].
    double coarsened_share = 0.02;
  };

  /// One mesh of a solve and the state found on it.
  struct MeshCycle
  {
    unsigned int cells = 0;
    unsigned long long unknowns = 0;
    unsigned int       newton_iterations = 0;
    /// Σ η_K² of the state on this mesh (CellErrorIndicators) [J].
    double estimated_error = 0.0;
  };

  /**
   * Sets refine and coarsen flags on @p system's mesh. With @p bulk_refinement (a solve's cycles):
   * bulk marking (Dörfler, SIAM J. Numer. Anal. 33, 1106, 1996; deal.II's fixed-fraction strategy) of
   * the volume residuals and, separately, of the edge jumps, so that the adhesion front (whose
   * unresolved residual is orders of magnitude larger) does not hide the strain concentrations.
   * Always: every cell the adhesion front runs through, and every cell whose peak strain is at least
   * strain_concentration_share of the sheet's, refined (the features that move while a load or Γ
   * varies, all that a path refines); coarsening by the sum; no cell refined beyond @p max_level nor
   * coarsened below @p min_level (the domain's uniform level, so the mesh never becomes coarser than
   * it started). Collective.
   */
  void mark_cells(SheetSystem &system, const CellErrorIndicators &indicators, const MeshAdaptationSettings &settings,
                  unsigned int min_level, unsigned int max_level, bool bulk_refinement = true);

  /// Whether any rank has a cell flagged for refinement (or, unless @p for_refinement, coarsening).
  /// Collective.
  bool any_cell_marked(const SheetSystem &system, bool for_refinement = false);
} // namespace nappe

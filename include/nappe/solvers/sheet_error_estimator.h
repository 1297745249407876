#pragma once

#include <deal.II/lac/vector.h>

#include <nappe/solvers/sheet_system.h>

#include <vector>

namespace nappe
{
  /// Per-cell a posteriori information about a sheet state, indexed by active_cell_index().
  struct CellErrorIndicators
  {
    /// η_K² [J] of the locally owned cells (zero elsewhere): the sum of the two parts below.
    dealii::Vector<float> squared;
    /// The volume residual part of η_K² [J]: large where the adhesion front is not resolved.
    dealii::Vector<float> residual;
    /// The edge jump part of η_K² [J]: large at strain and curvature concentrations.
    dealii::Vector<float> jumps;
    /// The largest absolute principal membrane strain at the cell's quadrature points [-].
    dealii::Vector<float> peak_strain;
    /// The largest of peak_strain over all ranks [-].
    double sheet_peak_strain = 0.0;
    /// The cell holds both points inside and outside the adhesion well (ψ'' changes sign across its
    /// quadrature points): the adhesion front runs through it.
    std::vector<bool> on_adhesion_front;
    /// Σ_K η_K² over all ranks [J].
    double total_squared = 0.0;
  };

  /**
   * Residual-based error indicators of a sheet state (@p state ghosted) at load level @p level. The
   * bending terms are those of the quadratic C0 interior penalty method for the biharmonic problem
   * (Brenner, Gudi & Sung, IMA J. Numer. Anal. 30, 777, 2010, estimator (3.1)), the membrane terms the
   * traction jumps and equilibrium residual of Kelly, Gago, Zienkiewicz & Babuška (Int. J. Numer.
   * Meth. Engng 19, 1593, 1983); each term is weighted by the stiffness that makes it an energy [J]:
   *
   *   η_K² = h_K⁴/D ‖p − ψ'(w) + N:∇∇w‖²_K + h_K²/Y ‖div N‖²_K
   *        + Σ_{e ⊂ ∂K} ½ ( D/h_e ‖[∂_n w]‖²_e + h_e/D ‖[M_nn]‖²_e + h_e³/D ‖[D ∂_n Δw]‖²_e + h_e/Y ‖[N n]‖²_e ).
   *
   * The ½ shares an interior or periodic edge between its cells; a clamped edge gives its one cell
   * D/h_e ‖∂_n w‖². The vertical residual leaves out DΔ²w (zero for the quadratic triangles of the
   * reference; the edge terms carry the bending error of Q_p). The substrate force ψ'(w) makes the
   * adhesion front, where it changes by the depth of the well over a few h₀, the largest volume term.
   * Collective.
   */
  CellErrorIndicators estimate_cell_errors(const SheetSystem &system, const Vector &state, const LoadLevel &level);
} // namespace nappe

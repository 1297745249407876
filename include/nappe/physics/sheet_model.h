#pragma once

#include <deal.II/base/point.h>
#include <deal.II/base/symmetric_tensor.h>
#include <deal.II/base/types.h>

#include <nappe/physics/sheet_material.h>
#include <nappe/physics/surface_potential.h>

#include <map>
#include <memory>
#include <vector>

namespace nappe
{
  /// Out-of-plane condition on an edge.
  enum class DeflectionCondition
  {
    free,             ///< no condition: zero moment and effective shear come out naturally
    simply_supported, ///< w = 0, zero normal moment (natural)
    clamped           ///< w = 0 and ∂w/∂n = 0 (the slope enters weakly, by Nitsche's method)
  };

  /// In-plane condition on an edge.
  enum class InPlaneCondition
  {
    free, ///< zero traction
    fixed ///< u = E·x: the edge follows the mean strain only (immovable for E = 0)
  };

  struct EdgeCondition
  {
    DeflectionCondition deflection = DeflectionCondition::free;
    InPlaneCondition    in_plane   = InPlaneCondition::free;
  };

  /// A concentrated force F [N] in +z at a point [m].
  struct PointLoad
  {
    dealii::Point<2> location;
    double           force = 0.0;
  };

  /**
   * Loads, all scaled together by the load factor λ ∈ [0, 1] during load stepping: pressure, point
   * loads, prescribed mean strain and eigenstrain.
   */
  struct SheetLoads
  {
    /// Uniform pressure p [Pa] acting in +z (external work ∫p·w dA).
    double pressure = 0.0;
    std::vector<PointLoad> point_loads;
    /// Prescribed mean in-plane strain E [-]: u = E·x + ũ.
    dealii::SymmetricTensor<2, 2> mean_strain;
    /// Eigenstrain ε₀ [-] (thermal or lattice mismatch); the flat sheet with u = 0 carries −ε₀,
    /// so a negative eigenstrain pre-tensions it.
    dealii::SymmetricTensor<2, 2> eigenstrain;

    /// Whether any load is nonzero (otherwise load steps change nothing).
    bool any() const
    {
      return pressure != 0.0 || !point_loads.empty() || mean_strain.norm() > 0.0 || eigenstrain.norm() > 0.0;
    }
  };

  /// Discretisation choices.
  struct SheetDiscretization
  {
    /// Polynomial degree p of the continuous Lagrange elements for u and w (≥ 2).
    unsigned int degree = 2;
    /// C0 interior penalty factor η: the penalty is η·p(p+1)·D/h on each edge.
    double penalty_factor = 2.0;
  };

  class AdhesionPotential;

  /**
   * The two factors a state is computed at, passed together wherever a load factor is: the load
   * factor λ scales every SheetLoads entry; the adhesion factor c scales the substrate potential,
   * ψ → c·ψ. For an adhesion law this is the work of adhesion Γ → c·Γ at fixed shape (the Γ-linearity
   * contract of AdhesionLaw). A plain number converts to {λ, c = 1}.
   */
  struct LoadLevel
  {
    LoadLevel(double load_factor = 1.0, double adhesion_factor = 1.0)
      : load(load_factor)
      , adhesion(adhesion_factor)
    {}
    double load;     ///< λ [-]
    double adhesion; ///< c [-]
  };

  /**
   * Everything that defines the sheet's energy: material, edges (by boundary id; ids not listed
   * are free), loads, an optional substrate interaction and the discretisation.
   */
  struct SheetModel
  {
    SheetMaterial material;
    std::map<dealii::types::boundary_id, EdgeCondition> edges;
    SheetLoads loads;
    /// Energy per area ψ(x, w) from a substrate; none if empty. The one place the substrate is kept.
    std::shared_ptr<const SurfacePotential> substrate;
    /// Use the von Kármán strain (true) or the linear Kirchhoff plate/membrane (false).
    bool geometric_nonlinearity = true;
    SheetDiscretization discretization;

    /// The substrate as an adhesion potential (topography + traction–separation law), or null if
    /// there is none or it is another kind of surface potential (e.g. a manufactured load).
    const AdhesionPotential *adhesion() const;

    /// The uniform part of the membrane strain at load factor λ: λ(E − ε₀) [-].
    dealii::SymmetricTensor<2, 2> base_strain(double load_factor) const
    {
      return load_factor * (loads.mean_strain - loads.eigenstrain);
    }
  };
} // namespace nappe

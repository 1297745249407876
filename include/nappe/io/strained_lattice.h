#pragma once

#include <deal.II/base/point.h>
#include <deal.II/base/symmetric_tensor.h>

#include <nappe/io/atomistic_writers.h>
#include <nappe/io/lattice_sites.h>
#include <nappe/solvers/sheet_system.h>

#include <string>
#include <vector>

namespace nappe
{
  /// What to export and how (subsection "Electronics/Lattice export" of a case file).
  struct LatticeExportSettings
  {
    enum class Region
    {
      cell,   ///< the whole periodic cell, on the nearest commensurate supercell
      polygon ///< the atoms inside a polygon (a box is a 4-vertex polygon): a finite flake
    };
    Region region = Region::cell;
    /// Region::polygon: vertices in order [m].
    std::vector<dealii::Point<2>> polygon;
    /// Region::cell: refuse if the commensurate supercell imposes a larger residual strain [-].
    double largest_residual_strain = 1e-3;
    /// Empty space added to the atoms' extent along z (and in-plane for a flake) [m].
    double vacuum = 2e-9;
    bool   write_xyz = true;
    bool   write_cif = true;
  };

  /// What an export did.
  struct LatticeExportReport
  {
    unsigned long long n_atoms = 0;        ///< atoms written
    unsigned long long n_off_sheet = 0;    ///< region atoms whose reference site is not on the sheet (left out)
    bool               periodic = false;   ///< a periodic cell (pbc T T F) or a flake (F F F)
    CommensurateCell   supercell;          ///< periodic: the supercell chosen and its residual strain
    std::vector<std::string> files;        ///< written files
    std::vector<std::string> columns;      ///< per-atom columns of the extended XYZ file
  };

  /**
   * Places the sheet material's atoms on its reference lattice (orientation θ, sheet_material.h), moves
   * them with the solved displacement and writes them as <base>.xyz (extended XYZ with per-atom strain
   * and electronic-field columns) and <base>.cif (P 1).
   *
   * Kinematics (Kirchhoff plate, first order): an atom at reference site X and height h above the
   * middle plane goes to x = X + λE·X + ũ(X) + w(X) e_z + h n(X), n = (−∇w, 1)/√(1 + |∇w|²).
   * Per-atom columns at X, named and scaled as the VTU fields of the quantity table (sheet_quantities.h):
   * membrane strain ε_xx, ε_yy, ε_xy (tensor shear) and, where the catalogue has the constants, the
   * pseudo-vector potential [T nm] and pseudo-magnetic field [T] of valley K, the deformation potential
   * [eV] and the gap shift [meV] (electronic_fields.h). The eigenstrain is not a displacement and does not move atoms.
   *
   * A periodic cell (rectangle or rhombus) exports the nearest commensurate supercell with cell vectors
   * (I + λE)L_i and refuses, naming the residual strain and a commensurate cell size, if the residual
   * exceeds the settings' limit; a region exports a flake of the undeformed lattice clipped to the
   * polygon, leaving out sites not on the sheet. Fields are evaluated where the sites are owned
   * (Utilities::MPI::RemotePointEvaluation) and gathered to rank 0, which writes the files; the result
   * is the same on any number of ranks. Collective. @p state must be ghosted. Throws with the entry to
   * change on bad input.
   */
  LatticeExportReport export_strained_lattice(const SheetSystem &system, const Vector &state, double load_factor,
                                              const LatticeExportSettings &settings, const std::string &base_path);

  /// One line for the run's report: atoms, supercell and residual strain (or flake), left-out atoms and files.
  std::string describe_lattice_export(const LatticeExportReport &report);

  /**
   * Checks before any solve that the export can be done: the material has a lattice and, for Region::cell, the
   * domain is a periodic rectangle or rhombus whose nearest commensurate supercell (returned) strains the lattice by
   * at most the settings' limit. Throws naming the Electronics/Lattice export entry and a commensurate cell size.
   */
  CommensurateCell check_lattice_export(const SheetMaterial &material, const SheetDomain &domain,
                                        const LatticeExportSettings &settings);

  /// The table of atoms that export_strained_lattice() writes (complete on rank 0, empty elsewhere).
  AtomTable strained_lattice_atoms(const SheetSystem &system, const Vector &state, double load_factor,
                                   const LatticeExportSettings &settings, LatticeExportReport &report);
} // namespace nappe

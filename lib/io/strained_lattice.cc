#include <nappe/analysis/point_jets.h>
#include <nappe/analysis/sheet_measures.h>
#include <nappe/base/units.h>
#include <nappe/io/strained_lattice.h>
#include <nappe/physics/electronic_fields.h>
#include <nappe/physics/strain_gradient.h>

#include <cmath>
#include <sstream>

namespace nappe
{
  using namespace dealii;

  namespace
  {
    std::string nm(double length)
    {
      std::ostringstream s;
      s.precision(8);
      s << length / units::nanometer;
      return s.str();
    }

    /// The electronic columns the material supports, each with its evaluation from (strain, gradient).
    struct Columns
    {
      std::vector<std::string> names = {"strain_xx", "strain_yy", "strain_xy"};
      bool                     field = false, potential = false, gap = false;
      PseudoGaugeCoupling      coupling;
      double                   g = 0.0;
      GapStrainCoefficient     biaxial;

      explicit Columns(const SheetMaterial &m)
      {
        const auto type = m.lattice.type;
        if ((type == LatticeType::honeycomb || type == LatticeType::binary_honeycomb) && m.electronic.hopping_decay > 0)
          field = true, coupling = PseudoGaugeCoupling::of(m), names.push_back("B_K_T");
        if (m.electronic.deformation_potential != 0.0)
          potential = true, g = m.electronic.deformation_potential, names.push_back("V_eV");
        if (m.electronic.biaxial_gap.known())
          gap = true, biaxial = m.electronic.biaxial_gap, names.push_back("gap_shift_meV");
      }

      void append(const SymmetricTensor<2, 2> &e, const Tensor<3, 2> &grad_e, std::vector<double> &out) const
      {
        out.insert(out.end(), {e[0][0], e[1][1], e[0][1]});
        if (field)
          out.push_back(pseudo_magnetic_field(grad_e, coupling));
        if (potential)
          out.push_back(deformation_potential(e, g) / units::electronvolt);
        if (gap)
          out.push_back(band_gap_shift(e, biaxial) / (1e-3 * units::electronvolt));
      }
    };

    LatticeSites make_sites(const SheetSystem &system, const LatticeExportSettings &settings,
                            LatticeExportReport &report)
    {
      const MonolayerLattice &lattice = system.model().material.lattice;
      const MPI_Comm          comm    = system.communicator();
      if (settings.region == LatticeExportSettings::Region::polygon)
        return region_sites(lattice, settings.polygon, comm);

      const SheetDomain &domain = system.domain();
      AssertThrow(domain.periodic && (domain.shape == SheetDomain::Shape::rectangle ||
                                      domain.shape == SheetDomain::Shape::rhombus),
                  ExcMessage("Electronics/Lattice export/Region = cell needs a periodic rectangle or rhombus "
                             "(Domain/Shape, Domain/Periodic); for other sheets give a box or polygon region."));
      const auto [L1, L2] = domain.lattice_vectors();
      report.periodic     = true;
      report.supercell    = nearest_commensurate_cell(lattice, L1, L2);
      const auto &cell    = report.supercell;
      AssertThrow(cell.n_primitive_cells() > 0,
                  ExcMessage("Electronics/Lattice export: the periodic cell is too small for the lattice of " +
                             system.model().material.name + " (a = " + nm(lattice.lattice_constant) + " nm)."));
      if (cell.largest_residual_strain() > settings.largest_residual_strain)
        {
          const auto [a1, a2] = lattice.primitive_vectors();
          const auto S1 = double(cell.n[0][0]) * a1 + double(cell.n[0][1]) * a2;
          const auto S2 = double(cell.n[1][0]) * a1 + double(cell.n[1][1]) * a2;
          std::ostringstream message;
          message << "Electronics/Lattice export/Largest residual strain: the periodic cell is not commensurate "
                  << "with the lattice of " << system.model().material.name << " at the orientation "
                  << lattice.orientation * 180 / M_PI << " deg; the nearest supercell would strain it by "
                  << cell.largest_residual_strain() << " (limit " << settings.largest_residual_strain
                  << "). A commensurate cell has the vectors (" << nm(S1[0]) << ", " << nm(S1[1]) << ") nm and ("
                  << nm(S2[0]) << ", " << nm(S2[1]) << ") nm; change the Domain lengths or raise the limit.";
          AssertThrow(false, ExcMessage(message.str()));
        }
      return periodic_cell_sites(lattice, cell, comm);
    }

    /// The cell and pbc of the table from the atoms (already gathered on rank 0).
    void set_cell(const SheetSystem &system, double load_factor, const LatticeExportSettings &settings,
                  bool periodic, AtomTable &atoms)
    {
      double lo[3] = {1e300, 1e300, 1e300}, hi[3] = {-1e300, -1e300, -1e300};
      for (const Point<3> &x : atoms.positions)
        for (unsigned int d = 0; d < 3; ++d)
          lo[d] = std::min(lo[d], x[d]), hi[d] = std::max(hi[d], x[d]);
      if (atoms.size() == 0)
        std::fill(lo, lo + 3, 0.0), std::fill(hi, hi + 3, 0.0);
      // Atoms are shifted so that they sit vacuum/2 above the bottom face (and side faces of a flake).
      Tensor<1, 3> shift;
      shift[2] = 0.5 * settings.vacuum - lo[2];
      atoms.cell[2][2] = hi[2] - lo[2] + settings.vacuum;
      if (periodic)
        {
          const auto [L1, L2] = system.domain().lattice_vectors();
          const auto E        = load_factor * system.model().loads.mean_strain;
          const Tensor<1, 2> V[2] = {L1 + E * L1, L2 + E * L2};
          for (unsigned int v = 0; v < 2; ++v)
            atoms.cell[v][0] = V[v][0], atoms.cell[v][1] = V[v][1];
          atoms.pbc = {true, true, false};
        }
      else
        {
          for (unsigned int d = 0; d < 2; ++d)
            shift[d] = 0.5 * settings.vacuum - lo[d], atoms.cell[d][d] = hi[d] - lo[d] + settings.vacuum;
          atoms.pbc = {false, false, false};
        }
      for (Point<3> &x : atoms.positions)
        x += shift;
      std::ostringstream z;
      z.precision(10);
      z << -shift[2] / units::angstrom;
      atoms.info.emplace_back("z_of_cell_bottom_in_sheet_frame_A", z.str());
    }
  } // namespace

  AtomTable strained_lattice_atoms(const SheetSystem &system, const Vector &state, double load_factor,
                                   const LatticeExportSettings &settings, LatticeExportReport &report)
  {
    const SheetModel &model = system.model();
    AssertThrow(model.material.lattice.defined(),
                ExcMessage("Electronics/Lattice export: the sheet material '" + model.material.name +
                           "' has no crystal lattice; choose a catalogue monolayer in Sheet/Material."));
    const MPI_Comm     comm  = system.communicator();
    const LatticeSites sites = make_sites(system, settings, report);
    std::vector<bool>  found;
    const auto         jets  = evaluate_point_jets(system, state, sites.positions, found);
    const auto         basis = model.material.lattice.basis();
    const Columns      columns(model.material);
    const auto         E     = load_factor * model.loads.mean_strain;

    // This rank's atoms: positions (3) and columns, flattened; species by basis index.
    std::vector<double>       local_values;
    std::vector<std::uint8_t> local_species;
    unsigned long long        off_sheet = 0;
    for (std::size_t i = 0; i < sites.size(); ++i)
      {
        if (!found[i])
          {
            ++off_sheet;
            continue;
          }
        const PointJet    &j      = jets[i];
        const Point<2>    &X      = sites.positions[i];
        const double       h      = basis[sites.basis_index[i]].height;
        const Tensor<1, 2> grad_w = j.gradients[2];
        const double       n_z    = 1.0 / std::sqrt(1.0 + grad_w.norm_square());
        const Tensor<1, 2> u      = E * X + Tensor<1, 2>({j.values[0], j.values[1]});
        local_values.insert(local_values.end(), {X[0] + u[0] - h * n_z * grad_w[0], X[1] + u[1] - h * n_z * grad_w[1],
                                                 j.values[2] + h * n_z});
        const auto strain = membrane_strain(model, load_factor, j.grad_u(), grad_w);
        columns.append(strain,
                       membrane_strain_gradient(j.hess_u(), grad_w, j.hessians[2], model.geometric_nonlinearity),
                       local_values);
        local_species.push_back(basis[sites.basis_index[i]].sublattice);
      }
    report.n_off_sheet = Utilities::MPI::sum(off_sheet, comm);
    report.columns     = columns.names;

    const auto all_values  = Utilities::MPI::gather(comm, local_values, 0);
    const auto all_species = Utilities::MPI::gather(comm, local_species, 0);
    AtomTable  atoms;
    atoms.species_names = {model.material.lattice.species_a, model.material.lattice.species_b};
    atoms.column_names  = columns.names;
    const std::size_t width = 3 + columns.names.size();
    for (std::size_t r = 0; r < all_values.size(); ++r)
      {
        for (std::size_t a = 0; a < all_species[r].size(); ++a)
          {
            const double *v = all_values[r].data() + a * width;
            atoms.positions.emplace_back(v[0], v[1], v[2]);
            atoms.columns.insert(atoms.columns.end(), v + 3, v + width);
          }
        atoms.species.insert(atoms.species.end(), all_species[r].begin(), all_species[r].end());
      }
    report.n_atoms = Utilities::MPI::sum<unsigned long long>(atoms.size(), comm);
    if (Utilities::MPI::this_mpi_process(comm) == 0)
      set_cell(system, load_factor, settings, report.periodic, atoms);
    atoms.info.emplace_back("material", model.material.name);
    atoms.info.emplace_back("zigzag_angle_deg", std::to_string(model.material.lattice.orientation * 180.0 / M_PI));
    if (columns.field)
      atoms.info.emplace_back("valley", "B_K_T is the pseudo-magnetic field of valley K; valley K' has -B");
    return atoms;
  }

  LatticeExportReport export_strained_lattice(const SheetSystem &system, const Vector &state, double load_factor,
                                              const LatticeExportSettings &settings, const std::string &base_path)
  {
    LatticeExportReport report;
    const AtomTable     atoms = strained_lattice_atoms(system, state, load_factor, settings, report);
    if (settings.write_xyz)
      report.files.push_back(base_path + ".xyz");
    if (settings.write_cif)
      report.files.push_back(base_path + ".cif");
    if (Utilities::MPI::this_mpi_process(system.communicator()) == 0)
      {
        if (settings.write_xyz)
          write_extended_xyz(base_path + ".xyz", atoms);
        if (settings.write_cif)
          write_cif(base_path + ".cif", atoms,
                    "strained " + system.model().material.name + " monolayer written by nappe (P 1; Angstrom)");
      }
    MPI_Barrier(system.communicator());
    return report;
  }
} // namespace nappe

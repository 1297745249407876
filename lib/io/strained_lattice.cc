#include <nappe/analysis/point_jets.h>
#include <nappe/analysis/sheet_quantities.h>
#include <nappe/base/units.h>
#include <nappe/io/strained_lattice.h>

#include <algorithm>
#include <cmath>
#include <iomanip>
#include <sstream>

namespace nappe
{
  using namespace dealii;

  namespace
  {
    // In nm to 8 digits; a round-off remainder of a zero component (below 1e-6 nm) is printed as 0.
    std::string nm(double length)
    {
      const double       in_nm = length / units::nanometer;
      std::ostringstream s;
      s.precision(8);
      s << (std::abs(in_nm) < 1e-6 ? 0.0 : in_nm);
      return s.str();
    }

    /**
     * The per-atom columns: the strain components and the electronic quantities of the quantity table
     * (sheet_quantities.h) that apply to the model, named and scaled as in the fields.
     */
    struct Columns
    {
      std::vector<const SheetQuantity *> quantities;
      std::vector<std::string>           names;

      explicit Columns(const SheetModel &model)
      {
        static const char *const wanted[] = {"strain_xx", "strain_yy", "strain_xy", "pseudo_vector_potential_x",
                                             "pseudo_vector_potential_y", "pseudo_magnetic_field_K",
                                             "deformation_potential", "gap_shift"};
        for (const char *name : wanted)
          for (const SheetQuantity *q : quantities_for(model))
            if (q->name == name && q->field)
              {
                quantities.push_back(q);
                names.push_back(q->name + q->unit_suffix());
              }
      }

      bool has(const std::string &name) const
      {
        return std::find(names.begin(), names.end(), name) != names.end();
      }

      void append(const PointState &point, std::vector<double> &out) const
      {
        for (const SheetQuantity *q : quantities)
          out.push_back(q->reported(point));
      }
    };

    LatticeSites make_sites(const SheetSystem &system, const LatticeExportSettings &settings,
                            LatticeExportReport &report)
    {
      const MonolayerLattice &lattice = system.model().material.lattice;
      const MPI_Comm          comm    = system.communicator();
      const CommensurateCell  cell    = check_lattice_export(system.model().material, system.domain(), settings);
      if (settings.region == LatticeExportSettings::Region::polygon)
        return region_sites(lattice, settings.polygon, comm);
      report.periodic  = true;
      report.supercell = cell;
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

  CommensurateCell check_lattice_export(const SheetMaterial &material, const SheetDomain &domain,
                                        const LatticeExportSettings &settings)
  {
    const MonolayerLattice &lattice = material.lattice;
    AssertThrow(lattice.defined(),
                ExcMessage("Electronics/Lattice export: the sheet material '" + material.name +
                           "' has no crystal lattice; choose a catalogue monolayer in Sheet/Material."));
    if (settings.region != LatticeExportSettings::Region::cell)
      return {};
    AssertThrow(domain.periodic &&
                  (domain.shape == SheetDomain::Shape::rectangle || domain.shape == SheetDomain::Shape::rhombus),
                ExcMessage("Electronics/Lattice export/Region = cell needs a periodic rectangle or rhombus "
                           "(Domain/Shape, Domain/Periodic); for other sheets give a box or polygon region."));
    const auto [L1, L2] = domain.lattice_vectors();
    const auto cell     = nearest_commensurate_cell(lattice, L1, L2);
    AssertThrow(cell.n_primitive_cells() > 0,
                ExcMessage("Electronics/Lattice export: the periodic cell is too small for the lattice of " +
                           material.name + " (a = " + nm(lattice.lattice_constant) + " nm)."));
    if (cell.largest_residual_strain() > settings.largest_residual_strain)
      {
        const auto [a1, a2] = lattice.primitive_vectors();
        const auto S1 = double(cell.n[0][0]) * a1 + double(cell.n[0][1]) * a2;
        const auto S2 = double(cell.n[1][0]) * a1 + double(cell.n[1][1]) * a2;
        std::ostringstream message;
        message << "Electronics/Lattice export/Largest residual strain: the periodic cell is not commensurate "
                << "with the lattice of " << material.name << " at the zigzag angle "
                << lattice.orientation * 180 / M_PI << " deg; the nearest supercell would strain it by "
                << cell.largest_residual_strain() << " (limit " << settings.largest_residual_strain
                << "). A commensurate cell has the vectors (" << nm(S1[0]) << ", " << nm(S1[1]) << ") nm and ("
                << nm(S2[0]) << ", " << nm(S2[1]) << ") nm; change the Domain lengths or raise the limit.";
        AssertThrow(false, ExcMessage(message.str()));
      }
    return cell;
  }

  AtomTable strained_lattice_atoms(const SheetSystem &system, const Vector &state, double load_factor,
                                   const LatticeExportSettings &settings, LatticeExportReport &report)
  {
    const SheetModel &model = system.model();
    const MPI_Comm     comm  = system.communicator();
    const LatticeSites sites = make_sites(system, settings, report);
    std::vector<bool>  found;
    const auto         jets  = evaluate_point_jets(system, state, sites.positions, found);
    const auto         basis = model.material.lattice.basis();
    const Columns      columns(model);
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
        columns.append(make_point_state(model, LoadLevel(load_factor), X, {j.values.begin(), j.values.end()},
                                        {j.gradients.begin(), j.gradients.end()},
                                        {j.hessians.begin(), j.hessians.end()}),
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
    if (columns.has("pseudo_magnetic_field_K_T"))
      atoms.info.emplace_back("valley", "pseudo_magnetic_field_K_T and pseudo_vector_potential_* are those of valley "
                                        "K; valley K' has the opposite sign");
    return atoms;
  }

  std::string describe_lattice_export(const LatticeExportReport &r)
  {
    std::ostringstream out;
    out << "Strained lattice: " << r.n_atoms << " atoms";
    if (r.periodic)
      out << " on the commensurate supercell (residual strain " << std::setprecision(2)
          << 100.0 * r.supercell.largest_residual_strain() << " %)" << std::setprecision(6);
    else
      out << " in the region (a flake)";
    if (r.n_off_sheet > 0)
      out << ", " << r.n_off_sheet << " region atoms off the sheet left out";
    out << ":";
    for (const auto &f : r.files)
      out << " " << f;
    return out.str();
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

#include <deal.II/base/mpi.h>
#include <deal.II/base/quadrature_lib.h>
#include <deal.II/fe/fe_values.h>

#include <nappe/analysis/conformation.h>
#include <nappe/analysis/sheet_measures.h>
#include <nappe/physics/fvk_kinematics.h>

#include <algorithm>
#include <map>
#include <numeric>

namespace nappe
{
  using namespace dealii;

  namespace
  {
    /// What one cell contributes; gathered on rank 0 to find connected suspended regions.
    struct CellRecord
    {
      types::global_cell_index             index = 0;
      std::vector<types::global_cell_index> neighbors;
      double                               suspended_area = 0.0;
      double                               area           = 0.0;
      double                               max_gap        = 0.0;
      Point<2>                             max_gap_location;

      template <class Archive>
      void serialize(Archive &ar, const unsigned int)
      {
        ar &index &neighbors &suspended_area &area &max_gap &max_gap_location;
      }
    };

    std::size_t find_root(std::vector<std::size_t> &parent, std::size_t i)
    {
      while (parent[i] != i)
        i = parent[i] = parent[parent[i]];
      return i;
    }

    std::vector<SuspendedRegion> connected_regions(const std::vector<CellRecord> &cells)
    {
      std::map<types::global_cell_index, std::size_t> position;
      for (std::size_t i = 0; i < cells.size(); ++i)
        position[cells[i].index] = i;
      auto suspended = [&](const CellRecord &c) { return c.suspended_area > 0.5 * c.area; };
      std::vector<std::size_t> parent(cells.size());
      std::iota(parent.begin(), parent.end(), 0);
      for (std::size_t i = 0; i < cells.size(); ++i)
        if (suspended(cells[i]))
          for (const auto n : cells[i].neighbors)
            if (const auto j = position.at(n); suspended(cells[j]))
              parent[find_root(parent, i)] = find_root(parent, j);
      std::map<std::size_t, SuspendedRegion> regions;
      for (std::size_t i = 0; i < cells.size(); ++i)
        if (suspended(cells[i]))
          {
            SuspendedRegion &r = regions[find_root(parent, i)];
            r.area += cells[i].suspended_area;
            if (cells[i].max_gap > r.max_gap)
              {
                r.max_gap          = cells[i].max_gap;
                r.max_gap_location = cells[i].max_gap_location;
              }
          }
      std::vector<SuspendedRegion> out;
      for (const auto &[root, r] : regions)
        out.push_back(r);
      std::sort(out.begin(), out.end(), [](const auto &a, const auto &b) { return a.area > b.area; });
      return out;
    }

    StrainHistogram make_histogram(const std::string &name, const std::vector<std::pair<double, double>> &samples,
                                   unsigned int bins, MPI_Comm comm)
    {
      double lo = std::numeric_limits<double>::max(), hi = -lo;
      for (const auto &[value, area] : samples)
        {
          lo = std::min(lo, value);
          hi = std::max(hi, value);
        }
      lo = Utilities::MPI::min(lo, comm);
      hi = Utilities::MPI::max(hi, comm);
      if (hi <= lo)
        hi = lo + 1e-12;
      StrainHistogram h{name, {}, std::vector<double>(bins, 0.0)};
      for (unsigned int b = 0; b <= bins; ++b)
        h.bin_edges.push_back(lo + (hi - lo) * b / bins);
      for (const auto &[value, area] : samples)
        h.area[std::min<unsigned int>(bins - 1, static_cast<unsigned int>((value - lo) / (hi - lo) * bins))] += area;
      Utilities::MPI::sum(h.area, comm, h.area);
      return h;
    }
  } // namespace

  ConformationMeasures measure_conformation(const SheetSystem &system, const Vector &state, double load_factor,
                                            const AdhesionPotential &adhesion, unsigned int histogram_bins)
  {
    const QGauss<2> quadrature(system.model().discretization.degree + 1);
    FEValues<2>     fv(system.mapping(), system.finite_element(), quadrature,
                   update_values | update_gradients | update_quadrature_points | update_JxW_values);
    const FEValuesExtractors::Vector in_plane(0);
    const FEValuesExtractors::Scalar deflection(2);
    const unsigned int               n_q = quadrature.size();
    std::vector<double>              w(n_q);
    std::vector<Tensor<1, 2>>        grad_w(n_q);
    std::vector<Tensor<2, 2>>        grad_u(n_q);

    ConformationMeasures                     m;
    std::vector<CellRecord>                  records;
    std::vector<std::pair<double, double>>   principal, areal;
    for (const auto &cell : system.dof_handler().active_cell_iterators())
      {
        if (!cell->is_locally_owned())
          continue;
        fv.reinit(cell);
        fv[deflection].get_function_values(state, w);
        fv[deflection].get_function_gradients(state, grad_w);
        fv[in_plane].get_function_gradients(state, grad_u);
        CellRecord rec;
        rec.index = cell->global_active_cell_index();
        for (const unsigned int f : cell->face_indices())
          if (!cell->at_boundary(f) || cell->has_periodic_neighbor(f))
            rec.neighbors.push_back(cell->neighbor_or_periodic_neighbor(f)->global_active_cell_index());
        for (unsigned int q = 0; q < n_q; ++q)
          {
            const double g  = adhesion.gap(fv.quadrature_point(q), w[q]);
            const double dA = fv.JxW(q);
            rec.area += dA;
            if (adhesion.conformed(g))
              m.conformed_area += dA;
            else
              rec.suspended_area += dA;
            if (g > rec.max_gap || q == 0)
              {
                rec.max_gap          = g;
                rec.max_gap_location = fv.quadrature_point(q);
              }
            const auto strain   = membrane_strain(system.model(), load_factor, grad_u[q], grad_w[q]);
            const auto [e1, e2] = principal_values(strain);
            principal.emplace_back(e1, dA);
            areal.emplace_back(e1 + e2, dA);
          }
        m.sheet_area += rec.area;
        records.push_back(std::move(rec));
      }
    const MPI_Comm comm = system.communicator();
    m.conformed_area    = Utilities::MPI::sum(m.conformed_area, comm);
    m.sheet_area        = Utilities::MPI::sum(m.sheet_area, comm);
    m.conformed_fraction = m.conformed_area / m.sheet_area;

    const auto gathered = Utilities::MPI::gather(comm, records, 0);
    if (Utilities::MPI::this_mpi_process(comm) == 0)
      {
        std::vector<CellRecord> all;
        for (const auto &part : gathered)
          all.insert(all.end(), part.begin(), part.end());
        m.suspended_regions = connected_regions(all);
        const auto top = std::max_element(all.begin(), all.end(),
                                          [](const auto &a, const auto &b) { return a.max_gap < b.max_gap; });
        m.max_gap          = top->max_gap;
        m.max_gap_location = top->max_gap_location;
      }
    m.suspended_regions = Utilities::MPI::broadcast(comm, m.suspended_regions, 0);
    m.max_gap           = Utilities::MPI::broadcast(comm, m.max_gap, 0);
    m.max_gap_location  = Utilities::MPI::broadcast(comm, m.max_gap_location, 0);
    m.principal_strain_histogram = make_histogram("max principal strain", principal, histogram_bins, comm);
    m.areal_strain_histogram     = make_histogram("areal strain", areal, histogram_bins, comm);
    return m;
  }
} // namespace nappe

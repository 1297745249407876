#include <deal.II/base/mpi.h>
#include <deal.II/base/quadrature_lib.h>
#include <deal.II/fe/fe_values.h>

#include <nappe/analysis/conformation.h>
#include <nappe/analysis/sheet_quantities.h>

#include <algorithm>
#include <array>
#include <limits>
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

    /// The floor (s below the middle of its range) and the contact over it.
    void split_floor_contact(const std::vector<std::array<double, 3>> &contact, ConformationMeasures &m,
                             MPI_Comm comm)
    {
      double low = std::numeric_limits<double>::max(), high = -low;
      for (const auto &[s, conformed, dA] : contact)
        {
          low  = std::min(low, s);
          high = std::max(high, s);
        }
      low               = Utilities::MPI::min(low, comm);
      high              = Utilities::MPI::max(high, comm);
      const double  mid = 0.5 * (low + high);
      const bool    flat = high - low <= 1e-12 * std::max(std::abs(high), 1e-9);
      for (const auto &[s, conformed, dA] : contact)
        if (flat || s < mid)
          {
            m.floor_area += dA;
            m.conformed_floor_area += conformed * dA;
          }
      m.floor_area           = Utilities::MPI::sum(m.floor_area, comm);
      m.conformed_floor_area = Utilities::MPI::sum(m.conformed_floor_area, comm);
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

  ConformationMeasures measure_conformation(const SheetSystem &system, const Vector &state, const LoadLevel &level,
                                            unsigned int histogram_bins)
  {
    const AdhesionPotential *adhesion = system.model().adhesion();
    AssertThrow(adhesion, ExcMessage("Conformation measures need an adhesion substrate."));
    std::vector<const SheetQuantity *> histogrammed;
    for (const SheetQuantity *q : quantities_for(system.model()))
      if (!q->histogram_label.empty())
        histogrammed.push_back(q);

    ConformationMeasures                                 m;
    std::vector<CellRecord>                              records;
    std::vector<std::array<double, 3>>                   contact; ///< (s, conformed, dA) at every point
    std::vector<std::vector<std::pair<double, double>>> samples(histogrammed.size());
    for_each_cell(system, state, level, [&](const CellPoints &cp) {
      const auto &cell = cp.cell;
      CellRecord  rec;
      rec.index = cell->global_active_cell_index();
      for (const unsigned int f : cell->face_indices())
        {
          const bool periodic = cell->at_boundary(f);
          if (periodic && !cell->has_periodic_neighbor(f))
            continue;
          const auto neighbor = cell->neighbor_or_periodic_neighbor(f);
          if (!neighbor->has_children())
            rec.neighbors.push_back(neighbor->global_active_cell_index());
          else // an adapted mesh: the finer cells along this edge
            for (unsigned int sf = 0; sf < cell->face(f)->n_children(); ++sf)
              rec.neighbors.push_back((periodic ? cell->periodic_neighbor_child_on_subface(f, sf)
                                                : cell->neighbor_child_on_subface(f, sf))
                                        ->global_active_cell_index());
        }
      for (std::size_t q = 0; q < cp.points.size(); ++q)
        {
          const PointState &p  = cp.points[q];
          const double      g  = adhesion->gap(p.x, p.w);
          const double      dA = cp.weights[q];
          rec.area += dA;
          const bool        conformed = adhesion->conformed(g);
          if (conformed)
            m.conformed_area += dA;
          else
            rec.suspended_area += dA;
          contact.push_back({adhesion->topography().height(p.x), conformed ? 1.0 : 0.0, dA});
          if (g > rec.max_gap || q == 0)
            {
              rec.max_gap          = g;
              rec.max_gap_location = p.x;
            }
          for (std::size_t h = 0; h < histogrammed.size(); ++h)
            samples[h].emplace_back(histogrammed[h]->evaluate(p), dA);
        }
      m.sheet_area += rec.area;
      records.push_back(std::move(rec));
    });
    const MPI_Comm comm = system.communicator();
    m.conformed_area    = Utilities::MPI::sum(m.conformed_area, comm);
    m.sheet_area        = Utilities::MPI::sum(m.sheet_area, comm);
    m.conformed_fraction = m.conformed_area / m.sheet_area;
    split_floor_contact(contact, m, comm);

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
    for (std::size_t h = 0; h < histogrammed.size(); ++h)
      m.histograms.push_back(make_histogram(histogrammed[h]->histogram_label, samples[h], histogram_bins, comm));
    return m;
  }

  double graded_conformed_fraction(const SheetSystem &system, const Vector &state)
  {
    const AdhesionPotential *adhesion = system.model().adhesion();
    AssertThrow(adhesion, ExcMessage("Conformation measures need an adhesion substrate."));
    system.require_ghosted(state);
    const double peak = adhesion->law().peak_traction_gap(), ramp = adhesion->law().equilibrium_gap();
    // Only the deflection enters: values alone, not the full point states of for_each_cell (this
    // measure is taken at every corrector step of an adhesion path).
    const QGauss<2>    quadrature(system.model().discretization.degree + 1);
    FEValues<2>        fv(system.mapping(), system.finite_element(), quadrature,
                   update_values | update_quadrature_points | update_JxW_values);
    const FEValuesExtractors::Scalar deflection(2);
    std::vector<double>              w(quadrature.size());
    double                           graded = 0.0, area = 0.0;
    for (const auto &cell : system.dof_handler().active_cell_iterators())
      {
        if (!cell->is_locally_owned())
          continue;
        fv.reinit(cell);
        fv[deflection].get_function_values(state, w);
        for (unsigned int q = 0; q < w.size(); ++q)
          {
            const double g = adhesion->gap(fv.quadrature_point(q), w[q]);
            graded += fv.JxW(q) * std::clamp((peak + ramp - g) / ramp, 0.0, 1.0);
            area += fv.JxW(q);
          }
      }
    const MPI_Comm comm = system.communicator();
    return Utilities::MPI::sum(graded, comm) / Utilities::MPI::sum(area, comm);
  }
} // namespace nappe

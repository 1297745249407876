#include <deal.II/base/mpi.h>

#include <nappe/analysis/sheet_measures.h>

#include <cmath>
#include <limits>

namespace nappe
{
  using namespace dealii;

  namespace
  {
    /// The number compared to find the extreme: larger is more extreme.
    double ranking(Extreme kind, double value)
    {
      switch (kind)
        {
          case Extreme::smallest: return -value;
          case Extreme::largest_magnitude: return std::abs(value);
          default: return value;
        }
    }

    /// The extreme over all ranks: the rank with the largest key (lowest rank on ties) provides it.
    LocatedValue agree(const LocatedValue &local, double key, MPI_Comm comm)
    {
      const double       global_key = Utilities::MPI::max(key, comm);
      const unsigned int rank       = Utilities::MPI::this_mpi_process(comm);
      const unsigned int owner =
        Utilities::MPI::min(key == global_key ? rank : Utilities::MPI::n_mpi_processes(comm), comm);
      double data[3] = {0, 0, 0};
      if (rank == owner)
        {
          data[0] = local.value;
          data[1] = local.location[0];
          data[2] = local.location[1];
        }
      double sum[3];
      Utilities::MPI::sum(ArrayView<const double>(data, 3), comm, ArrayView<double>(sum, 3));
      return {sum[0], Point<2>(sum[1], sum[2])};
    }
  } // namespace

  const LocatedValue &SheetMeasures::at(const std::string &key) const
  {
    for (const auto &e : extremes)
      if (e.quantity->extreme_key == key)
        return e.extreme;
    AssertThrow(false, ExcMessage("No extreme '" + key + "' was measured for this sheet."));
    return extremes.front().extreme;
  }

  SheetMeasures measure_sheet(const SheetSystem &system, const Vector &state, const LoadLevel &level)
  {
    SheetMeasures m;
    for (const SheetQuantity *q : quantities_for(system.model()))
      if (q->extreme != Extreme::none)
        m.extremes.push_back({q, {}});
    std::vector<double> key(m.extremes.size(), -std::numeric_limits<double>::max());
    for_each_cell(system, state, level, [&](const CellPoints &cell) {
      for (const PointState &p : cell.points)
        for (std::size_t k = 0; k < m.extremes.size(); ++k)
          {
            const double value = m.extremes[k].quantity->evaluate(p);
            const double rank  = ranking(m.extremes[k].quantity->extreme, value);
            if (rank > key[k]) // ties keep the first point met
              {
                key[k]                 = rank;
                m.extremes[k].extreme = {value, p.x};
              }
          }
    });
    for (std::size_t k = 0; k < m.extremes.size(); ++k)
      m.extremes[k].extreme = agree(m.extremes[k].extreme, key[k], system.communicator());
    return m;
  }
} // namespace nappe

#include <deal.II/base/mpi.h>
#include <deal.II/base/quadrature.h>
#include <deal.II/fe/fe_values.h>

#include <nappe/analysis/grid_sampling.h>

#include <algorithm>
#include <cmath>
#include <map>

namespace nappe
{
  using namespace dealii;

  namespace
  {
    /// The grid points (index, unit-cell point) inside one cell.
    std::vector<std::pair<unsigned int, Point<2>>> points_in_cell(const Mapping<2> &mapping,
                                                                  const DoFHandler<2>::active_cell_iterator &cell,
                                                                  const Point<2> &lower, const Tensor<1, 2> &step,
                                                                  unsigned int nx, unsigned int ny)
    {
      const BoundingBox<2> box = cell->bounding_box();
      auto range = [&](unsigned int d, unsigned int n) {
        const double first = std::ceil((box.lower_bound(d) - lower[d]) / step[d] - 1e-9);
        const double last  = std::floor((box.upper_bound(d) - lower[d]) / step[d] + 1e-9);
        return std::pair<int, int>(std::max(0, int(first)), std::min(int(n) - 1, int(last)));
      };
      const auto [i0, i1] = range(0, nx);
      const auto [j0, j1] = range(1, ny);
      std::vector<std::pair<unsigned int, Point<2>>> found;
      for (int j = j0; j <= j1; ++j)
        for (int i = i0; i <= i1; ++i)
          {
            const Point<2> p(lower[0] + i * step[0], lower[1] + j * step[1]);
            const Point<2> unit = mapping.transform_real_to_unit_cell(cell, p);
            if (GeometryInfo<2>::is_inside_unit_cell(unit, 1e-10))
              found.emplace_back(j * nx + i, GeometryInfo<2>::project_to_unit_cell(unit));
          }
      return found;
    }
  } // namespace

  std::pair<unsigned int, unsigned int> map_grid_size(const SheetSystem &system, unsigned int n)
  {
    const auto [lower, upper] = system.domain().bounding_box();
    const double lx = upper[0] - lower[0], ly = upper[1] - lower[1];
    const auto   other = [&](double ratio) { return std::max(3u, static_cast<unsigned int>(std::lround(n * ratio))); };
    return lx >= ly ? std::pair(n, other(ly / lx)) : std::pair(other(lx / ly), n);
  }

  GridSamples sample_on_grid(const SheetSystem &system, const Vector &state, const LoadLevel &level, unsigned int nx,
                             unsigned int ny)
  {
    system.require_ghosted(state);
    GridSamples samples;
    for (const SheetQuantity *q : quantities_for(system.model()))
      if (q->field)
        samples.quantities.push_back(q);
    const auto [lower, upper] = system.domain().bounding_box();
    Tensor<1, 2> step;
    step[0] = (upper[0] - lower[0]) / std::max(1u, nx - 1);
    step[1] = (upper[1] - lower[1]) / std::max(1u, ny - 1);

    std::map<unsigned int, std::vector<double>> mine; // grid index → values
    std::vector<double>                         point_values(3);
    for (const auto &cell : system.dof_handler().active_cell_iterators())
      {
        if (!cell->is_locally_owned())
          continue;
        const auto found = points_in_cell(system.mapping(), cell, lower, step, nx, ny);
        if (found.empty())
          continue;
        std::vector<Point<2>> unit;
        for (const auto &f : found)
          unit.push_back(f.second);
        FEValues<2> fv(system.mapping(), system.finite_element(), Quadrature<2>(unit),
                       update_values | update_gradients | update_hessians | update_quadrature_points);
        fv.reinit(cell);
        std::vector<dealii::Vector<double>>    values(unit.size(), dealii::Vector<double>(3));
        std::vector<std::vector<Tensor<1, 2>>> gradients(unit.size(), std::vector<Tensor<1, 2>>(3));
        std::vector<std::vector<Tensor<2, 2>>> hessians(unit.size(), std::vector<Tensor<2, 2>>(3));
        fv.get_function_values(state, values);
        fv.get_function_gradients(state, gradients);
        fv.get_function_hessians(state, hessians);
        for (std::size_t k = 0; k < found.size(); ++k)
          {
            if (mine.count(found[k].first))
              continue;
            for (unsigned int c = 0; c < 3; ++c)
              point_values[c] = values[k](c);
            const PointState p =
              make_point_state(system.model(), level, fv.quadrature_point(k), point_values, gradients[k], hessians[k]);
            std::vector<double> row;
            for (const SheetQuantity *q : samples.quantities)
              row.push_back(q->reported(p));
            mine.emplace(found[k].first, std::move(row));
          }
      }
    const auto gathered = Utilities::MPI::gather(system.communicator(), mine, 0);
    if (Utilities::MPI::this_mpi_process(system.communicator()) != 0)
      return samples;
    std::map<unsigned int, std::vector<double>> all;
    for (const auto &part : gathered)
      all.insert(part.begin(), part.end()); // the lowest rank's evaluation of a shared point is kept
    for (auto &[index, row] : all)
      {
        samples.points.emplace_back(lower[0] + (index % nx) * step[0], lower[1] + (index / nx) * step[1]);
        samples.values.push_back(std::move(row));
      }
    return samples;
  }
} // namespace nappe

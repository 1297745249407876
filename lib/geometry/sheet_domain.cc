#include <deal.II/grid/grid_generator.h>
#include <deal.II/grid/grid_tools.h>
#include <deal.II/grid/manifold_lib.h>

#include <nappe/geometry/sheet_domain.h>

#include <cmath>

namespace nappe
{
  using namespace dealii;

  std::pair<Tensor<1, 2>, Tensor<1, 2>> SheetDomain::lattice_vectors() const
  {
    Tensor<1, 2> a1, a2;
    if (shape == Shape::rhombus)
      {
        a1[0] = length_x;
        a2[0] = 0.5 * length_x;
        a2[1] = 0.5 * std::sqrt(3.0) * length_x;
      }
    else
      {
        a1[0] = length_x;
        a2[1] = length_y;
      }
    return {a1, a2};
  }

  double SheetDomain::area() const
  {
    if (shape == Shape::disk)
      return M_PI * radius * radius;
    const auto [a1, a2] = lattice_vectors();
    return std::abs(a1[0] * a2[1] - a1[1] * a2[0]);
  }

  Point<2> SheetDomain::center() const
  {
    if (shape == Shape::disk)
      return Point<2>();
    const auto [a1, a2] = lattice_vectors();
    return Point<2>(0.5 * (a1 + a2));
  }

  SheetDomain::Shape SheetDomain::parse_shape(const std::string &name)
  {
    if (name == "rectangle")
      return Shape::rectangle;
    if (name == "rhombus")
      return Shape::rhombus;
    if (name == "disk")
      return Shape::disk;
    AssertThrow(false, ExcMessage("Domain shape '" + name + "' is unknown; expected rectangle, rhombus or disk."));
    return Shape::rectangle;
  }

  namespace
  {
    void make_coarse_mesh(parallel::distributed::Triangulation<2> &tria, const SheetDomain &d)
    {
      switch (d.shape)
        {
          case SheetDomain::Shape::rectangle:
            GridGenerator::subdivided_hyper_rectangle(tria, {d.coarse_cells_x, d.coarse_cells_y}, Point<2>(),
                                                      Point<2>(d.length_x, d.length_y), true);
            break;
          case SheetDomain::Shape::rhombus:
            {
              const auto [a1, a2] = d.lattice_vectors();
              GridGenerator::subdivided_parallelepiped<2, 2>(tria, Point<2>(), {{a1, a2}},
                                                             {d.coarse_cells_x, d.coarse_cells_y}, true);
              break;
            }
          case SheetDomain::Shape::disk:
            GridGenerator::hyper_ball_balanced(tria, Point<2>(), d.radius);
            break;
        }
    }
  } // namespace

  std::vector<GridTools::PeriodicFacePair<parallel::distributed::Triangulation<2>::cell_iterator>>
  collect_periodic_pairs(parallel::distributed::Triangulation<2> &tria, const SheetDomain &domain)
  {
    std::vector<GridTools::PeriodicFacePair<parallel::distributed::Triangulation<2>::cell_iterator>> pairs;
    if (!domain.periodic)
      return pairs;
    const auto [a1, a2] = domain.lattice_vectors();
    GridTools::collect_periodic_faces(tria, 0, 1, 0, pairs, a1);
    GridTools::collect_periodic_faces(tria, 2, 3, 1, pairs, a2);
    return pairs;
  }

  void make_sheet_mesh(parallel::distributed::Triangulation<2> &tria, const SheetDomain &domain)
  {
    AssertThrow(!(domain.periodic && domain.shape == SheetDomain::Shape::disk),
                ExcMessage("A disk cannot be periodic; use a rectangle or a rhombus as the unit cell."));
    AssertThrow(domain.length_x > 0 && domain.length_y > 0 && domain.radius > 0,
                ExcMessage("Domain sizes must be positive."));
    make_coarse_mesh(tria, domain);
    if (domain.periodic)
      {
        const auto pairs = collect_periodic_pairs(tria, domain);
        AssertThrow(pairs.size() == domain.coarse_cells_x + domain.coarse_cells_y,
                    ExcMessage("Periodic faces of the unit cell could not be matched."));
        tria.add_periodicity(pairs);
      }
    tria.refine_global(domain.global_refinements);
  }
} // namespace nappe

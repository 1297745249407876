#include <deal.II/grid/grid_generator.h>
#include <deal.II/grid/grid_in.h>
#include <deal.II/grid/grid_tools.h>
#include <deal.II/grid/manifold_lib.h>
#include <deal.II/grid/tria.h>

#include <nappe/base/message_number.h>
#include <nappe/geometry/gmsh_file_check.h>
#include <nappe/geometry/sheet_domain.h>

#include <algorithm>
#include <cctype>
#include <cmath>
#include <filesystem>
#include <fstream>
#include <limits>
#include <map>
#include <memory>
#include <mutex>
#include <set>
#include <sstream>

namespace nappe
{
  using namespace dealii;

  namespace
  {
    /// What the geometric queries need to know about a mesh file, in metres.
    struct MeshFileGeometry
    {
      double   area = 0.0;
      Point<2> centroid;
      Point<2> lower, upper;
      /// Per boundary id: number of faces, Σ length·midpoint and Σ length.
      struct Edge
      {
        unsigned int n_faces = 0;
        Tensor<1, 2> weighted_midpoints;
        double       length = 0.0;
      };
      std::map<types::boundary_id, Edge> edges;
    };

    /// deal.II's description of an exception on one line: not its source location and stack trace.
    std::string one_line_description(const ExceptionBase &e)
    {
      std::ostringstream description;
      e.print_info(description);
      std::string text;
      for (const char c : description.str())
        if (!std::isspace(static_cast<unsigned char>(c)))
          text += c;
        else if (!text.empty() && text.back() != ' ')
          text += ' ';
      while (!text.empty() && text.back() == ' ')
        text.pop_back();
      return text;
    }

    /// Reads @p d's mesh file into @p tria (serial, empty) and scales it; throws naming the file.
    void read_mesh_file(Triangulation<2> &tria, const SheetDomain &d)
    {
      const std::string &file = d.mesh_file;
      AssertThrow(!file.empty(), ExcMessage("Domain shape 'mesh file' needs a mesh file name (Domain/Mesh file)."));
      AssertThrow(d.mesh_scale > 0.0, ExcMessage("The mesh scale of '" + file + "' must be positive; got " +
                                                 message_number(d.mesh_scale) + "."));
      // GridIn trusts its input; the check names the line of anything it could misread.
      check_gmsh_file(file);
      std::ifstream in(file);
      AssertThrow(in, ExcMessage("cannot open Gmsh mesh file '" + file + "' for reading"));
      GridIn<2> grid_in;
      grid_in.attach_triangulation(tria);
      try
        {
          grid_in.read_msh(in);
        }
      catch (const ExceptionBase &e)
        {
          AssertThrow(false, ExcMessage("Gmsh mesh file '" + file + "': deal.II cannot build a mesh from it: " +
                                        one_line_description(e)));
        }
      AssertThrow(tria.n_active_cells() > 0, ExcMessage("The mesh file '" + file + "' contains no cells."));
      for (const auto &cell : tria.active_cell_iterators())
        AssertThrow(cell->reference_cell() == ReferenceCells::Quadrilateral,
                    ExcMessage("The mesh file '" + file + "' contains a cell that is not a quadrilateral; nappe's "
                               "elements need an all-quadrilateral mesh (Gmsh: Recombine Surface, "
                               "Mesh.SubdivisionAlgorithm = 1)."));
      GridTools::scale(d.mesh_scale, tria);
    }

    MeshFileGeometry compute_geometry(const SheetDomain &d)
    {
      Triangulation<2> tria;
      read_mesh_file(tria, d);
      MeshFileGeometry g;
      g.lower = Point<2>(std::numeric_limits<double>::max(), std::numeric_limits<double>::max());
      g.upper = Point<2>(std::numeric_limits<double>::lowest(), std::numeric_limits<double>::lowest());
      Tensor<1, 2> moment;
      for (const auto &cell : tria.active_cell_iterators())
        {
          g.area += cell->measure();
          moment += cell->measure() * cell->center();
          for (const unsigned int v : cell->vertex_indices())
            for (unsigned int c = 0; c < 2; ++c)
              {
                g.lower[c] = std::min(g.lower[c], cell->vertex(v)[c]);
                g.upper[c] = std::max(g.upper[c], cell->vertex(v)[c]);
              }
          for (const unsigned int f : cell->face_indices())
            if (cell->at_boundary(f))
              {
                auto &edge = g.edges[cell->face(f)->boundary_id()];
                ++edge.n_faces;
                edge.weighted_midpoints += cell->face(f)->measure() * cell->face(f)->center();
                edge.length += cell->face(f)->measure();
              }
        }
      g.centroid = Point<2>(moment / g.area);
      return g;
    }

    /// The geometry of @p d's mesh file, read once per (path, scale, modification time).
    const MeshFileGeometry &mesh_geometry(const SheetDomain &d)
    {
      static std::mutex                                                          mutex;
      static std::map<std::string, std::shared_ptr<const MeshFileGeometry>> cache;
      std::ostringstream key;
      key.precision(17);
      key << d.mesh_file << '|' << d.mesh_scale << '|';
      std::error_code ec;
      const auto      time = std::filesystem::last_write_time(d.mesh_file, ec);
      if (!ec)
        key << time.time_since_epoch().count();
      const std::lock_guard<std::mutex> lock(mutex);
      auto                              &entry = cache[key.str()];
      if (!entry)
        {
          try
            {
              entry = std::make_shared<const MeshFileGeometry>(compute_geometry(d));
            }
          catch (...)
            {
              cache.erase(key.str());
              throw;
            }
        }
      return *entry;
    }

    bool has_cell_edges(const MeshFileGeometry &g)
    {
      for (types::boundary_id id = 0; id < 4; ++id)
        if (g.edges.count(id) == 0)
          return false;
      return true;
    }
  } // namespace

  std::pair<Tensor<1, 2>, Tensor<1, 2>> SheetDomain::lattice_vectors() const
  {
    Tensor<1, 2> a1, a2;
    if (shape == Shape::mesh_file)
      {
        const MeshFileGeometry &g = mesh_geometry(*this);
        if (periodic || has_cell_edges(g))
          {
            AssertThrow(has_cell_edges(g), ExcMessage("The periodic mesh file '" + mesh_file +
                                                      "' needs boundary ids 0, 1, 2 and 3 on its four edges."));
            auto c = [&](types::boundary_id id) {
              const auto &e = g.edges.at(id);
              return e.weighted_midpoints / e.length;
            };
            return {c(1) - c(0), c(3) - c(2)};
          }
        a1[0] = g.upper[0] - g.lower[0];
        a2[1] = g.upper[1] - g.lower[1];
      }
    else if (shape == Shape::rhombus)
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
    if (shape == Shape::mesh_file)
      return mesh_geometry(*this).area;
    if (shape == Shape::disk)
      return M_PI * radius * radius;
    const auto [a1, a2] = lattice_vectors();
    return std::abs(a1[0] * a2[1] - a1[1] * a2[0]);
  }

  Point<2> SheetDomain::center() const
  {
    if (shape == Shape::mesh_file)
      return mesh_geometry(*this).centroid;
    if (shape == Shape::disk)
      return Point<2>();
    const auto [a1, a2] = lattice_vectors();
    return Point<2>(0.5 * (a1 + a2));
  }

  std::pair<Point<2>, Point<2>> SheetDomain::bounding_box() const
  {
    switch (shape)
      {
        case Shape::mesh_file:
          {
            const MeshFileGeometry &g = mesh_geometry(*this);
            return {g.lower, g.upper};
          }
        case Shape::disk:
          return {Point<2>(-radius, -radius), Point<2>(radius, radius)};
        case Shape::rectangle:
        case Shape::rhombus:
          break;
      }
    const auto [a1, a2] = lattice_vectors();
    Point<2> lower, upper;
    for (const Tensor<1, 2> &corner : {a1, a2, a1 + a2})
      for (unsigned int c = 0; c < 2; ++c)
        {
          lower[c] = std::min(lower[c], corner[c]);
          upper[c] = std::max(upper[c], corner[c]);
        }
    return {lower, upper};
  }

  std::vector<types::boundary_id> SheetDomain::boundary_ids() const
  {
    std::set<types::boundary_id> ids;
    if (shape == Shape::mesh_file)
      for (const auto &[id, edge] : mesh_geometry(*this).edges)
        ids.insert(id);
    else if (shape == Shape::disk)
      ids.insert(0);
    else
      ids = {0, 1, 2, 3};
    if (periodic)
      for (types::boundary_id id = 0; id < 4; ++id)
        ids.erase(id);
    return {ids.begin(), ids.end()};
  }

  SheetDomain::Shape SheetDomain::parse_shape(const std::string &name)
  {
    if (name == "rectangle")
      return Shape::rectangle;
    if (name == "rhombus")
      return Shape::rhombus;
    if (name == "disk")
      return Shape::disk;
    if (name == "mesh file")
      return Shape::mesh_file;
    AssertThrow(false, ExcMessage("Domain shape '" + name +
                                  "' is unknown; expected rectangle, rhombus, disk or mesh file."));
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
          case SheetDomain::Shape::mesh_file:
            {
              // Read serially, then copy: every rank holds the whole coarse mesh, as p4est requires.
              Triangulation<2> serial;
              read_mesh_file(serial, d);
              tria.copy_triangulation(serial);
              break;
            }
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
    try
      {
        GridTools::collect_periodic_faces(tria, 0, 1, 0, pairs, a1);
        GridTools::collect_periodic_faces(tria, 2, 3, 1, pairs, a2);
      }
    catch (const ExceptionBase &e)
      {
        AssertThrow(domain.shape != SheetDomain::Shape::mesh_file,
                    ExcMessage("The opposite edges (ids 0/1 and 2/3) of the periodic mesh file '" + domain.mesh_file +
                               "' do not match node for node under the translations a1, a2 of the cell; mesh "
                               "them with Gmsh's 'Periodic Curve' (deal.II: " + one_line_description(e) + ")."));
        throw;
      }
    return pairs;
  }

  void make_sheet_mesh(parallel::distributed::Triangulation<2> &tria, const SheetDomain &domain)
  {
    AssertThrow(!(domain.periodic && domain.shape == SheetDomain::Shape::disk),
                ExcMessage("A disk cannot be periodic; use a rectangle, a rhombus or a mesh file as the unit cell."));
    AssertThrow(domain.length_x > 0 && domain.length_y > 0 && domain.radius > 0,
                ExcMessage("Domain sizes must be positive."));
    make_coarse_mesh(tria, domain);
    if (domain.periodic)
      {
        const auto         pairs = collect_periodic_pairs(tria, domain);
        unsigned int expected = domain.coarse_cells_x + domain.coarse_cells_y;
        if (domain.shape == SheetDomain::Shape::mesh_file)
          {
            expected = 0;
            for (const auto &cell : tria.active_cell_iterators())
              for (const unsigned int f : cell->face_indices())
                if (cell->at_boundary(f) && (cell->face(f)->boundary_id() == 0 || cell->face(f)->boundary_id() == 2))
                  ++expected;
          }
        AssertThrow(pairs.size() == expected,
                    ExcMessage("Periodic faces of the unit cell could not be matched: " + std::to_string(pairs.size()) +
                               " pairs for " + std::to_string(expected) + " faces with ids 0 and 2" +
                               (domain.shape == SheetDomain::Shape::mesh_file ? " in '" + domain.mesh_file + "'" : "") +
                               "."));
        tria.add_periodicity(pairs);
      }
    tria.refine_global(domain.global_refinements);
  }
} // namespace nappe

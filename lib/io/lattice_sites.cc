#include <deal.II/base/exceptions.h>
#include <deal.II/base/utilities.h>

#include <nappe/io/lattice_sites.h>

#include <algorithm>
#include <cmath>
#include <limits>

namespace nappe
{
  using namespace dealii;

  namespace
  {
    /// [a₁ a₂] as columns.
    Tensor<2, 2> lattice_matrix(const Tensor<1, 2> &a1, const Tensor<1, 2> &a2)
    {
      Tensor<2, 2> m;
      for (unsigned int r = 0; r < 2; ++r)
        {
          m[r][0] = a1[r];
          m[r][1] = a2[r];
        }
      return m;
    }

    /// This rank's contiguous share [begin, end) of the integers [first, last].
    std::pair<long long, long long> my_share(long long first, long long last, MPI_Comm comm)
    {
      const long long n     = last - first + 1;
      const long long ranks = Utilities::MPI::n_mpi_processes(comm);
      const long long me    = Utilities::MPI::this_mpi_process(comm);
      return {first + n * me / ranks, first + n * (me + 1) / ranks};
    }

    /// Appends the basis sites of the primitive cell at lattice coordinates (i, j) accepted by @p keep.
    template <typename Keep>
    void add_cell(const MonolayerLattice &lattice, const Tensor<1, 2> &a1, const Tensor<1, 2> &a2, long long i,
                  long long j, const Keep &keep, LatticeSites &sites)
    {
      const auto basis = lattice.basis();
      for (unsigned int b = 0; b < basis.size(); ++b)
        {
          const auto [f1, f2] = MonolayerLattice::sublattice_offset(basis[b].sublattice);
          if (!keep(basis[b].sublattice))
            continue;
          sites.positions.emplace_back((i + f1) * a1 + (j + f2) * a2);
          sites.basis_index.push_back(b);
        }
    }
  } // namespace

  long long CommensurateCell::n_primitive_cells() const { return std::llabs(n[0][0] * n[1][1] - n[0][1] * n[1][0]); }

  double CommensurateCell::largest_residual_strain() const
  {
    const auto values = eigenvalues(residual_strain);
    return std::max(std::abs(values[0]), std::abs(values[1]));
  }

  CommensurateCell nearest_commensurate_cell(const MonolayerLattice &lattice, const Tensor<1, 2> &L1,
                                             const Tensor<1, 2> &L2)
  {
    const auto [a1, a2]      = lattice.primitive_vectors();
    const Tensor<2, 2> A     = lattice_matrix(a1, a2);
    const Tensor<2, 2> A_inv = invert(A);
    CommensurateCell   c;
    const Tensor<1, 2> L[2] = {L1, L2};
    for (unsigned int i = 0; i < 2; ++i)
      {
        const Tensor<1, 2> coordinates = A_inv * L[i];
        for (unsigned int k = 0; k < 2; ++k)
          c.n[i][k] = std::llround(coordinates[k]);
      }
    if (c.n_primitive_cells() == 0)
      return c;
    // Supercell vectors S_i = n_i1 a₁ + n_i2 a₂; F maps S onto L: F = [L₁ L₂][S₁ S₂]⁻¹.
    const Tensor<1, 2> S1 = double(c.n[0][0]) * a1 + double(c.n[0][1]) * a2;
    const Tensor<1, 2> S2 = double(c.n[1][0]) * a1 + double(c.n[1][1]) * a2;
    c.deformation         = lattice_matrix(L1, L2) * invert(lattice_matrix(S1, S2));
    c.residual_strain = 0.5 * (symmetrize(transpose(c.deformation) * c.deformation) - unit_symmetric_tensor<2>());
    return c;
  }

  LatticeSites periodic_cell_sites(const MonolayerLattice &lattice, const CommensurateCell &cell, MPI_Comm comm)
  {
    AssertThrow(cell.n_primitive_cells() > 0, ExcMessage("periodic_cell_sites: the supercell is degenerate."));
    const auto [a1_ref, a2_ref] = lattice.primitive_vectors();
    const Tensor<1, 2> a1 = cell.deformation * a1_ref, a2 = cell.deformation * a2_ref;
    const auto        &n  = cell.n;
    const long long    det = n[0][0] * n[1][1] - n[0][1] * n[1][0], sign = det > 0 ? 1 : -1, D = sign * det;

    // Lattice coordinates (p, q) = nᵀ s of the cell corners s ∈ {0, 1}² bound the candidates.
    long long p_min = 0, p_max = 0, q_min = 0, q_max = 0;
    for (const auto &[s1, s2] : {std::pair<int, int>{1, 0}, {0, 1}, {1, 1}})
      {
        const long long p = s1 * n[0][0] + s2 * n[1][0], q = s1 * n[0][1] + s2 * n[1][1];
        p_min = std::min(p_min, p), p_max = std::max(p_max, p);
        q_min = std::min(q_min, q), q_max = std::max(q_max, q);
      }
    // s = (nᵀ)⁻¹(p, q); with p = i + g/3, q = j + g/3 (g = 0 or 1 by sublattice), 3·det·s is an integer.
    auto inside = [&](long long i, long long j, int sublattice) {
      const long long g  = sublattice;
      const long long t1 = sign * (n[1][1] * (3 * i + g) - n[1][0] * (3 * j + g));
      const long long t2 = sign * (-n[0][1] * (3 * i + g) + n[0][0] * (3 * j + g));
      return t1 >= 0 && t1 < 3 * D && t2 >= 0 && t2 < 3 * D;
    };
    LatticeSites sites;
    const auto [begin, end] = my_share(p_min - 1, p_max, comm);
    for (long long i = begin; i < end; ++i)
      for (long long j = q_min - 1; j <= q_max; ++j)
        add_cell(lattice, a1, a2, i, j, [&](int s) { return inside(i, j, s); }, sites);
    return sites;
  }

  bool inside_polygon(const std::vector<Point<2>> &polygon, const Point<2> &p)
  {
    bool inside = false;
    for (std::size_t k = 0, l = polygon.size() - 1; k < polygon.size(); l = k++)
      {
        const Point<2> &u = polygon[k], &v = polygon[l];
        if ((u[1] > p[1]) != (v[1] > p[1]) && p[0] < (v[0] - u[0]) * (p[1] - u[1]) / (v[1] - u[1]) + u[0])
          inside = !inside;
      }
    return inside;
  }

  LatticeSites region_sites(const MonolayerLattice &lattice, const std::vector<Point<2>> &region, MPI_Comm comm)
  {
    AssertThrow(region.size() >= 3, ExcMessage("region_sites: a region needs at least 3 vertices."));
    const auto [a1, a2]      = lattice.primitive_vectors();
    const Tensor<2, 2> A_inv = invert(lattice_matrix(a1, a2));
    double             p_min = std::numeric_limits<double>::max(), p_max = -p_min, q_min = p_min, q_max = -p_min;
    for (const Point<2> &v : region)
      {
        const Tensor<1, 2> c = A_inv * v;
        p_min = std::min(p_min, c[0]), p_max = std::max(p_max, c[0]);
        q_min = std::min(q_min, c[1]), q_max = std::max(q_max, c[1]);
      }
    LatticeSites sites;
    const auto [begin, end] = my_share(std::llround(std::floor(p_min)) - 1, std::llround(std::ceil(p_max)), comm);
    for (long long i = begin; i < end; ++i)
      for (long long j = std::llround(std::floor(q_min)) - 1; j <= std::llround(std::ceil(q_max)); ++j)
        add_cell(
          lattice, a1, a2, i, j,
          [&](int s) {
            const auto [f1, f2] = MonolayerLattice::sublattice_offset(s);
            return inside_polygon(region, Point<2>((i + f1) * a1 + (j + f2) * a2));
          },
          sites);
    return sites;
  }
} // namespace nappe

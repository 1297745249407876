#include <deal.II/base/exceptions.h>

#include <nappe/geometry/lattice_array.h>

#include <cmath>

#include "format.h"

namespace nappe
{
  LatticeArray::LatticeArray(std::shared_ptr<const Topography> feature_in, const dealii::Tensor<1, 2> &a1_in,
                             const dealii::Tensor<1, 2> &a2_in, const std::string &lattice_name)
    : feature(std::move(feature_in))
    , a1(a1_in)
    , a2(a2_in)
    , reach(0.0)
    , lattice_name(lattice_name)
  {
    AssertThrow(feature != nullptr, dealii::ExcMessage("Lattice array: no feature given"));
    reach = feature->support_radius();
    AssertThrow(std::isfinite(reach),
                dealii::ExcMessage("Lattice array: the feature '" + feature->name() +
                                   "' is not localised (infinite support radius); only localised features "
                                   "(bumps, pillars, cones, rings, formulas with a support radius) can be arrayed; "
                                   "use a periodic tiling instead"));
    const double det = a1[0] * a2[1] - a1[1] * a2[0];
    AssertThrow(std::isfinite(det) && std::abs(det) > 1e-12 * a1.norm() * a2.norm() && det != 0.0,
                dealii::ExcMessage("Lattice array: the lattice vectors must be non-zero and linearly independent"));
    b1[0] = a2[1] / det;
    b1[1] = -a2[0] / det;
    b2[0] = -a1[1] / det;
    b2[1] = a1[0] / det;
    // After reduction the lattice coordinates of p lie in [-1/2, 1/2]; an image at distance < reach
    // differs from them by at most |b_i|·reach.
    range[0] = static_cast<int>(std::ceil(b1.norm() * reach + 0.5));
    range[1] = static_cast<int>(std::ceil(b2.norm() * reach + 0.5));
  }

  std::unique_ptr<LatticeArray> LatticeArray::square(std::shared_ptr<const Topography> feature, const double pitch)
  {
    AssertThrow(std::isfinite(pitch) && pitch > 0.0,
                dealii::ExcMessage("Square array: 'Pitch' must be positive, found " + internal::nm(pitch)));
    return std::make_unique<LatticeArray>(std::move(feature), dealii::Tensor<1, 2>({pitch, 0.0}),
                                          dealii::Tensor<1, 2>({0.0, pitch}), "square");
  }

  std::unique_ptr<LatticeArray> LatticeArray::hexagonal(std::shared_ptr<const Topography> feature,
                                                        const double                      pitch)
  {
    AssertThrow(std::isfinite(pitch) && pitch > 0.0,
                dealii::ExcMessage("Hexagonal array: 'Pitch' must be positive, found " + internal::nm(pitch)));
    return std::make_unique<LatticeArray>(std::move(feature), dealii::Tensor<1, 2>({pitch, 0.0}),
                                          dealii::Tensor<1, 2>({0.5 * pitch, 0.5 * std::sqrt(3.0) * pitch}),
                                          "hexagonal");
  }

  template <typename Op>
  void LatticeArray::for_each_image(const dealii::Point<2> &p, const Op &op) const
  {
    const dealii::Tensor<1, 2> &x = p;
    const double                n0 = std::round(b1 * x), m0 = std::round(b2 * x);
    const dealii::Tensor<1, 2>  y  = x - n0 * a1 - m0 * a2;
    const double                reach2 = reach * reach;
    for (int n = -range[0]; n <= range[0]; ++n)
      for (int m = -range[1]; m <= range[1]; ++m)
        {
          const dealii::Point<2> q(y - static_cast<double>(n) * a1 - static_cast<double>(m) * a2);
          if (q.square() < reach2)
            op(q);
        }
  }

  double LatticeArray::height(const dealii::Point<2> &p) const
  {
    double s = 0.0;
    for_each_image(p, [&](const dealii::Point<2> &q) { s += feature->height(q); });
    return s;
  }

  dealii::Tensor<1, 2> LatticeArray::gradient(const dealii::Point<2> &p) const
  {
    dealii::Tensor<1, 2> g;
    for_each_image(p, [&](const dealii::Point<2> &q) { g += feature->gradient(q); });
    return g;
  }

  std::string LatticeArray::description() const
  {
    return lattice_name + " array, a1 = (" + internal::nm(a1[0]) + ", " + internal::nm(a1[1]) + "), a2 = (" +
           internal::nm(a2[0]) + ", " + internal::nm(a2[1]) + ") of [" + feature->description() + "]";
  }
  std::optional<TopographyLattice> LatticeArray::lattice() const
  {
    TopographyLattice l;
    l.kind = lattice_name == "square"      ? TopographyLattice::Kind::square :
             lattice_name == "hexagonal"   ? TopographyLattice::Kind::hexagonal :
                                             TopographyLattice::Kind::oblique;
    l.a1   = a1;
    l.a2   = a2;
    return l;
  }
} // namespace nappe

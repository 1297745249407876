#include <deal.II/base/exceptions.h>

#include <nappe/geometry/transformed_topography.h>

#include <algorithm>
#include <cmath>

#include "format.h"

namespace nappe
{
  namespace
  {
    void require_base(const std::shared_ptr<const Topography> &base, const std::string &owner)
    {
      AssertThrow(base != nullptr, dealii::ExcMessage(owner + ": no topography to transform"));
    }
  } // namespace

  ScaledTopography::ScaledTopography(std::shared_ptr<const Topography> base_in, const double lateral_scale,
                                     const double vertical_scale)
    : base(std::move(base_in))
    , lateral(lateral_scale)
    , vertical(vertical_scale)
  {
    require_base(base, "Scaled topography");
    AssertThrow(std::isfinite(lateral) && lateral > 0.0,
                dealii::ExcMessage("Scaled topography: 'Lateral scale' must be positive, found " +
                                   internal::num(lateral)));
    AssertThrow(std::isfinite(vertical),
                dealii::ExcMessage("Scaled topography: 'Vertical scale' must be finite"));
  }

  double ScaledTopography::height(const dealii::Point<2> &p) const { return vertical * base->height(p / lateral); }

  dealii::Tensor<1, 2> ScaledTopography::gradient(const dealii::Point<2> &p) const
  {
    return (vertical / lateral) * base->gradient(p / lateral);
  }

  std::string ScaledTopography::description() const
  {
    return "[" + base->description() + "] scaled laterally by " + internal::num(lateral) + " and vertically by " +
           internal::num(vertical);
  }


  RotatedTopography::RotatedTopography(std::shared_ptr<const Topography> base_in, const double angle)
    : base(std::move(base_in))
    , angle(angle)
    , c(std::cos(angle))
    , s(std::sin(angle))
  {
    require_base(base, "Rotated topography");
    AssertThrow(std::isfinite(angle), dealii::ExcMessage("Rotated topography: 'Rotation angle' must be finite"));
  }

  double RotatedTopography::height(const dealii::Point<2> &p) const
  {
    return base->height(dealii::Point<2>(c * p[0] + s * p[1], -s * p[0] + c * p[1]));
  }

  dealii::Tensor<1, 2> RotatedTopography::gradient(const dealii::Point<2> &p) const
  {
    const dealii::Tensor<1, 2> g = base->gradient(dealii::Point<2>(c * p[0] + s * p[1], -s * p[0] + c * p[1]));
    dealii::Tensor<1, 2>       r;
    r[0] = c * g[0] - s * g[1];
    r[1] = s * g[0] + c * g[1];
    return r;
  }

  std::string RotatedTopography::description() const
  {
    return "[" + base->description() + "] rotated by " + internal::num(angle * 180.0 / M_PI) + " deg";
  }


  OffsetTopography::OffsetTopography(std::shared_ptr<const Topography> base_in, const dealii::Point<2> &shift,
                                     const double vertical_offset)
    : base(std::move(base_in))
    , shift(shift)
    , dz(vertical_offset)
  {
    require_base(base, "Offset topography");
    AssertThrow(std::isfinite(shift[0]) && std::isfinite(shift[1]) && std::isfinite(dz),
                dealii::ExcMessage("Offset topography: the offsets must be finite"));
  }

  double OffsetTopography::height(const dealii::Point<2> &p) const
  {
    return base->height(dealii::Point<2>(p - shift)) + dz;
  }

  dealii::Tensor<1, 2> OffsetTopography::gradient(const dealii::Point<2> &p) const
  {
    return base->gradient(dealii::Point<2>(p - shift));
  }

  double OffsetTopography::support_radius() const
  {
    return dz == 0.0 ? base->support_radius() + shift.norm() : std::numeric_limits<double>::infinity();
  }

  std::string OffsetTopography::description() const
  {
    return "[" + base->description() + "] moved by (" + internal::nm(shift[0]) + ", " + internal::nm(shift[1]) +
           ") and raised by " + internal::nm(dz);
  }


  PeriodicTiling::PeriodicTiling(std::shared_ptr<const Topography> base_in, const dealii::Point<2> &cell_origin,
                                 const dealii::Tensor<1, 2> &period)
    : base(std::move(base_in))
    , origin(cell_origin)
    , period(period)
  {
    require_base(base, "Periodic tiling");
    for (unsigned int d = 0; d < 2; ++d)
      AssertThrow(std::isfinite(period[d]) && period[d] > 0.0,
                  dealii::ExcMessage(std::string("Periodic tiling: 'Period ") + (d == 0 ? "x" : "y") +
                                     "' must be positive, found " + internal::nm(period[d])));
  }

  dealii::Point<2> PeriodicTiling::wrap(const dealii::Point<2> &p) const
  {
    dealii::Point<2> q;
    for (unsigned int d = 0; d < 2; ++d)
      {
        double u = std::fmod(p[d] - origin[d], period[d]);
        if (u < 0.0)
          u += period[d];
        if (u >= period[d]) // fmod of a tiny negative number
          u = 0.0;
        q[d] = origin[d] + u;
      }
    return q;
  }

  double PeriodicTiling::height(const dealii::Point<2> &p) const { return base->height(wrap(p)); }

  dealii::Tensor<1, 2> PeriodicTiling::gradient(const dealii::Point<2> &p) const { return base->gradient(wrap(p)); }

  std::string PeriodicTiling::description() const
  {
    return "[" + base->description() + "] tiled with periods " + internal::nm(period[0]) + " x " +
           internal::nm(period[1]) + " from (" + internal::nm(origin[0]) + ", " + internal::nm(origin[1]) + ")";
  }


  SumTopography::SumTopography(std::vector<std::shared_ptr<const Topography>> terms_in)
    : terms(std::move(terms_in))
  {
    for (const auto &t : terms)
      require_base(t, "Sum of topographies");
  }

  double SumTopography::height(const dealii::Point<2> &p) const
  {
    double s = 0.0;
    for (const auto &t : terms)
      s += t->height(p);
    return s;
  }

  dealii::Tensor<1, 2> SumTopography::gradient(const dealii::Point<2> &p) const
  {
    dealii::Tensor<1, 2> g;
    for (const auto &t : terms)
      g += t->gradient(p);
    return g;
  }

  double SumTopography::support_radius() const
  {
    double r = 0.0;
    for (const auto &t : terms)
      r = std::max(r, t->support_radius());
    return r;
  }

  std::string SumTopography::description() const
  {
    std::string d = "sum of";
    for (std::size_t i = 0; i < terms.size(); ++i)
      d += (i == 0 ? " [" : " + [") + terms[i]->description() + "]";
    return d;
  }
  std::optional<TopographyLattice> ScaledTopography::lattice() const
  {
    auto l = base->lattice();
    if (l)
      {
        l->a1 *= lateral;
        if (l->kind != TopographyLattice::Kind::stripes)
          l->a2 *= lateral;
      }
    return l;
  }

  std::optional<TopographyLattice> RotatedTopography::lattice() const
  {
    auto l = base->lattice();
    if (l)
      {
        const auto rotate = [&](const dealii::Tensor<1, 2> &v) {
          return dealii::Tensor<1, 2>({c * v[0] - s * v[1], s * v[0] + c * v[1]});
        };
        l->a1 = rotate(l->a1);
        l->a2 = rotate(l->a2);
      }
    return l;
  }

  std::optional<TopographyLattice> OffsetTopography::lattice() const { return base->lattice(); }

  std::optional<TopographyLattice> PeriodicTiling::lattice() const
  {
    TopographyLattice l;
    l.kind  = TopographyLattice::Kind::rectangular;
    l.a1[0] = period[0];
    l.a2[1] = period[1];
    return l;
  }

  std::vector<TopographyFeature> ScaledTopography::features() const
  {
    auto f = base->features();
    for (auto &feature : f)
      feature.length *= lateral;
    return f;
  }

  std::vector<TopographyFeature> SumTopography::features() const
  {
    std::vector<TopographyFeature> all;
    for (const auto &t : terms)
      for (const auto &f : t->features())
        all.push_back(f);
    return all;
  }
} // namespace nappe

#include "reduced_trust_region.h"

#include <algorithm>
#include <cmath>

namespace nappe::internal
{
  ReducedStep reduced_trust_region(double g1, double g2, double h11, double h12, double h22, double radius)
  {
    const double mean = 0.5 * (h11 + h22), half = std::hypot(0.5 * (h11 - h22), h12);
    const double mu_lo = mean - half, mu_hi = mean + half;
    // The eigenvector of μ_lo from the better conditioned of the two rows of H − μ_lo I.
    double qa1 = h12, qa2 = mu_lo - h11;
    if (std::hypot(mu_lo - h22, h12) > std::hypot(qa1, qa2))
      qa1 = mu_lo - h22, qa2 = h12;
    const double nq = std::hypot(qa1, qa2);
    if (nq > 0.0)
      qa1 /= nq, qa2 /= nq;
    else
      qa1 = 1.0, qa2 = 0.0; // H = μI
    const double qb1 = -qa2, qb2 = qa1;
    const double ga = qa1 * g1 + qa2 * g2, gb = qb1 * g1 + qb2 * g2;
    const auto   length = [&](double lambda) {
      return std::hypot(ga / (mu_lo + lambda), gb / (mu_hi + lambda));
    };
    const auto step = [&](double ca, double cb, double lambda) {
      return ReducedStep{qa1 * ca + qb1 * cb, qa2 * ca + qb2 * cb, lambda};
    };
    if (mu_lo > 0.0 && length(0.0) <= radius)
      return step(-ga / mu_lo, -gb / mu_hi, 0.0);
    const double floor = std::max(0.0, -mu_lo);
    const double cb_floor = mu_hi + floor > 0.0 ? -gb / (mu_hi + floor) : 0.0;
    if (std::abs(ga) <= 1e-14 * std::hypot(g1, g2) + 1e-300 && std::abs(cb_floor) <= radius)
      {
        const double ca = std::sqrt(radius * radius - cb_floor * cb_floor);
        return step(ga > 0.0 ? -ca : ca, cb_floor, floor);
      }
    double lo = floor, hi = floor + std::hypot(g1, g2) / radius + std::abs(mu_lo) + std::abs(mu_hi);
    for (unsigned int k = 0; k < 200 && hi - lo > 1e-15 * hi; ++k)
      {
        const double mid = 0.5 * (lo + hi);
        if (length(mid) > radius)
          lo = mid;
        else
          hi = mid;
      }
    return step(-ga / (mu_lo + hi), -gb / (mu_hi + hi), hi);
  }
} // namespace nappe::internal

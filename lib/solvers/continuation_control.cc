#include <nappe/solvers/continuation_control.h>

#include <algorithm>
#include <cmath>

namespace nappe::continuation
{
  double step_factor(unsigned int corrector_iterations, double distance_share)
  {
    const double by_iterations = double(target_iterations) / std::max(1u, corrector_iterations);
    const double by_distance   = std::sqrt(0.25 / std::max(distance_share, 1e-6));
    return std::clamp(std::min(by_iterations, by_distance), 0.5, 2.0);
  }

  double fold_distance(double t_a, double mu_a, double t_b, double mu_b)
  {
    const double drop = mu_a * mu_a - mu_b * mu_b;
    if (!(mu_a > 0 && mu_b > 0 && drop > 0))
      return -1.0;
    return mu_b * mu_b * std::abs(t_b - t_a) / drop;
  }

  double bracket_trial(double width, double estimate, double tolerance, bool bisect)
  {
    if (bisect || !(estimate >= 0.0) || estimate >= width)
      return 0.5 * width;
    const double margin = 0.45 * tolerance;
    const double before = estimate - margin;
    double       trial  = before >= margin ? before : 2.0 * margin; // close to 0: one step past it
    if (trial > width - margin)
      trial = width - 2.0 * margin; // close to the far end: one step short of it
    return std::clamp(trial, margin, width - margin);
  }
} // namespace nappe::continuation

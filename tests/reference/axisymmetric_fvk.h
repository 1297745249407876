#pragma once

// Independent reference solutions for a clamped circular sheet under uniform pressure, for comparison with nappe's
// finite-element results. Nothing here uses the library: the axisymmetric Föppl–von Kármán (FvK) equations are shot
// from the centre with Boost.Odeint, and the membrane limit (Hencky's problem) is solved twice, by shooting and by
// Hencky's power series. All quantities are SI; w is positive in the direction of the pressure.
//
// Axisymmetric FvK with slope φ = w', radial stress resultant σ = N_r, hoop resultant N_θ = (r σ)':
//   D (φ'' + φ'/r − φ/r²) = σ φ + q r / 2     (vertical equilibrium, integrated once)
//   σ'' + 3 σ'/r = −Y φ² / (2 r²)              (compatibility of ε_r = u' + φ²/2 and ε_θ = u/r)
// Clamped, immovable edge: φ(a) = 0, w(a) = 0, u(a) = a (N_θ − ν N_r)/Y = 0  ⇔  a σ'(a) + (1 − ν) σ(a) = 0.

#include <boost/math/tools/toms748_solve.hpp>
// GCC flags odeint's copy of a default-constructed stepper (its scratch arrays are filled before use) as
// -Wuninitialized when inlined; the diagnostic is attributed to these header lines, so silence it here only.
#pragma GCC diagnostic push
#pragma GCC diagnostic ignored "-Wuninitialized"
#pragma GCC diagnostic ignored "-Wmaybe-uninitialized"
#include <boost/numeric/odeint.hpp>
#pragma GCC diagnostic pop

#include <algorithm>
#include <array>
#include <cmath>
#include <cstdint>
#include <limits>
#include <stdexcept>
#include <string>
#include <vector>

namespace nappe::reference
{
  /// A circular sheet clamped at r = a with an immovable edge.
  struct CircularSheet
  {
    double radius;             ///< a [m]
    double stretching_modulus; ///< 2D Young's modulus Y = E h [N/m]
    double poisson_ratio;      ///< ν [-]
    double bending_rigidity;   ///< D [J]; must be > 0 for solve_clamped_plate()
  };

  /// Accuracy controls of the shooting solvers.
  struct ShootingOptions
  {
    /// Absolute and relative error per step of the Runge–Kutta–Fehlberg 7(8) stepper; the variables are scaled to O(1).
    double tolerance = 1e-12;
    /// r/a at which the series expansion about the centre hands over to the integrator.
    double start_radius = 1e-4;
    /// If > 0, the profile is returned at this many equal intervals of r in [0, a].
    unsigned int n_profile_intervals = 0;
  };

  /// Axisymmetric FvK solution of the clamped plate.
  struct PlateSolution
  {
    double centre_deflection; ///< w(0) [m]
    double centre_curvature;  ///< w''(0) [1/m]
    double centre_stress;     ///< N_r(0) = N_θ(0) [N/m]
    double edge_stress;       ///< N_r(a) [N/m]
    // Profile at equally spaced radii, empty unless ShootingOptions::n_profile_intervals > 0.
    std::vector<double> radii;         ///< r [m]
    std::vector<double> deflection;    ///< w(r) [m]
    std::vector<double> slope;         ///< w'(r) [-]
    std::vector<double> curvature;     ///< w''(r) [1/m]
    std::vector<double> radial_stress; ///< N_r(r) [N/m]
    std::vector<double> hoop_stress;   ///< N_θ(r) = (r N_r)' [N/m]
  };

  namespace internal
  {
    // Dimensionless plate problem: ρ = r/a, φ = s Φ, σ = Y s² Ψ, w − w(0) = a s W, with slope scale s. Then
    //   Φ'' + Φ'/ρ − Φ/ρ² = β Ψ Φ + γ ρ,   Ψ'' + 3Ψ'/ρ = −Φ²/(2ρ²),   W' = Φ,
    // β = Y a² s²/D, γ = q a³/(2 D s). The state also carries ∂/∂c and ∂/∂p of (Φ, Φ', Ψ, Ψ') for the two shooting
    // unknowns c = Φ'(0) and p = Ψ(0), so that Newton gets an exact Jacobian.
    struct PlateEquations
    {
      double beta;
      double gamma;

      void operator()(const std::array<double, 13> &x, std::array<double, 13> &dx, const double rho) const
      {
        const double i1 = 1.0 / rho, i2 = i1 * i1;
        dx[0] = x[1];
        dx[1] = -x[1] * i1 + x[0] * i2 + beta * x[2] * x[0] + gamma * rho;
        dx[2] = x[3];
        dx[3] = -3.0 * x[3] * i1 - 0.5 * x[0] * x[0] * i2;
        dx[4] = x[0];
        for (const unsigned int k : {5u, 9u})
          {
            dx[k] = x[k + 1];
            dx[k + 1] = -x[k + 1] * i1 + x[k] * i2 + beta * (x[k + 2] * x[0] + x[2] * x[k]);
            dx[k + 2] = x[k + 3];
            dx[k + 3] = -3.0 * x[k + 3] * i1 - x[0] * x[k] * i2;
          }
      }
    };

    // The smaller of the linear-plate slope q a³/(16 D) and the membrane slope (q a/Y)^{1/3} keeps Φ, Ψ = O(1) from
    // the linear to the membrane regime, so one absolute tolerance serves all loads.
    inline double slope_scale(const CircularSheet &sheet, const double q)
    {
      const double a = sheet.radius;
      return std::min(q * a * a * a / (16.0 * sheet.bending_rigidity), std::cbrt(q * a / sheet.stretching_modulus));
    }

    // Integrates from the centre series to the edge for unknowns (c, p); fills `profile` with the state at `times`.
    inline std::array<double, 13> shoot_plate(const PlateEquations &eq, const double c, const double p,
                                              const ShootingOptions &options, const std::vector<double> &times,
                                              std::vector<std::array<double, 13>> *profile)
    {
      // Regular series about ρ = 0: Φ = c ρ + c3 ρ³ + O(ρ⁵), Ψ = p − (c²/16) ρ² + O(ρ⁴).
      const double r = times.front(), r2 = r * r, bp = eq.beta * p, c3 = (bp * c + eq.gamma) / 8.0;
      std::array<double, 13> x = {c * r + c3 * r * r2, c + 3.0 * c3 * r2, p - c * c * r2 / 16.0, -c * c * r / 8.0,
                                  0.5 * c * r2 + 0.25 * c3 * r2 * r2,
                                  // ∂/∂c
                                  r + bp * r * r2 / 8.0, 1.0 + 3.0 * bp * r2 / 8.0, -c * r2 / 8.0, -c * r / 4.0,
                                  // ∂/∂p
                                  eq.beta * c * r * r2 / 8.0, 3.0 * eq.beta * c * r2 / 8.0, 1.0, 0.0};
      using Stepper = boost::numeric::odeint::runge_kutta_fehlberg78<std::array<double, 13>>;
      auto stepper = boost::numeric::odeint::make_controlled<Stepper>(options.tolerance, options.tolerance);
      boost::numeric::odeint::integrate_times(stepper, eq, x, times.begin(), times.end(), 1e-3 * r,
                                              [profile](const std::array<double, 13> &y, double) {
                                                if (profile != nullptr)
                                                  profile->push_back(y);
                                              });
      return x;
    }

    // Newton on the edge conditions Φ(1) = 0 and Ψ'(1) + (1 − ν) Ψ(1) = 0; returns false if it does not converge.
    inline bool solve_shooting(const PlateEquations &eq, const double nu, const ShootingOptions &options,
                               std::array<double, 2> &unknowns)
    {
      const std::vector<double> times = {options.start_radius, 1.0};
      double previous_step = std::numeric_limits<double>::infinity();
      // From a continuation guess Newton converges in < 10 iterations; a wandering iteration means the load step
      // was too large for the small basin of single shooting, and the caller shortens it.
      for (unsigned int it = 0; it < 15; ++it)
        {
          const auto x = shoot_plate(eq, unknowns[0], unknowns[1], options, times, nullptr);
          const double r0 = x[0], r1 = x[3] + (1.0 - nu) * x[2];
          const double j00 = x[5], j01 = x[9], j10 = x[8] + (1.0 - nu) * x[7], j11 = x[12] + (1.0 - nu) * x[11];
          const double det = j00 * j11 - j01 * j10;
          if (!std::isfinite(det) || det == 0.0)
            return false;
          const double dc = -(j11 * r0 - j01 * r1) / det, dp = -(j00 * r1 - j10 * r0) / det;
          const double size = std::max(std::abs(unknowns[0]), std::abs(unknowns[1]));
          const double step = std::max(std::abs(dc), std::abs(dp)) / (1.0 + size);
          if (step > 2.0)
            return false;
          // A full step far from the solution can overshoot into the exponentially growing bending mode.
          const double damping = std::min(1.0, 0.5 / step);
          unknowns[0] += damping * dc;
          unknowns[1] += damping * dp;
          // Converged when the step is negligible, or when it stops shrinking quadratically because it has reached
          // the integration noise, which the bending mode amplifies by about exp(a sqrt(N_r/D)).
          if (damping == 1.0 && (step <= 1e-14 || (step <= 1e-7 && step > 0.25 * previous_step)))
            return true;
          previous_step = (damping == 1.0) ? step : std::numeric_limits<double>::infinity();
        }
      return false;
    }

    // Membrane (D = 0) in Hencky's scaling ρ = r/a, σ = (Y q² a²)^{1/3} S: S'' + 3S'/ρ = −1/(8 S²), the slope is
    // φ = −(q a/Y)^{1/3} ρ/(2 S) and K1 = ∫₀¹ ρ/(2 S) dρ. State: (S, S', ∫ ρ/(2S)).
    struct MembraneCollapse
    {
    };

    inline std::array<double, 3> shoot_membrane(const double s0, const double tolerance, const double start_radius)
    {
      const double r = start_radius, s2 = -1.0 / (64.0 * s0 * s0);
      std::array<double, 3> x = {s0 + s2 * r * r, 2.0 * s2 * r, r * r / (4.0 * s0)};
      const auto rhs = [](const std::array<double, 3> &y, std::array<double, 3> &dy, const double rho) {
        dy[0] = y[1];
        dy[1] = -3.0 * y[1] / rho - 1.0 / (8.0 * y[0] * y[0]);
        dy[2] = rho / (2.0 * y[0]);
      };
      // Too small a centre stress lets S reach zero inside the membrane; report that instead of integrating into it.
      const auto guard = [s0](const std::array<double, 3> &y, double) {
        if (!(y[0] > 1e-3 * s0))
          throw MembraneCollapse();
      };
      using Stepper = boost::numeric::odeint::runge_kutta_fehlberg78<std::array<double, 3>>;
      boost::numeric::odeint::integrate_adaptive(
        boost::numeric::odeint::make_controlled<Stepper>(tolerance, tolerance), rhs, x, r, 1.0, 1e-3 * r, guard);
      return x;
    }

    // Edge condition S'(1) + (1 − ν) S(1) as a function of S(0); negative for a collapsing membrane.
    inline double membrane_edge_residual(const double s0, const double nu, const double tolerance)
    {
      try
        {
          const auto x = shoot_membrane(s0, tolerance, 1e-6);
          return x[1] + (1.0 - nu) * x[0];
        }
      catch (const MembraneCollapse &)
        {
          return -1.0;
        }
    }

    inline double membrane_centre_stress(const double nu, const double tolerance)
    {
      std::uintmax_t max_iter = 200;
      const auto root = boost::math::tools::toms748_solve(
        [nu, tolerance](const double s0) { return membrane_edge_residual(s0, nu, tolerance); }, 0.05, 5.0,
        boost::math::tools::eps_tolerance<double>(48), max_iter);
      return 0.5 * (root.first + root.second);
    }

    // Coefficients b_n of Hencky's series S = Σ b_n ρ^{2n} for b_0 = S(0): inserting it into S² (S'' + 3S'/ρ) = −1/8
    // and matching powers of ρ gives b_{k+1} from b_0..b_k.
    inline std::vector<double> hencky_series(const double s0, const unsigned int n_terms)
    {
      std::vector<double> b(n_terms + 1, 0.0), p(n_terms, 0.0), t(n_terms, 0.0); // p = coefficients of S², t of S''+3S'/ρ
      b[0] = s0;
      for (unsigned int k = 0; k < n_terms; ++k)
        {
          for (unsigned int i = 0; i <= k; ++i)
            p[k] += b[i] * b[k - i];
          double sum = (k == 0) ? -0.125 : 0.0;
          for (unsigned int j = 0; j < k; ++j)
            sum -= p[k - j] * t[j];
          t[k] = sum / p[0];
          b[k + 1] = t[k] / (4.0 * (k + 1) * (k + 2));
        }
      return b;
    }
  } // namespace internal

  /// Solves the axisymmetric FvK equations of a clamped plate with an immovable edge (w = w' = u = 0 at r = a) under
  /// uniform pressure q [Pa], by shooting from the centre with a Runge–Kutta–Fehlberg 7(8) stepper and Newton on the
  /// two edge conditions (unknowns w''(0) and N_r(0)), with load continuation from the linear regime.
  /// Throws std::invalid_argument for non-positive a, Y, D or q, and std::runtime_error if continuation fails, which
  /// happens in the membrane limit beyond a·sqrt(N_r(a)/D) ≈ 25: the bending mode then grows like exp(a sqrt(N_r/D)),
  /// amplifying the integration error (relative accuracy ~1e-6 at 22) and shrinking Newton's basin.
  inline PlateSolution solve_clamped_plate(const CircularSheet &sheet, const double q,
                                           const ShootingOptions &options = {})
  {
    const double a = sheet.radius, Y = sheet.stretching_modulus, D = sheet.bending_rigidity, nu = sheet.poisson_ratio;
    if (!(a > 0 && Y > 0 && D > 0 && q > 0 && nu > -1 && nu < 0.5))
      throw std::invalid_argument("solve_clamped_plate: expected a, Y, D, q > 0 and -1 < nu < 0.5");

    const auto equations = [&](const double load) {
      const double s = internal::slope_scale(sheet, load);
      return internal::PlateEquations{Y * a * a * s * s / D, load * a * a * a / (2.0 * D * s)};
    };
    // Below this load β ≤ 1e-2 and s is the linear slope, so the linear solution Φ = ρ³ − ρ,
    // Ψ = p − ρ²/16 + ρ⁴/24 − ρ⁶/96 with the edge condition fixing p is an accurate first guess.
    const double q_linear = 16.0 * D / (a * a * a) * std::sqrt(1e-2 * D / (Y * a * a));
    std::array<double, 2> unknowns = {-1.0, 1.0 / 32.0 + 1.0 / (48.0 * (1.0 - nu))};
    double q_done = std::min(q, q_linear);
    if (!internal::solve_shooting(equations(q_done), nu, options, unknowns))
      throw std::runtime_error("solve_clamped_plate: Newton failed in the linear regime");
    // Continuation: w''(0) and N_r(0) follow power laws of q in both regimes (q¹, q² linear; q^{1/3}, q^{2/3}
    // membrane), so the guess extrapolates the last two solutions linearly in log q.
    const auto logs = [&](const double load, const std::array<double, 2> &x) {
      const double sl = internal::slope_scale(sheet, load);
      return std::array<double, 3>{std::log(load), std::log(-x[0] * sl / a), std::log(x[1] * Y * sl * sl)};
    };
    const auto scaled = [&](const double load, const double log_curvature, const double log_stress) {
      const double sl = internal::slope_scale(sheet, load);
      return std::array<double, 2>{-std::exp(log_curvature) * a / sl, std::exp(log_stress) / (Y * sl * sl)};
    };
    std::array<double, 3> last = logs(q_done, unknowns), before = last;
    double ratio = 2.0;
    while (q_done < q)
      {
        const double q_next = std::min(q, q_done * ratio);
        const double t = (last[0] == before[0]) ? 0.0 : (std::log(q_next) - last[0]) / (last[0] - before[0]);
        std::array<double, 2> trial =
          scaled(q_next, last[1] + t * (last[1] - before[1]), last[2] + t * (last[2] - before[2]));
        if (internal::solve_shooting(equations(q_next), nu, options, trial))
          {
            unknowns = trial;
            q_done = q_next;
            before = last;
            last = logs(q_done, unknowns);
            ratio = std::min(1.5 * ratio, 8.0);
          }
        else if ((ratio = std::sqrt(ratio)) < 1.0001)
          throw std::runtime_error("solve_clamped_plate: load continuation stalled at q = " + std::to_string(q_done) +
                                   " Pa");
      }

    const double s = internal::slope_scale(sheet, q);
    const auto eq = equations(q);
    std::vector<double> times = {options.start_radius};
    for (unsigned int i = 1; i <= options.n_profile_intervals; ++i)
      times.push_back(double(i) / options.n_profile_intervals);
    if (times.back() != 1.0)
      times.push_back(1.0);
    std::vector<std::array<double, 13>> states;
    internal::shoot_plate(eq, unknowns[0], unknowns[1], options, times, &states);

    PlateSolution solution;
    solution.centre_deflection = -a * s * states.back()[4];
    solution.centre_curvature = s / a * unknowns[0];
    solution.centre_stress = Y * s * s * unknowns[1];
    solution.edge_stress = Y * s * s * states.back()[2];
    if (options.n_profile_intervals > 0)
      {
        // The first state is at the series hand-over radius; report the exact centre values there instead.
        solution.radii = {0.0};
        solution.deflection = {solution.centre_deflection};
        solution.slope = {0.0};
        solution.curvature = {solution.centre_curvature};
        solution.radial_stress = {solution.centre_stress};
        solution.hoop_stress = {solution.centre_stress};
        for (std::size_t i = 1; i < states.size(); ++i)
          {
            const auto &x = states[i];
            solution.radii.push_back(a * times[i]);
            solution.deflection.push_back(a * s * (x[4] - states.back()[4]));
            solution.slope.push_back(s * x[0]);
            solution.curvature.push_back(s / a * x[1]);
            solution.radial_stress.push_back(Y * s * s * x[2]);
            solution.hoop_stress.push_back(Y * s * s * (x[2] + times[i] * x[3]));
          }
      }
    return solution;
  }

  /// Hencky's constant K1 in w0 = K1 a (p a/Y)^{1/3} for a clamped membrane (D = 0, u(a) = 0) under pressure p,
  /// computed by shooting the membrane equations from the centre for the centre stress that satisfies u(a) = 0.
  /// The equivalent pressure–deflection law is p = K Y w0³/a⁴ with K = 1/K1³.
  inline double hencky_constant(const double poisson_ratio, const double tolerance = 1e-13)
  {
    const double s0 = internal::membrane_centre_stress(poisson_ratio, tolerance);
    return internal::shoot_membrane(s0, tolerance, 1e-6)[2];
  }

  /// The same K1 by Hencky's power-series method (H. Hencky, Z. Math. Phys. 63, 311 (1915); arithmetic corrected by
  /// W. Z. Chien, 1948; tabulated by W. B. Fichter, NASA TP-3658, 1997): σ_r ∝ Σ b_n ρ^{2n} with the free coefficient
  /// b_0 solved from u(a) = 0, and w0 from the series of 1/S integrated term by term. Independent of the shooting.
  /// Precondition: 0 ≤ ν ≤ 0.5 (the bracket for b_0 is chosen for that range).
  inline double hencky_constant_series(const double poisson_ratio, const unsigned int n_terms = 120)
  {
    const auto edge = [&](const double s0) {
      const auto b = internal::hencky_series(s0, n_terms);
      double s = 0.0, ds = 0.0;
      for (std::size_t n = 0; n < b.size(); ++n)
        {
          s += b[n];
          ds += 2.0 * n * b[n];
        }
      return ds + (1.0 - poisson_ratio) * s;
    };
    std::uintmax_t max_iter = 200;
    // The series' radius of convergence grows as b_0^{3/2} and reaches ρ = 1 near b_0 = 0.31; the root lies near 0.43.
    const auto root = boost::math::tools::toms748_solve(edge, 0.35, 2.0, boost::math::tools::eps_tolerance<double>(48),
                                                        max_iter);
    const auto b = internal::hencky_series(0.5 * (root.first + root.second), n_terms);
    // 1/S = Σ c_n ρ^{2n}, so K1 = ∫₀¹ ρ/(2S) dρ = Σ c_n/(4(n + 1)).
    std::vector<double> c(b.size(), 0.0);
    double k1 = 0.0;
    for (std::size_t k = 0; k < b.size(); ++k)
      {
        double sum = (k == 0) ? 1.0 : 0.0;
        for (std::size_t i = 1; i <= k; ++i)
          sum -= b[i] * c[k - i];
        c[k] = sum / b[0];
        k1 += c[k] / (4.0 * (k + 1));
      }
    return k1;
  }

  /// Membrane centre deflection w0 = K1 a (p a/Y)^{1/3} [m] (bending rigidity ignored).
  inline double hencky_centre_deflection(const CircularSheet &sheet, const double pressure)
  {
    return hencky_constant(sheet.poisson_ratio) * sheet.radius *
           std::cbrt(pressure * sheet.radius / sheet.stretching_modulus);
  }

  /// Linear clamped plate: w0 = q a⁴/(64 D) [m] (Timoshenko & Woinowsky-Krieger, Theory of Plates and Shells, 2nd ed.
  /// 1959, §15).
  inline double linear_clamped_plate_centre_deflection(const double radius, const double bending_rigidity,
                                                       const double q)
  {
    return q * std::pow(radius, 4) / (64.0 * bending_rigidity);
  }

  /// Approximate large deflection of the clamped plate with immovable edge at ν = 0.3 only: the root w0 [m] of
  /// w0/h + 0.488 (w0/h)³ = q a⁴/(64 D h) (Timoshenko & Woinowsky-Krieger 1959, §97, energy method after Way 1934).
  inline double timoshenko_clamped_plate_centre_deflection(const double radius, const double thickness,
                                                           const double bending_rigidity, const double q)
  {
    const double rhs = linear_clamped_plate_centre_deflection(radius, bending_rigidity, q) / thickness;
    double x = rhs; // Newton from the linear root converges monotonically: the cubic is convex for x > 0.
    for (int it = 0; it < 100; ++it)
      {
        const double dx = (x + 0.488 * x * x * x - rhs) / (1.0 + 3.0 * 0.488 * x * x);
        x -= dx;
        if (std::abs(dx) <= 1e-15 * x)
          break;
      }
    return x * thickness;
  }

  /// Dimensionless factor q(ν) = 1/(1.05 − 0.15 ν − 0.16 ν²) of the point-loaded clamped membrane, a fit to numerical
  /// solutions by Komaragiri et al. (2005; journal details from memory: Komaragiri, Begley & Simmonds, J. Appl. Mech.
  /// 72, 203) used by Lee et al., Science 321, 385 (2008).
  inline double point_load_membrane_coefficient(const double poisson_ratio)
  {
    return 1.0 / (1.05 - 0.15 * poisson_ratio - 0.16 * poisson_ratio * poisson_ratio);
  }

  /// Force [N] of a clamped membrane without pretension under a central point load at deflection δ [m]:
  /// F = Y q³ δ³/a² (same sources as point_load_membrane_coefficient()).
  inline double point_load_membrane_force(const double radius, const double stretching_modulus,
                                          const double poisson_ratio, const double deflection)
  {
    const double c = point_load_membrane_coefficient(poisson_ratio);
    return stretching_modulus * c * c * c * std::pow(deflection, 3) / (radius * radius);
  }
} // namespace nappe::reference

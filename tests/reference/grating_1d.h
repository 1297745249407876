#pragma once

// Independent one-dimensional reference for the adhesion thresholds of a sheet on a sinusoidal grating, for
// comparison with nappe's finite-element results. Nothing here uses the library or deal.II: the standard library
// only, a finite-difference energy, a hand-written Cholesky factorisation and Newton's method.
//
// Model (SI throughout). A sheet over one period L = 2π/k of the grating s(x) = A cos kx, constant along y
// (cylindrical bending) and periodic in x. The unknown is the sheet height w(x). Energy per projected area:
//
//   E[w] = (1/L) ∫₀ᴸ [ ½ D (w'')² + φ(g) ] dx + E_stretch,
//
//   gap       vertical g = w − s,  or normal g = (w − s)/√(1 + s'²);
//   adhesion  van der Waals 9-3, φ(g) = −Γ [ (3/2)(h₀/g)³ − ½ (h₀/g)⁹ ] for g ≥ g_c = h₀/2, continued below g_c by
//             its second-order Taylor expansion about g_c (C2, convex and repulsive, for Newton iterates that
//             penetrate); φ(h₀) = −Γ, φ'(h₀) = 0, φ''(h₀) = 27Γ/h₀², peak attraction at g* = (5/2)^{1/6} h₀;
//   in-plane  free to slide: E_stretch = 0 (the membrane tension vanishes);
//             held: the in-plane displacement u is periodic. For cylindrical bending the strain u' + ½w'² is
//             then uniform (N' = 0) and equal to its mean ε̄ = (1/L) ∫ ½ w'² dx, so eliminating u exactly gives
//             E_stretch = ½ Ŷ ε̄² with the plane-strain modulus Ŷ = Y/(1 − ν²).
//
// Discretisation: n uniform periodic nodes x_i = iΔx, w'' ≈ (w_{i+1} − 2w_i + w_{i−1})/Δx² at node i,
// w' ≈ (w_{i+1} − w_i)/Δx on interval i, rectangle sums (1/L)∫f dx ≈ (1/n) Σ f_i. The gradient and Hessian below
// are those of this discrete energy, exactly; the Hessian is a periodic pentadiagonal matrix P plus, when held,
// the dense rank-one part Ŷ (∇ε̄)(∇ε̄)ᵀ. Newton's method with a backtracking line search minimises it; Newton systems
// are solved by a hand-written Cholesky factorisation of an equivalent banded matrix in O(n) (a dense factorisation
// of the held Hessian takes ~0.1 s at n = 1024, and a threshold computation needs ~1600 Newton steps; see
// Grating1DModel::newton_step()). A state counts as a stable minimum only if it converged with an unshifted,
// positive definite Hessian.
//
// Conformed fraction: the share of the period where g ≤ g*, with g interpolated linearly between nodes (so the
// fraction varies continuously with the state).
//
// Thresholds in Γ (the library implements the same definitions, see nappe/analysis/adhesion_limits.h):
//  - Downward path: the grown-conformal state (normal gap h₀, or vertical gap h₀) minimised at Γ_hi, then Γ lowered
//    in warm-started steps down to Γ_lo, through any jumps. Upward path: the flat sheet w = max s + h₀ minimised at
//    Γ_lo, then Γ raised up to Γ_hi.
//  - A step is accepted if Newton reaches a certified stable minimum (unshifted Cholesky succeeds) and the state
//    stayed on its branch (fraction change ≤ 0.02 and max |Δw| ≤ h₀) and the fraction did not cross the target.
//    Otherwise the step is halved; once it is ≤ tol·Γ the jump (snap) or crossing is accepted and bracketed.
//  - Γ_hold: where the fraction first falls below the target on the downward path (the fold of the conformed
//    branch, or a continuous crossing). Γ_snap: the smallest Γ at which the fraction reaches the target on the
//    upward path. Γ_eq (Maxwell point): where the conformed branch (downward path before its first jump or target
//    crossing) and the least-conformed branch (upward path before its first jump or target crossing) have equal
//    energy. Along a branch of minima dE/dΓ = E_adh/Γ (envelope theorem: φ is proportional to Γ), so each branch's
//    E(Γ) is interpolated by cubic Hermite polynomials between its points and the root of the difference is
//    bisected where both exist. So defined, Γ_hold ≤ Γ_eq ≤ Γ_snap whenever Γ_eq is found; a bistable window wholly
//    below the target (both folds join partially conformed states, seen for A ≈ h₀) has no Γ_eq at the target level.

#include <algorithm>
#include <cmath>
#include <cstddef>
#include <initializer_list>
#include <limits>
#include <stdexcept>
#include <string>
#include <utility>
#include <vector>

namespace nappe::reference
{
  namespace internal
  {
    constexpr double pi = 3.14159265358979323846;
  }

  /// The grating, the sheet and the discretisation.
  struct Grating1DParameters
  {
    double A;               ///< grating amplitude [m]
    double k;               ///< grating wave number 2π/L [1/m]
    double D;               ///< bending rigidity [J]
    double Y;               ///< 2D Young's modulus [N/m]
    double nu;              ///< Poisson's ratio [-]
    double h0;              ///< equilibrium gap of the 9-3 law [m]
    bool normal_gap = true; ///< gap measured along the substrate normal (else vertically)
    bool held = false;      ///< the sheet cannot slide in (else free to slide)
    unsigned int n = 1024;  ///< nodes per period
  };

  /// φ, φ' and φ'' of the regularised 9-3 law at gap g [m] for work of adhesion Γ [J/m²].
  struct AdhesionValue
  {
    double phi, dphi, d2phi;
  };

  inline AdhesionValue vdw93(const double g, const double gamma, const double h0)
  {
    const double g_c = 0.5 * h0;
    if (g >= g_c)
      {
        const double x = h0 / g, x3 = x * x * x, x9 = x3 * x3 * x3;
        return {-gamma * (1.5 * x3 - 0.5 * x9), 4.5 * gamma / g * (x3 - x9),
                4.5 * gamma / (g * g) * (10.0 * x9 - 4.0 * x3)};
      }
    const AdhesionValue c = vdw93(g_c, gamma, h0);
    const double dg = g - g_c;
    return {c.phi + dg * (c.dphi + 0.5 * c.d2phi * dg), c.dphi + c.d2phi * dg, c.d2phi};
  }

  /// Gap of peak attractive traction of the 9-3 law, g* = (5/2)^{1/6} h₀ [m].
  inline double peak_traction_gap(const double h0) { return std::pow(2.5, 1.0 / 6.0) * h0; }

  /// Energy per projected area [J/m²] of a discrete state, by parts, with the mean membrane strain.
  struct Grating1DEnergy
  {
    double total = 0, bending = 0, stretching = 0, adhesion = 0;
    double membrane_strain = 0; ///< ε̄ = ⟨½w'²⟩ if held, 0 if free to slide (the sheet slides in) [-]
  };

  /// Hessian of the discrete energy E(w): the periodic pentadiagonal P (entries (i, i), (i, i+1), (i, i+2), indices
  /// mod n) plus rank_one_weight · b bᵀ with b = ∇ε̄ (held only; weight 0 otherwise). Used by tests; the solver
  /// factorises an equivalent banded matrix instead (see Grating1DModel::newton_step()).
  struct Grating1DHessian
  {
    std::vector<double> diagonal, first_off, second_off;
    double rank_one_weight = 0;
    std::vector<double> rank_one_vector;

    double entry(const std::size_t i, const std::size_t j) const
    {
      const std::size_t n = diagonal.size(), lo = std::min(i, j), d = std::max(i, j) - lo;
      double band = 0;
      if (d == 0)
        band = diagonal[i];
      else if (d == 1 || d == n - 1)
        band = first_off[d == 1 ? lo : std::max(i, j)];
      else if (d == 2 || d == n - 2)
        band = second_off[d == 2 ? lo : std::max(i, j)];
      return band + rank_one_weight * rank_one_vector[i] * rank_one_vector[j];
    }

    std::vector<double> multiply(const std::vector<double> &v) const
    {
      const std::size_t n = v.size();
      double bv = 0;
      for (std::size_t i = 0; i < n; ++i)
        bv += rank_one_vector[i] * v[i];
      std::vector<double> r(n);
      for (std::size_t i = 0; i < n; ++i)
        {
          const std::size_t p1 = (i + 1) % n, p2 = (i + 2) % n, m1 = (i + n - 1) % n, m2 = (i + n - 2) % n;
          r[i] = diagonal[i] * v[i] + first_off[i] * v[p1] + first_off[m1] * v[m1] + second_off[i] * v[p2] +
                 second_off[m2] * v[m2] + rank_one_weight * rank_one_vector[i] * bv;
        }
      return r;
    }
  };

  namespace internal
  {
    // Symmetric matrix stored by its lower envelope: row i holds columns first[i]..i. Cholesky fills only inside
    // the envelope, so a banded matrix with a few full rows (the periodic wrap-around) factorises in O(n), and
    // first[i] = 0 everywhere is an ordinary dense matrix.
    struct EnvelopeMatrix
    {
      std::vector<std::size_t> first, offset;
      std::vector<double> values;

      explicit EnvelopeMatrix(std::vector<std::size_t> first_column) : first(std::move(first_column))
      {
        std::size_t size = 0;
        for (std::size_t i = 0; i < first.size(); ++i)
          {
            offset.push_back(size);
            size += i - first[i] + 1;
          }
        values.assign(size, 0.0);
      }
      double &operator()(const std::size_t i, const std::size_t j) { return values[offset[i] + j - first[i]]; }
      double operator()(const std::size_t i, const std::size_t j) const { return values[offset[i] + j - first[i]]; }
    };

    // In-place Cholesky A = L Lᵀ, row by row. Returns false (leaving garbage) if A is not positive definite.
    inline bool cholesky(EnvelopeMatrix &a)
    {
      for (std::size_t i = 0; i < a.first.size(); ++i)
        for (std::size_t j = a.first[i]; j <= i; ++j)
          {
            double s = a(i, j);
            for (std::size_t k = std::max(a.first[i], a.first[j]); k < j; ++k)
              s -= a(i, k) * a(j, k);
            if (j < i)
              a(i, j) = s / a(j, j);
            else if (s > 0.0 && std::isfinite(s))
              a(i, i) = std::sqrt(s);
            else
              return false;
          }
      return true;
    }

    // Solves L Lᵀ x = r in place with the factor from cholesky().
    inline void cholesky_solve(const EnvelopeMatrix &l, std::vector<double> &x)
    {
      for (std::size_t i = 0; i < x.size(); ++i)
        {
          for (std::size_t k = l.first[i]; k < i; ++k)
            x[i] -= l(i, k) * x[k];
          x[i] /= l(i, i);
        }
      for (std::size_t i = x.size(); i-- > 0;)
        {
          x[i] /= l(i, i);
          for (std::size_t k = l.first[i]; k < i; ++k)
            x[k] -= l(i, k) * x[i];
        }
    }

    // The Hessian of E(w) as a dense matrix, for checking the banded solver (O(n³) to factorise).
    inline EnvelopeMatrix dense(const Grating1DHessian &h)
    {
      const std::size_t n = h.diagonal.size();
      EnvelopeMatrix m(std::vector<std::size_t>(n, 0));
      for (std::size_t i = 0; i < n; ++i)
        for (std::size_t j = 0; j <= i; ++j)
          m(i, j) = h.entry(i, j);
      return m;
    }

    inline double max_abs(const std::vector<double> &v)
    {
      double m = 0;
      for (const double x : v)
        m = std::max(m, std::abs(x));
      return m;
    }

    inline double dot(const std::vector<double> &a, const std::vector<double> &b)
    {
      double s = 0;
      for (std::size_t i = 0; i < a.size(); ++i)
        s += a[i] * b[i];
      return s;
    }
  } // namespace internal

  /// Controls of the Newton iteration.
  struct NewtonSettings
  {
    /// Converged when an unshifted Newton step is at most this times h₀. A plain gradient norm would be limited by
    /// round-off in the fourth differences (relative ~1e-8 at n = 1024, growing as n⁴); the Newton step is the
    /// gradient measured in the inverse-Hessian norm, which damps that high-frequency noise. Common practice, no
    /// source; quadratic convergence makes the final error ~(1e-9)² h₀.
    double step_tolerance = 1e-9;
    /// No iterate moves any node by more than this times h₀ (a trust region for starts far from a minimum).
    double largest_step = 1.0;
    unsigned int max_iterations = 500;
  };

  /// Outcome of Grating1DModel::minimise().
  struct MinimiseResult
  {
    bool stable_minimum = false; ///< converged with an unshifted, positive definite Hessian (Cholesky succeeded)
    unsigned int iterations = 0;
    double residual = 0; ///< n·max|∂E/∂w_i| / (Γ/h₀) at the end: the largest nodal force over the adhesion scale [-]
  };

  /// The discrete model of one period of the grating.
  class Grating1DModel
  {
  public:
    explicit Grating1DModel(const Grating1DParameters &parameters) : p(parameters)
    {
      if (!(p.A >= 0 && p.k > 0 && p.D > 0 && p.Y > 0 && p.nu > -1 && p.nu < 0.5 && p.h0 > 0 && p.n >= 8))
        throw std::invalid_argument("Grating1DModel: expected A >= 0, k, D, Y, h0 > 0, -1 < nu < 0.5 and n >= 8");
      dx = 2.0 * internal::pi / p.k / p.n;
      y_hat = p.Y / (1.0 - p.nu * p.nu);
      for (unsigned int i = 0; i < p.n; ++i)
        {
          const double slope = -p.A * p.k * std::sin(p.k * i * dx);
          s.push_back(p.A * std::cos(p.k * i * dx));
          gap_factor.push_back(p.normal_gap ? 1.0 / std::sqrt(1.0 + slope * slope) : 1.0);
        }
      envelope = system_envelope();
    }

    const Grating1DParameters &parameters() const { return p; }
    double spacing() const { return dx; }
    double position(const std::size_t i) const { return double(i) * dx; }
    double substrate(const std::size_t i) const { return s[i]; }
    double gap(const std::vector<double> &w, const std::size_t i) const { return (w[i] - s[i]) * gap_factor[i]; }

    /// The sheet on the substrate at the equilibrium gap h₀ (in the chosen gap measure).
    std::vector<double> grown_conformal_state() const
    {
      std::vector<double> w(p.n);
      for (std::size_t i = 0; i < p.n; ++i)
        w[i] = s[i] + p.h0 / gap_factor[i];
      return w;
    }

    /// The flat sheet resting on the crests, w = max s + h₀.
    std::vector<double> flat_state() const { return std::vector<double>(p.n, p.A + p.h0); }

    Grating1DEnergy energy(const std::vector<double> &w, const double gamma) const
    {
      Grating1DEnergy e;
      for (std::size_t i = 0; i < p.n; ++i)
        {
          const double kappa = curvature(w, i), slope = (w[next(i)] - w[i]) / dx;
          e.bending += 0.5 * p.D * kappa * kappa;
          e.adhesion += vdw93(gap(w, i), gamma, p.h0).phi;
          e.membrane_strain += 0.5 * slope * slope;
        }
      e.bending /= p.n;
      e.adhesion /= p.n;
      e.membrane_strain = p.held ? e.membrane_strain / p.n : 0.0;
      e.stretching = 0.5 * y_hat * e.membrane_strain * e.membrane_strain;
      e.total = e.bending + e.stretching + e.adhesion;
      return e;
    }

    /// ∂E/∂w_i of the discrete energy per area (E in J/m², w_i in m).
    std::vector<double> gradient(const std::vector<double> &w, const double gamma) const
    {
      std::vector<double> kappa(p.n), g(p.n);
      for (std::size_t i = 0; i < p.n; ++i)
        kappa[i] = curvature(w, i);
      // ∂ε̄/∂w_i = −κ_i/n, multiplied by the membrane tension Ŷε̄.
      const double tension = y_hat * energy(w, gamma).membrane_strain;
      for (std::size_t i = 0; i < p.n; ++i)
        g[i] = (p.D * (kappa[next(i)] - 2.0 * kappa[i] + kappa[prev(i)]) / (dx * dx) +
                vdw93(gap(w, i), gamma, p.h0).dphi * gap_factor[i] - tension * kappa[i]) /
               p.n;
      return g;
    }

    /// ∂²E/∂w_i∂w_j of the discrete energy per area.
    Grating1DHessian hessian(const std::vector<double> &w, const double gamma) const
    {
      const double bend = p.D / (p.n * dx * dx * dx * dx);
      const double tension = y_hat * energy(w, gamma).membrane_strain / (p.n * dx * dx);
      Grating1DHessian h;
      for (std::size_t i = 0; i < p.n; ++i)
        {
          const double c = gap_factor[i];
          h.diagonal.push_back(6.0 * bend + 2.0 * tension + vdw93(gap(w, i), gamma, p.h0).d2phi * c * c / p.n);
          h.first_off.push_back(-4.0 * bend - tension);
          h.second_off.push_back(bend);
          h.rank_one_vector.push_back(p.held ? -curvature(w, i) / p.n : 0.0);
        }
      h.rank_one_weight = p.held ? y_hat : 0.0;
      return h;
    }

    /// Share of the period with g ≤ g*, g linear between nodes [-].
    double conformed_fraction(const std::vector<double> &w) const
    {
      const double g_star = peak_traction_gap(p.h0);
      double conformed = 0;
      for (std::size_t i = 0; i < p.n; ++i)
        {
          const double a = gap(w, i) - g_star, b = gap(w, next(i)) - g_star;
          if (a <= 0 && b <= 0)
            conformed += 1.0;
          else if (a <= 0) // g crosses g* inside the interval: the part next to node i is conformed
            conformed += a / (a - b);
          else if (b <= 0) // the part next to node i + 1
            conformed += b / (b - a);
        }
      return conformed / p.n;
    }

    /// Solves (H + σI) δ = −∇E for the Newton step δ at state w; returns false if H + σI is not positive definite.
    ///
    /// Free to slide, H = P is periodic pentadiagonal and is factorised directly. Held, H = P + Ŷ b bᵀ is dense;
    /// instead the in-plane displacements are put back as unknowns: with strains e_i = (u_{i+1} − u_i)/Δx + ½ t_i²,
    /// t_i = (w_{i+1} − w_i)/Δx, the energy F(u, w) = (1/n) Σ [½Dκ_i² + φ(g_i) + ½Ŷ e_i²] has E(w) = min_u F
    /// (the minimiser over periodic u makes every e_i = ε̄), and its Hessian K at that minimiser is banded (with
    /// u₀ = 0 fixing the rigid translation, the u-block is positive definite). By the Schur complement,
    /// H = K_ww − K_wu K_uu⁻¹ K_uw, so K + σ(w-block) is positive definite iff H + σI is, and the w-part of
    /// K⁻¹(0, −∇E) is the Newton step. K at the minimiser needs only e_i = ε̄ and t_i, never u itself.
    bool newton_step(const std::vector<double> &w, const double gamma, const double shift,
                     std::vector<double> &step) const
    {
      internal::EnvelopeMatrix k(envelope);
      assemble_system(w, gamma, shift, [&k](std::size_t r, std::size_t c, double v) {
        k(std::max(r, c), std::min(r, c)) += v;
      });
      if (!internal::cholesky(k))
        return false;
      const std::vector<double> g = gradient(w, gamma);
      std::vector<double> x(n_unknowns(), 0.0);
      for (std::size_t i = 0; i < p.n; ++i)
        x[w_index(i)] = -g[i];
      internal::cholesky_solve(k, x);
      step.resize(p.n);
      for (std::size_t i = 0; i < p.n; ++i)
        step[i] = x[w_index(i)];
      return true;
    }

    /// Minimises the energy at Γ [J/m²] from w (overwritten with the last iterate) by Newton's method with a
    /// backtracking line search; where the Hessian is not positive definite it is shifted by σI (σ from a small
    /// fraction of the adhesion stiffness per node, 27Γ/(h₀² n), growing tenfold) to obtain a descent direction.
    MinimiseResult minimise(std::vector<double> &w, const double gamma, const NewtonSettings &settings = {}) const
    {
      MinimiseResult result;
      std::vector<double> step;
      const double first_shift = 1e-6 * 27.0 * gamma / (p.h0 * p.h0 * p.n);
      for (result.iterations = 1; result.iterations <= settings.max_iterations; ++result.iterations)
        {
          double shift = 0;
          while (!newton_step(w, gamma, shift, step))
            {
              shift = (shift == 0) ? first_shift : 10.0 * shift;
              if (!std::isfinite(shift))
                throw std::runtime_error("Grating1DModel: no shift makes the Hessian positive definite");
            }
          if (shift == 0 && internal::max_abs(step) <= settings.step_tolerance * p.h0)
            {
              for (std::size_t i = 0; i < p.n; ++i)
                w[i] += step[i];
              result.stable_minimum = true;
              break;
            }
          if (!line_search(w, gamma, step, settings.largest_step * p.h0))
            break;
        }
      result.iterations = std::min(result.iterations, settings.max_iterations);
      result.residual = p.n * internal::max_abs(gradient(w, gamma)) * p.h0 / gamma;
      return result;
    }

  private:
    std::size_t next(const std::size_t i) const { return (i + 1) % p.n; }
    std::size_t prev(const std::size_t i) const { return (i + p.n - 1) % p.n; }
    double curvature(const std::vector<double> &w, const std::size_t i) const
    {
      return (w[next(i)] - 2.0 * w[i] + w[prev(i)]) / (dx * dx);
    }

    // Unknowns of the Newton system: w only, or, held, (w₀, u₁, w₁, u₂, w₂, …) interleaved to keep K banded.
    std::size_t n_unknowns() const { return p.held ? 2 * p.n - 1 : p.n; }
    std::size_t w_index(const std::size_t i) const { return p.held ? 2 * i : i; }
    static constexpr std::size_t pinned = std::numeric_limits<std::size_t>::max();
    std::size_t u_index(const std::size_t i) const { return i == 0 ? pinned : 2 * i - 1; }

    // Adds weight · a aᵀ (one triangle) for a sparse vector a of (index, value) pairs with distinct indices (true
    // for n >= 8) through add(row, column, value); pinned unknowns are skipped.
    template <class Add>
    static void add_outer(Add &add, const std::initializer_list<std::pair<std::size_t, double>> list,
                          const double weight)
    {
      const std::pair<std::size_t, double> *a = list.begin();
      for (std::size_t r = 0; r < list.size(); ++r)
        for (std::size_t c = 0; c <= r; ++c)
          if (a[r].first != pinned && a[c].first != pinned)
            add(a[r].first, a[c].first, weight * a[r].second * a[c].second);
    }

    // Visits the entries of the matrix K of newton_step() (summed where they repeat): bending, adhesion and the
    // shift σ on w, and, held, the stretching of every interval, ½Ŷ e_i² with Hessian Ŷ(∇e_i ∇e_iᵀ + e_i ∇²e_i)
    // at e_i = ε̄.
    template <class Add>
    void assemble_system(const std::vector<double> &w, const double gamma, const double shift, Add &&add) const
    {
      const double eps = energy(w, gamma).membrane_strain, c_bend = p.D / (p.n * dx * dx * dx * dx),
                   c_stretch = y_hat / (p.n * dx * dx);
      for (std::size_t i = 0; i < p.n; ++i)
        {
          const std::size_t j = next(i);
          add_outer(add, {{w_index(prev(i)), 1.0}, {w_index(i), -2.0}, {w_index(j), 1.0}}, c_bend);
          const double c = gap_factor[i];
          add(w_index(i), w_index(i), vdw93(gap(w, i), gamma, p.h0).d2phi * c * c / p.n + shift);
          if (p.held)
            {
              const double t = (w[j] - w[i]) / dx;
              add_outer(add, {{u_index(i), -1.0}, {u_index(j), 1.0}, {w_index(i), -t}, {w_index(j), t}}, c_stretch);
              add_outer(add, {{w_index(i), 1.0}, {w_index(j), -1.0}}, c_stretch * eps);
            }
        }
    }

    // The envelope of K (first column of each row), from one pass over its entries with zero values.
    std::vector<std::size_t> system_envelope() const
    {
      std::vector<std::size_t> first(n_unknowns());
      for (std::size_t i = 0; i < first.size(); ++i)
        first[i] = i;
      assemble_system(std::vector<double>(p.n, p.h0), 1.0, 0.0, [&](std::size_t r, std::size_t c, double) {
        first[std::max(r, c)] = std::min(first[std::max(r, c)], std::min(r, c));
      });
      return first;
    }

    // Backtracking on the energy with the Armijo condition; near convergence the predicted decrease falls below
    // the round-off of E, so a step that does not raise E by more than that round-off is accepted.
    bool line_search(std::vector<double> &w, const double gamma, const std::vector<double> &step,
                     const double largest_step) const
    {
      const double e0 = energy(w, gamma).total, slope = internal::dot(gradient(w, gamma), step);
      if (!(slope < 0))
        return false;
      const double roundoff = 1e-14 * (std::abs(e0) + gamma);
      std::vector<double> trial(p.n);
      for (double alpha = std::min(1.0, largest_step / internal::max_abs(step)); alpha > 1e-12; alpha *= 0.5)
        {
          for (std::size_t i = 0; i < p.n; ++i)
            trial[i] = w[i] + alpha * step[i];
          const double e = energy(trial, gamma).total;
          if (std::isfinite(e) && e <= e0 + 1e-4 * alpha * slope + roundoff)
            {
              w = trial;
              return true;
            }
        }
      return false;
    }

    Grating1DParameters p;
    double dx, y_hat;
    std::vector<double> s, gap_factor; // substrate height and ∂g/∂w at the nodes
    std::vector<std::size_t> envelope;  // of the Newton matrix K
  };

  /// One accepted state of a path, per projected area.
  struct PathPoint
  {
    double gamma = 0;           ///< Γ [J/m²]
    double fraction = 0;        ///< conformed fraction [-]
    double energy = 0;          ///< total energy per area [J/m²]
    double bending = 0;         ///< [J/m²]
    double stretching = 0;      ///< [J/m²]
    double adhesion = 0;        ///< [J/m²]
    double membrane_strain = 0; ///< ε̄ (held), 0 (free to slide) [-]
    bool after_jump = false;    ///< reached from the previous point by a jump: the branch ended in between
    unsigned int newton_iterations = 0;
  };

  /// A threshold located to a bracket [lo, hi] of Γ [J/m²].
  struct Threshold
  {
    bool found = false;
    bool at_jump = false; ///< located at a jump (fold) rather than at a continuous crossing
    double lo = 0, hi = 0;
    double value() const { return 0.5 * (lo + hi); }
  };

  /// Both paths and the three thresholds.
  struct Grating1DThresholds
  {
    Threshold hold, snap, eq;
    /// The first jump of each path: where the conformed branch ends (downward) and where the least-conformed branch
    /// ends (upward). They coincide with hold and snap only when the target is crossed at a jump.
    Threshold conformed_fold, laid_down_fold;
    std::vector<PathPoint> down, up; ///< in path order (Γ decreasing, increasing)
    unsigned int minimisations = 0, newton_iterations = 0;
  };

  /// Controls of path following.
  struct PathSettings
  {
    double target = 0.99;                   ///< conformed fraction that counts as conformed [-]
    double rel_tol = 1e-3;                  ///< jumps and crossings are bracketed to hi − lo ≤ rel_tol·lo [-]
    double initial_step = 0.02;             ///< first relative step in Γ [-]
    /// Largest relative step in Γ [-]. Small enough that the cubic Hermite interpolation of E(Γ) between points
    /// is far more accurate than rel_tol (its error is O(step⁴)); common practice, no source.
    double largest_step = 0.05;
    double largest_fraction_change = 0.02;  ///< continuity test on the conformed fraction [-]
    double largest_deflection_change = 1.0; ///< continuity test on max |Δw|, in units of h₀ [-]
  };

  namespace internal
  {
    inline PathPoint make_point(const Grating1DModel &model, const std::vector<double> &w, const double gamma)
    {
      const Grating1DEnergy e = model.energy(w, gamma);
      PathPoint point;
      point.gamma = gamma;
      point.fraction = model.conformed_fraction(w);
      point.energy = e.total;
      point.bending = e.bending;
      point.stretching = e.stretching;
      point.adhesion = e.adhesion;
      point.membrane_strain = e.membrane_strain;
      return point;
    }

    struct Path
    {
      std::vector<PathPoint> points;
      Threshold crossing; // first crossing of the target in the direction of the path's purpose
      Threshold fold;     // first jump
      unsigned int minimisations = 0, newton_iterations = 0;
    };

    inline void count(Path &path, const MinimiseResult &r)
    {
      ++path.minimisations;
      path.newton_iterations += r.iterations;
    }

    inline double max_difference(const std::vector<double> &a, const std::vector<double> &b)
    {
      double m = 0;
      for (std::size_t i = 0; i < a.size(); ++i)
        m = std::max(m, std::abs(a[i] - b[i]));
      return m;
    }

    // Follows the minima from w at gamma_start to gamma_end (either direction), warm-starting each step. A step is
    // halved while it leaves the branch or crosses the target and is still longer than rel_tol·Γ; at that length a
    // jump or crossing is accepted, so its bracket is narrower than the tolerance.
    inline Path follow(const Grating1DModel &model, std::vector<double> w, const double gamma_start,
                       const double gamma_end, const PathSettings &settings)
    {
      const bool down = gamma_end < gamma_start;
      const double h0 = model.parameters().h0;
      Path path;
      MinimiseResult r = model.minimise(w, gamma_start);
      count(path, r);
      if (!r.stable_minimum)
        throw std::runtime_error("grating_1d: no stable minimum at the start of the path, Gamma = " +
                                 std::to_string(gamma_start) + " J/m^2");
      path.points.push_back(make_point(model, w, gamma_start));
      path.points.back().newton_iterations = r.iterations;
      double step = settings.initial_step;
      while (path.points.back().gamma != gamma_end)
        {
          const PathPoint &last = path.points.back();
          const double gamma = down ? std::max(gamma_end, last.gamma * (1.0 - step))
                                    : std::min(gamma_end, last.gamma * (1.0 + step));
          std::vector<double> trial = w;
          r = model.minimise(trial, gamma);
          count(path, r);
          PathPoint point = make_point(model, trial, gamma);
          const bool continuous = r.stable_minimum &&
                                  std::abs(point.fraction - last.fraction) <= settings.largest_fraction_change &&
                                  max_difference(trial, w) <= settings.largest_deflection_change * h0;
          const bool crosses = (point.fraction >= settings.target) != (last.fraction >= settings.target);
          const bool refinable = std::abs(gamma - last.gamma) > settings.rel_tol * std::min(gamma, last.gamma);
          if (refinable && (!continuous || crosses))
            {
              step *= 0.5;
              continue;
            }
          if (!r.stable_minimum)
            throw std::runtime_error("grating_1d: Newton found no stable minimum at Gamma = " +
                                     std::to_string(gamma) + " J/m^2 even with the shortest step");
          point.after_jump = !continuous;
          point.newton_iterations = r.iterations;
          const bool wanted = down ? (last.fraction >= settings.target && point.fraction < settings.target)
                                   : (last.fraction < settings.target && point.fraction >= settings.target);
          const Threshold bracket{true, point.after_jump, std::min(gamma, last.gamma), std::max(gamma, last.gamma)};
          if (wanted && !path.crossing.found)
            path.crossing = bracket;
          if (point.after_jump && !path.fold.found)
            path.fold = bracket;
          path.points.push_back(point);
          w = std::move(trial);
          step = std::min(1.5 * step, settings.largest_step);
        }
      return path;
    }

    // The points of a path before its first jump, sorted by increasing Γ. For the downward path this is the
    // conformed branch "before its first jump below the target": a jump that stays at or above the target would have
    // to be flagged by |Δw| alone (|Δf| ≤ 1 − target < 0.02), which has not been seen; cutting at any jump keeps
    // the Hermite interpolation from spanning one.
    inline std::vector<PathPoint> branch(const std::vector<PathPoint> &points, const double target, const bool conformed)
    {
      std::vector<PathPoint> b;
      for (const PathPoint &point : points)
        {
          if (point.after_jump || (point.fraction >= target) != conformed)
            break;
          b.push_back(point);
        }
      std::sort(b.begin(), b.end(), [](const PathPoint &x, const PathPoint &y) { return x.gamma < y.gamma; });
      return b;
    }

    // Cubic Hermite interpolation of E(Γ) on a branch with the exact slopes dE/dΓ = E_adh/Γ.
    inline double branch_energy(const std::vector<PathPoint> &b, const double gamma)
    {
      std::size_t j = 1;
      while (j + 1 < b.size() && b[j].gamma < gamma)
        ++j;
      const PathPoint &p0 = b[j - 1], &p1 = b[j];
      const double h = p1.gamma - p0.gamma, t = (gamma - p0.gamma) / h;
      const double h00 = (1 + 2 * t) * (1 - t) * (1 - t), h10 = t * (1 - t) * (1 - t), h01 = t * t * (3 - 2 * t),
                   h11 = t * t * (t - 1);
      return h00 * p0.energy + h10 * h * p0.adhesion / p0.gamma + h01 * p1.energy + h11 * h * p1.adhesion / p1.gamma;
    }

    // The Maxwell point: root of E_conformed − E_least on the Γ interval where both branches exist, bisected to
    // hi − lo ≤ rel_tol·lo. The conformed branch is the downward path before its first jump or target crossing
    // (fraction ≥ target), the least-conformed branch the upward path before its first jump or target crossing
    // (fraction < target); so restricted, Γ_hold ≤ Γ_eq ≤ Γ_snap whenever Γ_eq is found. Not found if the branches
    // do not coexist or the difference keeps its sign.
    inline Threshold maxwell_point(const std::vector<PathPoint> &down, const std::vector<PathPoint> &up,
                                   const double target, const double rel_tol)
    {
      Threshold eq;
      const std::vector<PathPoint> conformed = branch(down, target, true), least = branch(up, target, false);
      if (conformed.size() < 2 || least.size() < 2)
        return eq;
      double lo = std::max(conformed.front().gamma, least.front().gamma);
      double hi = std::min(conformed.back().gamma, least.back().gamma);
      const auto difference = [&](const double gamma) {
        return branch_energy(conformed, gamma) - branch_energy(least, gamma);
      };
      if (!(lo < hi) || (difference(lo) > 0) == (difference(hi) > 0))
        return eq;
      const bool rising = difference(lo) < 0;
      while (hi - lo > rel_tol * lo)
        {
          const double mid = 0.5 * (lo + hi);
          ((difference(mid) < 0) == rising ? lo : hi) = mid;
        }
      eq.found = true;
      eq.lo = lo;
      eq.hi = hi;
      return eq;
    }
  } // namespace internal

  /// Follows the downward path from the grown-conformal state at Γ_hi and the upward path from the flat sheet at
  /// Γ_lo [J/m²] and locates Γ_hold, Γ_snap and Γ_eq as defined at the top of this file. Throws std::runtime_error if
  /// Newton finds no stable minimum where one is required.
  inline Grating1DThresholds grating_1d_thresholds(const Grating1DParameters &parameters, const double gamma_lo,
                                                   const double gamma_hi, const PathSettings &settings)
  {
    if (!(gamma_lo > 0 && gamma_hi > gamma_lo && settings.target > 0 && settings.target <= 1 &&
          settings.rel_tol > 0 && settings.initial_step > 0 && settings.largest_step >= settings.initial_step))
      throw std::invalid_argument("grating_1d_thresholds: expected 0 < gamma_lo < gamma_hi, 0 < target <= 1, "
                                  "rel_tol > 0 and 0 < initial_step <= largest_step");
    const Grating1DModel model(parameters);
    const internal::Path down = internal::follow(model, model.grown_conformal_state(), gamma_hi, gamma_lo, settings);
    const internal::Path up = internal::follow(model, model.flat_state(), gamma_lo, gamma_hi, settings);
    Grating1DThresholds result;
    result.hold = down.crossing;
    result.snap = up.crossing;
    result.conformed_fold = down.fold;
    result.laid_down_fold = up.fold;
    result.eq = internal::maxwell_point(down.points, up.points, settings.target, settings.rel_tol);
    result.down = down.points;
    result.up = up.points;
    result.minimisations = down.minimisations + up.minimisations;
    result.newton_iterations = down.newton_iterations + up.newton_iterations;
    return result;
  }

  /// The same with the default step control, the target conformed fraction and the relative tolerance.
  inline Grating1DThresholds grating_1d_thresholds(const Grating1DParameters &parameters, const double gamma_lo,
                                                   const double gamma_hi, const double target = 0.99,
                                                   const double rel_tol = 1e-3)
  {
    PathSettings settings;
    settings.target = target;
    settings.rel_tol = rel_tol;
    return grating_1d_thresholds(parameters, gamma_lo, gamma_hi, settings);
  }
} // namespace nappe::reference

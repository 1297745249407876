// MoreSorensenSubproblem (solvers/trust_region_step.h) against trust-region subproblems whose
// solution is known in closed form.
//
// Where H is indefinite: the two-dimensional subspace step where a direction of negative curvature is
// known (checked against a sampled plane, the Cauchy point and the step along it), else a shifted
// step or Moré–Sorensen's iteration (checked against the Cauchy point, and against the optimum where
// the factor below applies); where H is positive definite and the Newton step is too long, Powell's
// dogleg (checked against the Cauchy point and the optimum).
//
// The matrix is the shifted 1D Dirichlet Laplacian H = tridiag(−1, 2, −1)/h² − σI, n unknowns,
// h = 1/(n+1), with eigenvalues μ_k = (4/h²) sin²(kπ/(2(n+1))) − σ and orthonormal eigenvectors
// v_k(i) = √(2/(n+1)) sin(k(i+1)π/(n+1)) (G. Strang, Linear Algebra and its Applications, 4th ed.,
// 2006; Y. Saad, Iterative Methods for Sparse Linear Systems, 2nd ed., SIAM 2003, §2.2). The scaling is
// S = I and the gradient g = Σ a_k v_k with chosen a_k, so that the optimum of
//
//     min gᵀp + ½pᵀHp  subject to  ‖p‖ ≤ Δ
//
// follows from the spectral sums of J. J. Moré & D. C. Sorensen, SIAM J. Sci. Stat. Comput. 4, 553
// (1983), Lemma 2.1/2.3: p(λ) = −Σ a_k/(μ_k + λ) v_k with λ ≥ max(0, −μ₁) and ‖p(λ)‖ = Δ (λ found
// here by bisection on the sum, independently of any factorisation), or, in the hard case
// (a₁ = 0 and ‖p(−μ₁)‖ < Δ), p(−μ₁) + τv₁ with ‖p‖ = Δ. The method stops when ‖p‖ is within
// (1 ± σ₁)Δ, σ₁ = 0.1 (their value), and then the model decrease is within a factor (1 − σ₁)² of the
// optimal one (Moré & Sorensen 1983, §3, from memory): the tests require that factor.
#include <nappe/solvers/trust_region_step.h>

#include <deal.II/base/mpi.h>
#include <deal.II/lac/trilinos_sparsity_pattern.h>

#include <gtest/gtest.h>

#include <cmath>
#include <functional>
#include <vector>

using namespace nappe;

namespace
{
  const MPI_Comm     comm     = MPI_COMM_WORLD;
  const unsigned int n        = 60;
  const double       h        = 1.0 / (n + 1);
  const double       accuracy = 0.1; // σ₁ of Moré & Sorensen (1983)

  double laplacian_eigenvalue(unsigned int k) { return 4.0 / (h * h) * std::pow(std::sin(k * M_PI / (2.0 * (n + 1))), 2); }
  double eigenvector_entry(unsigned int k, unsigned int i) { return std::sqrt(2.0 / (n + 1)) * std::sin(k * (i + 1) * M_PI / (n + 1)); }

  /// The subproblem data with a closed-form spectrum.
  struct Subproblem
  {
    SparseMatrix        H;         ///< handed to the subproblem, which shifts it in place
    SparseMatrix        reference; ///< H kept unshifted, to evaluate the model
    Vector              gradient, weights, seed;
    std::vector<double> mu, a; ///< eigenvalues of H and the gradient's coefficients (index k − 1)
  };

  void make(Subproblem &s, double sigma, const std::function<double(unsigned int)> &coefficient)
  {
    const dealii::IndexSet            owned = dealii::Utilities::MPI::create_evenly_distributed_partitioning(comm, n);
    dealii::TrilinosWrappers::SparsityPattern sp(owned, comm);
    for (const auto i : owned)
      for (unsigned int j = (i > 0 ? i - 1 : 0); j <= std::min(n - 1, static_cast<unsigned int>(i) + 1); ++j)
        sp.add(i, j);
    sp.compress();
    for (SparseMatrix *A : {&s.H, &s.reference})
      {
        A->reinit(sp);
        for (const auto i : owned)
          {
            A->set(i, i, 2.0 / (h * h) - sigma);
            if (i > 0)
              A->set(i, i - 1, -1.0 / (h * h));
            if (i + 1 < n)
              A->set(i, i + 1, -1.0 / (h * h));
          }
        A->compress(dealii::VectorOperation::insert);
      }
    s.gradient.reinit(owned, comm);
    s.weights.reinit(owned, comm);
    s.seed.reinit(owned, comm);
    for (unsigned int k = 1; k <= n; ++k)
      {
        s.mu.push_back(laplacian_eigenvalue(k) - sigma);
        s.a.push_back(coefficient(k));
      }
    for (const auto i : owned)
      {
        double g = 0.0;
        for (unsigned int k = 1; k <= n; ++k)
          g += s.a[k - 1] * eigenvector_entry(k, i);
        s.gradient(i) = g;
        s.weights(i)  = 1.0;
        s.seed(i)     = 1.0;
      }
    for (Vector *v : {&s.gradient, &s.weights, &s.seed})
      v->compress(dealii::VectorOperation::insert);
  }

  /// ‖p(λ)‖² and m(p(λ)) from the spectral sums, skipping modes with a_k = 0.
  double norm2(const Subproblem &s, double lambda)
  {
    double sum = 0.0;
    for (unsigned int k = 0; k < n; ++k)
      if (s.a[k] != 0.0)
        sum += std::pow(s.a[k] / (s.mu[k] + lambda), 2);
    return sum;
  }

  double model(const Subproblem &s, double lambda)
  {
    double m = 0.0;
    for (unsigned int k = 0; k < n; ++k)
      if (s.a[k] != 0.0)
        {
          const double c = -s.a[k] / (s.mu[k] + lambda);
          m += s.a[k] * c + 0.5 * s.mu[k] * c * c;
        }
    return m;
  }

  /// The optimal model value m* < 0 of the subproblem with radius Δ (Moré & Sorensen 1983, §2).
  double optimal_model(const Subproblem &s, double radius)
  {
    const double floor = std::max(0.0, -s.mu[0]);
    if (floor == 0.0 && norm2(s, 0.0) <= radius * radius)
      return model(s, 0.0); // the interior Newton step
    if (s.a[0] == 0.0 && norm2(s, floor) <= radius * radius)
      return model(s, floor) + 0.5 * s.mu[0] * (radius * radius - norm2(s, floor)); // the hard case
    double lo = floor, hi = floor + 1.0;
    while (norm2(s, hi) > radius * radius)
      hi = floor + 2.0 * (hi - floor);
    for (int it = 0; it < 200; ++it)
      {
        const double mid = 0.5 * (lo + hi);
        (norm2(s, mid) > radius * radius ? lo : hi) = mid;
      }
    return model(s, 0.5 * (lo + hi));
  }

  /// m(p) evaluated with the matrix (independently of the class's own prediction).
  double model_of(const Subproblem &s, const Vector &p)
  {
    Vector Hp = p;
    s.reference.vmult(Hp, p);
    return s.gradient * p + 0.5 * (p * Hp);
  }

  /// The Cauchy point's model value m_C = −τΔ‖g‖ + ½τ²Δ² gᵀHg/‖g‖², τ = 1 if gᵀHg ≤ 0, else
  /// min(1, ‖g‖³/(Δ gᵀHg)) (Nocedal & Wright 2006, eq. 4.12), from the spectral sums.
  double cauchy_model(const Subproblem &s, double radius)
  {
    double gg = 0.0, gHg = 0.0;
    for (unsigned int k = 0; k < n; ++k)
      {
        gg += s.a[k] * s.a[k];
        gHg += s.mu[k] * s.a[k] * s.a[k];
      }
    const double tau = gHg <= 0.0 ? 1.0 : std::min(1.0, std::pow(gg, 1.5) / (radius * gHg));
    return -tau * radius * std::sqrt(gg) + 0.5 * tau * tau * radius * radius * gHg / gg;
  }

  /// The model value of the better of ±Δv₁, the step along the lowest eigenvector.
  double eigen_model(const Subproblem &s, double radius)
  {
    return -radius * std::abs(s.a[0]) + 0.5 * radius * radius * s.mu[0];
  }

  TrustRegionStep step(Subproblem &s, double radius, unsigned int &negative)
  {
    MoreSorensenSubproblem sub(make_hessian_solvers(SolverSettings(), comm), s.seed);
    negative = sub.set_point(s.H, s.gradient, s.weights);
    return sub.solve(radius);
  }

  /// The step for g = Σ 10⁻²/k v_k and a shift σ that leaves H one negative eigenvalue.
  TrustRegionStep step_with_one_negative_eigenvalue(Subproblem &s, double sigma, double radius)
  {
    make(s, sigma, [](unsigned int k) { return 1e-2 / k; });
    unsigned int          negative = 99;
    const TrustRegionStep p        = step(s, radius, negative);
    EXPECT_EQ(negative, 1u);
    return p;
  }
} // namespace

TEST(MoreSorensenStep, IsTheNewtonStepWhenItFitsAndHIsPositiveDefinite)
{
  Subproblem s;
  make(s, 0.0, [](unsigned int k) { return 1.0 / k; });
  const double       newton = std::sqrt(norm2(s, 0.0));
  unsigned int       negative = 99;
  const TrustRegionStep p = step(s, 2.0 * newton, negative);
  EXPECT_EQ(negative, 0u);
  EXPECT_EQ(p.multiplier, 0.0);
  EXPECT_NEAR(p.length, newton, 1e-8 * newton);
  EXPECT_NEAR(model_of(s, p.step), model(s, 0.0), 1e-8 * std::abs(model(s, 0.0)));
}

// Where H is positive definite and the Newton step is too long the step is Powell's dogleg (Nocedal &
// Wright, Numerical Optimization, 2nd ed., 2006, §4.1): on the boundary, never worse than the Cauchy
// point m_C = −τΔ‖g‖ + ½τ²Δ² gᵀHg/‖g‖², τ = min(1, ‖g‖³/(Δ gᵀHg)) (their eq. 4.12), never better than
// the optimum.
TEST(MoreSorensenStep, TakesTheDoglegBetweenTheCauchyPointAndTheOptimumWhenTheNewtonStepIsTooLong)
{
  for (const double share : {0.02, 0.2, 0.8})
    {
      Subproblem s;
      make(s, 0.0, [](unsigned int k) { return 1.0 / k; });
      const double radius = share * std::sqrt(norm2(s, 0.0));
      const double          cauchy   = cauchy_model(s, radius);
      unsigned int          negative = 99;
      const TrustRegionStep p        = step(s, radius, negative);
      EXPECT_EQ(negative, 0u);
      EXPECT_NEAR(p.length, radius, 1e-9 * radius) << "Δ = " << share << "·‖p_N‖";
      EXPECT_LE(model_of(s, p.step), cauchy * (1 - 1e-12)) << "Δ = " << share << "·‖p_N‖";
      EXPECT_GE(model_of(s, p.step), optimal_model(s, radius) * (1 + 1e-12)) << "Δ = " << share << "·‖p_N‖";
      EXPECT_NEAR(p.predicted_decrease, -model_of(s, p.step), 1e-9 * std::abs(cauchy));
    }
}

TEST(MoreSorensenStep, FollowsNegativeCurvatureOfAnIndefiniteHessian)
{
  const double sigma = 0.5 * (laplacian_eigenvalue(1) + laplacian_eigenvalue(2)); // one negative eigenvalue
  for (const double radius : {1e-3, 1e-1, 10.0})
    {
      Subproblem s;
      make(s, sigma, [](unsigned int k) { return 1.0 / k; });
      unsigned int          negative = 99;
      const TrustRegionStep p        = step(s, radius, negative);
      EXPECT_EQ(negative, 1u);
      EXPECT_TRUE(p.negative_curvature);
      EXPECT_GE(p.multiplier, -s.mu[0] * (1 - 1e-9)) << "Δ = " << radius; // H + λI positive semidefinite
      EXPECT_GE(p.length, (1 - accuracy) * radius) << "Δ = " << radius;
      EXPECT_LE(p.length, (1 + accuracy) * radius) << "Δ = " << radius;
      EXPECT_LE(model_of(s, p.step), std::pow(1 - accuracy, 2) * optimal_model(s, radius)) << "Δ = " << radius;
    }
}

TEST(MoreSorensenStep, SolvesTheHardCaseAtASaddleAlongTheLowestEigenvector)
{
  Subproblem s;
  const double sigma = 0.5 * (laplacian_eigenvalue(1) + laplacian_eigenvalue(2));
  make(s, sigma, [](unsigned int k) { return k == 1 ? 0.0 : 1e-3 / k; }); // g ⟂ v₁
  const double radius = 10.0 * std::sqrt(norm2(s, -s.mu[0]));           // ‖p(−μ₁)‖ < Δ: the hard case
  unsigned int negative = 99;
  const TrustRegionStep p = step(s, radius, negative);
  EXPECT_EQ(negative, 1u);
  EXPECT_GE(p.length, (1 - accuracy) * radius);
  EXPECT_LE(p.length, (1 + accuracy) * radius);
  EXPECT_LE(model_of(s, p.step), std::pow(1 - accuracy, 2) * optimal_model(s, radius));
}

// Where H's own factorisation shows its negative curvature (one negative eigenvalue, nearer zero than
// every positive one, so that inverse iteration with that factorisation finds it), the step is the
// minimum of the model in the plane of the gradient and v₁, without a further factorisation. The
// reference: the same plane's boundary sampled at 10⁵ angles with the exact vectors (g and v₁ are
// S-orthogonal up to a₁, removed here), which the step must match or beat; and it must beat the Cauchy
// point and the step along v₁ (Shultz, Schnabel & Byrd 1985, the conditions for convergence to a point
// with H positive semidefinite, from memory).
TEST(MoreSorensenStep, StepsInThePlaneOfTheGradientAndTheNegativeCurvatureWithoutAnotherFactorisation)
{
  const double sigma = laplacian_eigenvalue(1) + 0.3 * (laplacian_eigenvalue(2) - laplacian_eigenvalue(1));
  for (const double radius : {1e-4, 1e-2, 1.0})
    {
      Subproblem            s;
      const TrustRegionStep p = step_with_one_negative_eigenvalue(s, sigma, radius);
      EXPECT_EQ(p.factorizations, 0u) << "Δ = " << radius;
      EXPECT_NEAR(p.length, radius, 1e-9 * radius) << "Δ = " << radius; // indefinite in the plane: on the boundary
      const double m = model_of(s, p.step);
      EXPECT_LE(m, cauchy_model(s, radius) * (1 - 1e-12)) << "Δ = " << radius;
      EXPECT_LE(m, eigen_model(s, radius) * (1 - 1e-12)) << "Δ = " << radius;
      EXPECT_GE(m, optimal_model(s, radius) * (1 + 1e-12)) << "Δ = " << radius;
      // u₁ = −g/‖g‖, u₂ = v₁ made orthogonal to g; the plane's model on the circle of radius Δ.
      double gg = 0.0, gHg = 0.0;
      for (unsigned int k = 0; k < n; ++k)
        gg += s.a[k] * s.a[k], gHg += s.mu[k] * s.a[k] * s.a[k];
      const double c  = s.a[0] / std::sqrt(gg);  // v₁ᵀu with u = g/‖g‖
      const double ns = std::sqrt(1 - c * c);    // ‖v₁ − c u‖
      const double h11 = gHg / gg, h12 = (s.mu[0] * s.a[0] / std::sqrt(gg) - c * h11) / ns;
      const double h22 = (s.mu[0] - 2 * c * s.mu[0] * s.a[0] / std::sqrt(gg) + c * c * h11) / (ns * ns);
      double best = 0.0;
      for (unsigned int j = 0; j < 100000; ++j)
        {
          const double t = 2 * M_PI * j / 100000, x = radius * std::cos(t), y = radius * std::sin(t);
          best = std::min(best, std::sqrt(gg) * x + 0.5 * (h11 * x * x + 2 * h12 * x * y + h22 * y * y));
        }
      EXPECT_LE(m, best + 1e-9 * std::abs(best)) << "Δ = " << radius;
    }
}

// Where H is indefinite and its own factorisation shows no negative curvature (the eigenvalue nearest
// zero is positive), the step still decreases the model at least as much as the Cauchy point, lies in
// the region and reaches its boundary within σ₁.
TEST(MoreSorensenStep, DecreasesTheModelAtLeastAsMuchAsTheCauchyPointWhereNoNegativeCurvatureIsKnown)
{
  const double sigma = laplacian_eigenvalue(2) - 0.1 * (laplacian_eigenvalue(2) - laplacian_eigenvalue(1));
  for (const double radius : {1e-4, 1e-2, 1.0})
    {
      Subproblem            s;
      const TrustRegionStep p = step_with_one_negative_eigenvalue(s, sigma, radius);
      EXPECT_TRUE(p.negative_curvature);
      EXPECT_LE(p.length, (1 + accuracy) * radius) << "Δ = " << radius;
      EXPECT_GE(p.length, (1 - accuracy) * radius) << "Δ = " << radius;
      const double m = model_of(s, p.step);
      EXPECT_LE(m, cauchy_model(s, radius) * (1 - 1e-12)) << "Δ = " << radius;
      EXPECT_GE(m, optimal_model(s, radius) * (1 + 1e-12)) << "Δ = " << radius;
      EXPECT_NEAR(p.predicted_decrease, -m, 1e-9 * std::abs(m)) << "Δ = " << radius;
    }
}

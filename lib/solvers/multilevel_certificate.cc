#include <deal.II/base/symmetric_tensor.h>

#include <nappe/solvers/multilevel_certificate.h>

#include "matrix_diagonal.h"

#include <array>
#include <cmath>

namespace nappe
{
  using namespace dealii;

  namespace
  {
    /// A residual bound of a tenth of μ settles the sign of the eigenvalue μ approximates (common practice, no source).
    const double       sign_tolerance  = 0.1;
    /// As the direct certificate's inverse iteration: three digits to extrapolate a fold.
    const double       eigen_tolerance = 1e-3;
    const unsigned int max_iterations  = 50;
    /// Below this |μ| the bound is absolute (1e-9 with eigen_tolerance): a zero eigenvalue (a symmetry of the cell)
    /// has no relative accuracy to reach (common practice, no source) [-].
    const double zero_floor = 1e-6;
    /// A Rayleigh quotient above −this is zero to round-off (a symmetry's mode), not a negative eigenvalue: the
    /// bound of a zero eigenvalue above (1e-9) [-].
    const double negative_floor = eigen_tolerance * zero_floor;

    double s_product(const Vector &a, const Vector &b, const Vector &weights)
    {
      Vector t = a;
      t.scale(weights);
      return t * b;
    }

    /// The S-orthonormal basis of span{x, w, p} (x first, kept) and H times each vector.
    struct RitzBasis
    {
      std::vector<Vector> vectors, products;

      void add(Vector v, const SparseMatrix &H, const Vector &weights)
      {
        const double before = std::sqrt(std::max(0.0, s_product(v, v, weights)));
        for (int pass = 0; pass < 2; ++pass) // twice is enough (Parlett 1998, §6.9, "twice is enough")
          for (const auto &b : vectors)
            v.add(-s_product(b, v, weights), b);
        const double after = std::sqrt(std::max(0.0, s_product(v, v, weights)));
        if (!(after > 1e-8 * before))
          return; // numerically in the span already
        v /= after;
        Vector Hv = v;
        H.vmult(Hv, v);
        vectors.push_back(std::move(v));
        products.push_back(std::move(Hv));
      }

      /// The coefficients of the lowest Ritz vector (Jacobi's method on the projected 3×3 matrix).
      std::array<double, 3> lowest_ritz_vector() const
      {
        SymmetricTensor<2, 3> A;
        double                largest = 0.0;
        for (unsigned int i = 0; i < vectors.size(); ++i)
          for (unsigned int j = i; j < vectors.size(); ++j)
            {
              A[i][j] = 0.5 * (vectors[i] * products[j] + vectors[j] * products[i]);
              largest = std::max(largest, std::abs(A[i][j]));
            }
        for (unsigned int i = vectors.size(); i < 3; ++i)
          A[i][i] = 1e3 * (1.0 + largest); // an absent vector: decoupled, never the lowest
        const auto pairs = eigenvectors(A, SymmetricTensorEigenvectorMethod::jacobi); // descending
        const auto &z    = pairs[2].second;
        return {z[0], z[1], z[2]};
      }
    };

    Vector seed(const SheetSystem &system)
    {
      Vector v = system.make_owned_vector();
      for (const auto i : v.locally_owned_elements())
        v(i) = std::sin(1.7 * i + 0.3) + 1.1; // rank-independent, not orthogonal to smooth modes
      v.compress(VectorOperation::insert);
      system.constraints().set_zero(v);
      return v;
    }
  } // namespace

  MultilevelCertificate::MultilevelCertificate(std::shared_ptr<MultilevelHessianSolver> preconditioner)
    : preconditioner_(std::move(preconditioner))
  {}

  unsigned int MultilevelCertificate::negative_eigenvalues(const SparseMatrix &H)
  {
    Vector weights = preconditioner_->system().make_owned_vector();
    internal::extract_diagonal(H, weights);
    const double largest = weights.linfty_norm();
    for (auto &w : weights)
      w = std::max(std::abs(w), 1e-12 * largest);
    if (last_vector_.size() != weights.size())
      last_vector_ = seed(preconditioner_->system());
    const LowestEigenpair e = lobpcg(H, weights, last_vector_, sign_tolerance, true);
    last_vector_            = e.vector;
    if (e.available)
      return e.value < -negative_floor ? 1 : 0;
    // A shifted H not shown positive definite counts as not positive definite: the minimiser shifts
    // further, which costs a more damped step rather than a factorisation.
    if (preconditioner_->diagonal_shift() > 0.0)
      return 1;
    // Unsettled (a cluster of near-zero eigenvalues, e.g. a sheet hovering above the substrate): the
    // inertia of one factorisation decides, exactly.
    ++fallbacks_;
    if (!direct_)
      direct_ = std::make_unique<SymmetricDirectSolver>(preconditioner_->system().communicator());
    direct_->factorize(H);
    return direct_->n_negative_pivots();
  }

  LowestEigenpair MultilevelCertificate::lowest_eigenpair(const SparseMatrix &H, const Vector &weights,
                                                          const Vector &start)
  {
    return lobpcg(H, weights, start, eigen_tolerance, false);
  }

  LowestEigenpair MultilevelCertificate::lobpcg(const SparseMatrix &H, const Vector &weights, const Vector &start,
                                                double tolerance, bool sign_only) const
  {
    const auto &constraints     = preconditioner_->system().constraints();
    Vector      inverse_weights = weights;
    for (auto &w : inverse_weights)
      w = 1.0 / w;
    LowestEigenpair e;
    e.available = true;
    e.vector    = start;
    constraints.set_zero(e.vector);
    e.vector /= std::sqrt(s_product(e.vector, e.vector, weights));
    Vector Hx = e.vector, r = e.vector, w = e.vector, p, Hp;
    H.vmult(Hx, e.vector);
    for (e.iterations = 1; e.iterations <= max_iterations; ++e.iterations)
      {
        e.value = e.vector * Hx; // xᵀSx = 1
        r       = Hx;
        Vector Sx = e.vector;
        Sx.scale(weights);
        r.add(-e.value, Sx);
        e.error = std::sqrt(std::max(0.0, s_product(r, r, inverse_weights)));
        const double resolved = tolerance * std::max(std::abs(e.value), sign_only ? 0.0 : zero_floor);
        if ((sign_only && e.value < -negative_floor) || e.error <= resolved)
          return e;
        preconditioner_->precondition(r, w);
        constraints.set_zero(w);
        RitzBasis basis;
        basis.vectors  = {e.vector};
        basis.products = {Hx};
        basis.add(w, H, weights);
        if (p.size() == w.size())
          basis.add(p, H, weights);
        const auto c = basis.lowest_ritz_vector();
        p            = basis.vectors[0];
        p            = 0.0;
        Hp           = p;
        for (unsigned int i = 1; i < basis.vectors.size(); ++i)
          {
            p.add(c[i], basis.vectors[i]);
            Hp.add(c[i], basis.products[i]);
          }
        e.vector.sadd(c[0], 1.0, p);
        Hx.sadd(c[0], 1.0, Hp);
        const double norm = std::sqrt(s_product(e.vector, e.vector, weights));
        e.vector /= norm;
        Hx /= norm;
      }
    e.available = false;
    return e;
  }
} // namespace nappe

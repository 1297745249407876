#include <deal.II/base/exceptions.h>

#include <nappe/solvers/hessian_solver.h>
#include <nappe/solvers/multilevel_certificate.h>
#include <nappe/solvers/multilevel_hessian_solver.h>
#include <nappe/solvers/symmetric_direct_solver.h>

#include <algorithm>
#include <cmath>

namespace nappe
{
  void HessianSolver::linearize(const Vector &, const LoadLevel &) {}

  void HessianSolver::set_diagonal_shift(double) {}

  LowestEigenpair StabilityCertificate::lowest_eigenpair(const SparseMatrix &, const Vector &, const Vector &)
  {
    return {};
  }

  namespace
  {
    /// Stop when the residual bound is this share of μ (common practice, no source: three digits are
    /// enough to extrapolate a fold and to orient a step of negative curvature).
    const double       eigen_tolerance       = 1e-3;
    const unsigned int eigen_max_iterations  = 30;

    /**
     * Inverse iteration for the lowest eigenpair of H v = μ S v with the prepared factorisation of a
     * positive definite H: x = H⁻¹Sv, then v = x/‖x‖_S. It converges at the rate μ₁/μ₂ (Parlett 1998,
     * §4.2), i.e. fast exactly where it matters, next to a fold (μ₁ → 0).
     */
    LowestEigenpair inverse_iteration(const HessianSolver &solver, const SparseMatrix &H, const Vector &weights,
                                      const Vector &start)
    {
      LowestEigenpair e;
      e.available = true;
      Vector x = start, Sv = start, r = start, inverse_weights = weights;
      for (const auto i : inverse_weights.locally_owned_elements())
        inverse_weights(i) = 1.0 / weights(i);
      inverse_weights.compress(dealii::VectorOperation::insert);
      e.vector = start;
      Sv.scale(weights);
      e.vector /= std::sqrt(e.vector * Sv);
      for (e.iterations = 1; e.iterations <= eigen_max_iterations; ++e.iterations)
        {
          Sv = e.vector;
          Sv.scale(weights);
          solver.solve(Sv, x);
          const double xHx = x * Sv; // Hx = Sv
          Vector       Sx  = x;
          Sx.scale(weights);
          const double xSx = x * Sx;
          e.value          = xHx / xSx; // Rayleigh quotient at x
          e.vector         = x;
          e.vector /= std::sqrt(xSx);
          Sx /= std::sqrt(xSx); // S v
          H.vmult(r, e.vector);
          r.add(-e.value, Sx); // r = Hv − μSv
          Vector scaled = r;
          scaled.scale(inverse_weights);
          e.error = std::sqrt(std::max(0.0, scaled * r));
          if (e.error <= eigen_tolerance * std::abs(e.value))
            break;
        }
      e.iterations = std::min(e.iterations, eigen_max_iterations);
      return e;
    }

    /// MUMPS LDLᵀ as both sides of the seam: one factorisation gives the solves and the inertia.
    class DirectLdlt : public HessianSolver, public StabilityCertificate
    {
    public:
      /// @p certificate_only: nothing else prepares it, so every call factorises (H may have changed in place).
      explicit DirectLdlt(MPI_Comm comm, bool certificate_only = false)
        : mumps_(comm)
        , certificate_only_(certificate_only)
      {}

      void prepare(const SparseMatrix &H) override
      {
        factorized_ = nullptr;
        mumps_.factorize(H);
        factorized_ = &H;
      }

      void solve(const Vector &rhs, Vector &solution) const override { mumps_.solve(rhs, solution); }

      unsigned int negative_eigenvalues(const SparseMatrix &H) override
      {
        if (factorized_ != &H || certificate_only_)
          prepare(H);
        return mumps_.n_negative_pivots();
      }

      LowestEigenpair lowest_eigenpair(const SparseMatrix &H, const Vector &weights, const Vector &start) override
      {
        if (factorized_ != &H || certificate_only_)
          prepare(H);
        return inverse_iteration(*this, H, weights, start);
      }

      std::string name() const override { return "direct LDLT"; }

    private:
      SymmetricDirectSolver mumps_;
      const SparseMatrix   *factorized_ = nullptr; ///< the matrix of the last factorisation
      const bool            certificate_only_;
    };

    std::string listed(const std::vector<std::string> &names)
    {
      std::string text;
      for (const auto &n : names)
        text += (text.empty() ? "'" : ", '") + n + "'";
      return text;
    }
  } // namespace

  std::vector<std::string> hessian_solver_names() { return {"automatic", "direct LDLT", "multilevel CG"}; }

  std::vector<std::string> stability_certificate_names() { return {"automatic", "LDLT inertia", "multilevel LOBPCG"}; }

  SolverSettings resolved(const SolverSettings &settings, unsigned long long unknowns, bool adapted_mesh)
  {
    SolverSettings r = settings;
    if (r.linear_solver == "automatic")
      r.linear_solver = !adapted_mesh && (unknowns >= multilevel_crossover_unknowns || r.certificate == "multilevel LOBPCG") ?
                          "multilevel CG" :
                          "direct LDLT";
    if (r.certificate == "automatic")
      r.certificate = r.linear_solver == "multilevel CG" ? "multilevel LOBPCG" : "LDLT inertia";
    return r;
  }

  void check_solver_settings(const SolverSettings &settings)
  {
    const auto solvers = hessian_solver_names(), certificates = stability_certificate_names();
    AssertThrow(std::count(solvers.begin(), solvers.end(), settings.linear_solver) == 1,
                dealii::ExcMessage("Solver/Linear solver: expected one of " + listed(solvers) + ", found '" +
                                   settings.linear_solver + "'."));
    AssertThrow(std::count(certificates.begin(), certificates.end(), settings.certificate) == 1,
                dealii::ExcMessage("Solver/Stability certificate: expected one of " + listed(certificates) +
                                   ", found '" + settings.certificate + "'."));
    AssertThrow(settings.certificate != "multilevel LOBPCG" || settings.linear_solver != "direct LDLT",
                dealii::ExcMessage("Solver/Stability certificate: 'multilevel LOBPCG' uses the multilevel "
                                   "preconditioner and needs Solver/Linear solver = multilevel CG, found '" +
                                   settings.linear_solver + "'."));
  }

  HessianSolvers make_hessian_solvers(const SolverSettings &settings, MPI_Comm comm)
  {
    check_solver_settings(settings);
    AssertThrow(resolved(settings, 0).linear_solver == "direct LDLT",
                dealii::ExcMessage("Solver: the multilevel solver and certificate need the sheet's mesh hierarchy; "
                                   "this matrix comes without one."));
    auto ldlt = std::make_shared<DirectLdlt>(comm);
    return {ldlt, ldlt};
  }

  HessianSolvers make_hessian_solvers(const SolverSettings &settings, const SheetSystem &system)
  {
    check_solver_settings(settings);
    const bool           adapted = !system.uniform_mesh();
    const SolverSettings chosen  = resolved(settings, system.n_dofs(), adapted);
    AssertThrow(!adapted || chosen.linear_solver == "direct LDLT",
                dealii::ExcMessage("Solver/Linear solver = multilevel CG needs a uniformly refined mesh (its levels are "
                                   "whole refinements); with Mesh adaptation/Cycles > 0 choose 'direct LDLT' or "
                                   "'automatic'."));
    if (chosen.linear_solver == "direct LDLT")
      return make_hessian_solvers(chosen, system.communicator());
    auto multilevel = std::make_shared<MultilevelHessianSolver>(system, settings.multilevel);
    if (chosen.certificate == "LDLT inertia")
      return {multilevel, std::make_shared<DirectLdlt>(system.communicator(), true)};
    return {multilevel, std::make_shared<MultilevelCertificate>(multilevel)};
  }
} // namespace nappe

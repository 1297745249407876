#include <deal.II/base/exceptions.h>

#include <nappe/solvers/hessian_solver.h>
#include <nappe/solvers/symmetric_direct_solver.h>

#include <algorithm>

namespace nappe
{
  namespace
  {
    /// MUMPS LDLᵀ as both sides of the seam: one factorisation gives the solves and the inertia.
    class DirectLdlt : public HessianSolver, public StabilityCertificate
    {
    public:
      explicit DirectLdlt(MPI_Comm comm) : mumps_(comm) {}

      void prepare(const SparseMatrix &H) override
      {
        factorized_ = nullptr;
        mumps_.factorize(H);
        factorized_ = &H;
      }

      void solve(const Vector &rhs, Vector &solution) const override { mumps_.solve(rhs, solution); }

      unsigned int negative_eigenvalues(const SparseMatrix &H) override
      {
        if (factorized_ != &H)
          prepare(H);
        return mumps_.n_negative_pivots();
      }

      std::string name() const override { return "direct LDLT"; }

    private:
      SymmetricDirectSolver mumps_;
      const SparseMatrix   *factorized_ = nullptr; ///< the matrix of the last factorisation
    };

    std::string listed(const std::vector<std::string> &names)
    {
      std::string text;
      for (const auto &n : names)
        text += (text.empty() ? "'" : ", '") + n + "'";
      return text;
    }
  } // namespace

  std::vector<std::string> hessian_solver_names() { return {"direct LDLT"}; }

  std::vector<std::string> stability_certificate_names() { return {"LDLT inertia"}; }

  HessianSolvers make_hessian_solvers(const SolverSettings &settings, MPI_Comm comm)
  {
    const auto solvers = hessian_solver_names(), certificates = stability_certificate_names();
    AssertThrow(std::count(solvers.begin(), solvers.end(), settings.linear_solver) == 1,
                dealii::ExcMessage("Solver/Linear solver: expected one of " + listed(solvers) + ", found '" +
                                   settings.linear_solver + "'."));
    AssertThrow(std::count(certificates.begin(), certificates.end(), settings.certificate) == 1,
                dealii::ExcMessage("Solver/Stability certificate: expected one of " + listed(certificates) +
                                   ", found '" + settings.certificate + "'."));
    auto ldlt = std::make_shared<DirectLdlt>(comm);
    return {ldlt, ldlt};
  }
} // namespace nappe

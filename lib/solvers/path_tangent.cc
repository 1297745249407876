#include <deal.II/base/mpi.h>
#include <deal.II/dofs/dof_tools.h>
#include <deal.II/fe/component_mask.h>

#include <nappe/solvers/path_tangent.h>

#include <algorithm>
#include <cmath>

namespace nappe
{
  Vector path_tangent(EnergyMinimizer &minimizer, const Vector &state, const LoadLevel &level, PathParameter parameter)
  {
    const SheetSystem &system  = minimizer.system();
    Vector             ghosted = system.make_ghosted_vector();
    ghosted                    = state;
    Vector     plus = system.make_owned_vector(), minus = system.make_owned_vector();
    const auto at   = [&](double offset) {
      LoadLevel shifted = level;
      (parameter == PathParameter::load ? shifted.load : shifted.adhesion) += offset;
      return shifted;
    };
    system.assemble(ghosted, at(1.0), plus, nullptr);
    system.assemble(ghosted, at(-1.0), minus, nullptr);
    plus -= minus;
    plus *= -0.5; // −∂R/∂p
    Vector tangent = system.make_owned_vector();
    minimizer.solve_with_hessian(plus, tangent);
    system.constraints().distribute(tangent);
    return tangent;
  }

  dealii::IndexSet deflection_dofs(const SheetSystem &system)
  {
    return dealii::DoFTools::extract_dofs(system.dof_handler(), dealii::ComponentMask({false, false, true}));
  }

  double largest_entry(const Vector &v, const dealii::IndexSet &dofs, MPI_Comm comm)
  {
    double largest = 0.0;
    for (const auto i : dofs)
      largest = std::max(largest, std::abs(v(i)));
    return dealii::Utilities::MPI::max(largest, comm);
  }
} // namespace nappe

#pragma once

// Test helper: a sheet state (ũ_x, ũ_y, w) interpolated from closed-form functions, without solving.
#include <deal.II/base/function.h>
#include <deal.II/numerics/vector_tools.h>

#include <nappe/solvers/sheet_system.h>

#include <functional>

namespace nappe::test_support
{
  /// (ũ_x, ũ_y, w) [m] at a point [m].
  using StateFunction = std::function<std::array<double, 3>(const dealii::Point<2> &)>;

  class ClosedFormState : public dealii::Function<2>
  {
  public:
    explicit ClosedFormState(StateFunction f)
      : dealii::Function<2>(3)
      , f_(std::move(f))
    {}
    double value(const dealii::Point<2> &p, const unsigned int component) const override { return f_(p)[component]; }

  private:
    StateFunction f_;
  };

  /// The nodal interpolant of @p f on the system's elements, as a ghosted vector. Constraints are not applied:
  /// the state is a field to evaluate, not a candidate minimiser.
  inline Vector interpolated_state(const SheetSystem &system, const StateFunction &f)
  {
    Vector owned = system.make_owned_vector();
    dealii::VectorTools::interpolate(system.mapping(), system.dof_handler(), ClosedFormState(f), owned);
    Vector ghosted = system.make_ghosted_vector();
    ghosted        = owned;
    return ghosted;
  }
} // namespace nappe::test_support

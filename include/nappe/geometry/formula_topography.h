#pragma once

#include <nappe/geometry/topography.h>

#include <map>
#include <memory>
#include <string>

namespace dealii
{
  template <int dim>
  class FunctionParser;
}

namespace nappe
{
  /**
   * A height given by a muParser expression in the variables x and y, e.g.
   * "A*exp(-(x^2+y^2)/(2*w^2))" with constants "A=5, w=20", evaluated through deal.II's
   * FunctionParser<2>. The expression works in a stated length unit (default nm): x and y are given in
   * that unit and the result is read in it, so s(p) = u·f(p/u).
   *
   * The gradient is not symbolic: deal.II's FunctionParser differentiates numerically. It is used with
   * the fourth-order central difference (f(x−2h) − 8f(x−h) + 8f(x+h) − f(x+2h))/(12h) and step h in
   * the formula's unit (default 1e-3, truncation O(h⁴), round-off ≈ ε|f|/h). Smoothness is what the
   * expression provides; nappe does not check it.
   */
  class FormulaTopography : public Topography
  {
  public:
    /**
     * @param expression  muParser expression in x, y (pi is predefined).
     * @param constants   name → value, in the formula's units.
     * @param length_unit meters per formula unit (units::nanometer by default).
     * @param fd_step     finite-difference step, in the formula's unit.
     * @param support_radius_m radius [m] outside which the formula is zero, if it is localised (for arrays).
     * @param entry       the name messages give the formula (the case file's entry by default).
     *
     * Throws a one-line message naming @p entry for a syntax error, an unknown name, a bad constant
     * name, or ';' (one formula only). height() and gradient() throw, naming the point, where the
     * formula is not finite (e.g. 1/(x-x), sqrt(-1-x*x)) or its height exceeds max_topography_height.
     */
    FormulaTopography(const std::string &expression, const std::map<std::string, double> &constants = {},
                      double length_unit = 1e-9, double fd_step = 1e-3,
                      double support_radius_m = std::numeric_limits<double>::infinity(),
                      const std::string &entry = "Topography/Formula/Expression");
    ~FormulaTopography() override;

    double               height(const dealii::Point<2> &p) const override;
    dealii::Tensor<1, 2> gradient(const dealii::Point<2> &p) const override;
    std::string          name() const override { return "formula"; }
    std::string          description() const override;
    double               support_radius() const override { return support; }

  private:
    [[noreturn]] void fail_at(const dealii::Point<2> &p, const std::string &what_was_found,
                              const std::string &expected) const;

    std::unique_ptr<dealii::FunctionParser<2>> parser;
    std::string                                expression, entry, constants_text;
    double                                     unit, support;
  };
} // namespace nappe

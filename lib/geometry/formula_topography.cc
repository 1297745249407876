#include <deal.II/base/function_parser.h>

#include <nappe/geometry/formula_topography.h>

#include <cmath>

#include "format.h"

namespace nappe
{
  FormulaTopography::FormulaTopography(const std::string &expression, const std::map<std::string, double> &constants,
                                       const double length_unit, const double fd_step, const double support_radius_m)
    : expression(expression)
    , unit(length_unit)
    , support(support_radius_m)
  {
    AssertThrow(std::isfinite(length_unit) && length_unit > 0.0,
                dealii::ExcMessage("Formula topography: the length unit must be positive"));
    AssertThrow(std::isfinite(fd_step) && fd_step > 0.0,
                dealii::ExcMessage("Formula topography: 'Finite difference step' must be positive, found " +
                                   internal::num(fd_step)));
    AssertThrow(!expression.empty(), dealii::ExcMessage("Formula topography: 'Expression' is empty"));
    for (const auto &c : constants)
      constants_text += (constants_text.empty() ? "" : ", ") + c.first + " = " + internal::num(c.second);

    parser = std::make_unique<dealii::FunctionParser<2>>(1, 0.0, fd_step);
    std::map<std::string, double> all_constants = constants;
    all_constants.emplace("pi", M_PI);
    try
      {
        parser->initialize("x,y", expression, all_constants);
        // Evaluate once so that unknown variables and syntax errors surface here, not mid-solve.
        (void)parser->value(dealii::Point<2>());
      }
    catch (const std::exception &e)
      {
        AssertThrow(false, dealii::ExcMessage("Formula topography: cannot use the 'Expression' \"" + expression +
                                              "\" (variables x, y; constants: " +
                                              (constants_text.empty() ? "none" : constants_text) +
                                              "): " + e.what()));
      }
    parser->set_formula(dealii::AutoDerivativeFunction<2>::FourthOrder);
  }

  FormulaTopography::~FormulaTopography() = default;

  double FormulaTopography::height(const dealii::Point<2> &p) const { return unit * parser->value(p / unit); }

  dealii::Tensor<1, 2> FormulaTopography::gradient(const dealii::Point<2> &p) const
  {
    return parser->gradient(p / unit);
  }

  std::string FormulaTopography::description() const
  {
    return "formula s(x, y) = " + expression + " in units of " + internal::nm(unit) +
           (constants_text.empty() ? "" : " with " + constants_text);
  }
} // namespace nappe

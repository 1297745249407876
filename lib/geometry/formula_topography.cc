#include <deal.II/base/function_parser.h>

#include <nappe/geometry/height_limit.h>
#include <nappe/geometry/formula_topography.h>

#include <cctype>
#include <cmath>
#include <iostream>
#include <sstream>

#include "format.h"

namespace nappe
{
  namespace
  {
    bool is_identifier(const std::string &name)
    {
      if (name.empty() || !(std::isalpha(static_cast<unsigned char>(name[0])) || name[0] == '_'))
        return false;
      for (const char c : name)
        if (!(std::isalnum(static_cast<unsigned char>(c)) || c == '_'))
          return false;
      return true;
    }

    /// Redirects std::cerr into a string while alive: deal.II's FunctionParser prints muParser's
    /// diagnosis there (five lines) before it throws, and nappe reports it in one line of its own.
    class CerrCapture
    {
    public:
      CerrCapture()
        : old(std::cerr.rdbuf(captured.rdbuf()))
      {}
      ~CerrCapture() { std::cerr.rdbuf(old); }
      CerrCapture(const CerrCapture &) = delete;
      CerrCapture &operator=(const CerrCapture &) = delete;

      /// muParser's message ("Unexpected end of expression at position 7"), or "" if none was printed.
      std::string muparser_message() const
      {
        const std::string text  = captured.str();
        const std::string key   = "Message:  <";
        const auto        begin = text.find(key);
        if (begin == std::string::npos)
          return "";
        const auto end = text.find(">\n", begin);
        return text.substr(begin + key.size(), end == std::string::npos ? std::string::npos
                                                                         : end - begin - key.size());
      }

    private:
      std::ostringstream captured;
      std::streambuf    *old;
    };

    /// The text of a deal.II exception without its source location, on one line.
    std::string one_line(const std::exception &e)
    {
      std::ostringstream s;
      if (const auto *deal = dynamic_cast<const dealii::ExceptionBase *>(&e))
        deal->print_info(s);
      else
        s << e.what();
      std::string text;
      for (const char c : s.str())
        if (!std::isspace(static_cast<unsigned char>(c)))
          text += c;
        else if (!text.empty() && text.back() != ' ')
          text += ' ';
      while (!text.empty() && text.back() == ' ')
        text.pop_back();
      return text;
    }
  } // namespace


  FormulaTopography::FormulaTopography(const std::string &expression, const std::map<std::string, double> &constants,
                                       const double length_unit, const double fd_step, const double support_radius_m,
                                       const std::string &entry)
    : expression(expression)
    , entry(entry)
    , unit(length_unit)
    , support(support_radius_m)
  {
    AssertThrow(std::isfinite(length_unit) && length_unit > 0.0,
                dealii::ExcMessage(entry + ": the length unit must be positive"));
    AssertThrow(std::isfinite(fd_step) && fd_step > 0.0,
                dealii::ExcMessage(entry + ": the finite difference step must be positive, found " +
                                   internal::num(fd_step)));
    AssertThrow(expression.find_first_not_of(" \t") != std::string::npos,
                dealii::ExcMessage(entry + " is empty; expected a formula in x and y, e.g. '5*sin(2*pi*x/100)'"));
    AssertThrow(expression.find(';') == std::string::npos,
                dealii::ExcMessage(entry + " = '" + internal::excerpt(expression, 80) +
                                   "' contains ';'; expected a single formula"));
    for (const auto &c : constants)
      {
        AssertThrow(is_identifier(c.first) && c.first != "x" && c.first != "y",
                    dealii::ExcMessage(entry + ": the constant name '" + internal::excerpt(c.first) +
                                       "' is not usable; expected a name of letters, digits and '_' that starts "
                                       "with a letter and is not x or y"));
        AssertThrow(std::isfinite(c.second), dealii::ExcMessage(entry + ": the constant '" + c.first +
                                                                "' is not a finite number"));
        constants_text += (constants_text.empty() ? "" : ", ") + c.first + " = " + internal::num(c.second);
      }

    parser = std::make_unique<dealii::FunctionParser<2>>(1, 0.0, fd_step);
    std::map<std::string, double> all_constants = constants;
    all_constants.emplace("pi", M_PI);
    const std::string expected = "expected a muParser formula in the variables x and y [nm] with the constants pi" +
                                 (constants_text.empty() ? std::string(" (no Constants defined)")
                                                         : ", " + constants_text);
    std::string problem;
    {
      CerrCapture cerr;
      try
        {
          parser->initialize("x,y", expression, all_constants);
          // Evaluate once so that unknown names and syntax errors surface here, not mid-solve.
          (void)parser->value(dealii::Point<2>());
        }
      catch (const std::exception &e)
        {
          problem = cerr.muparser_message();
          if (problem.empty())
            problem = one_line(e);
        }
      catch (...) // muParser's own error type, thrown while deal.II defines names
        {
          problem = cerr.muparser_message();
          if (problem.empty())
            problem = "a constant name clashes with a function or variable name";
        }
    }
    if (!problem.empty())
      {
        if (problem.find("Unexpected token") != std::string::npos)
          problem += " (a name that is not x, y, pi, a function or a defined constant)";
        AssertThrow(false, dealii::ExcMessage(entry + " = '" + internal::excerpt(expression, 80) +
                                              "' is not a valid formula: " + internal::excerpt(problem, 120) + "; " +
                                              expected));
      }
    parser->set_formula(dealii::AutoDerivativeFunction<2>::FourthOrder);
  }

  FormulaTopography::~FormulaTopography() = default;

  void FormulaTopography::fail_at(const dealii::Point<2> &p, const std::string &what_was_found,
                                  const std::string &expected) const
  {
    AssertThrow(false, dealii::ExcMessage(entry + " = '" + internal::excerpt(expression, 80) + "': at (x, y) = (" +
                                          internal::nm(p[0]) + ", " + internal::nm(p[1]) + ") " + what_was_found +
                                          "; expected " + expected));
  }

  double FormulaTopography::height(const dealii::Point<2> &p) const
  {
    const double h = unit * parser->value(p / unit);
    if (!(std::abs(h) <= max_topography_height))
      fail_at(p, "the height is " + (std::isnan(h) ? std::string("not a number (nan)") : std::isfinite(h) ? internal::nm(h) : internal::num(h)),
              "a finite height with |height| <= " + internal::nm(max_topography_height));
    return h;
  }

  dealii::Tensor<1, 2> FormulaTopography::gradient(const dealii::Point<2> &p) const
  {
    const dealii::Tensor<1, 2> g = parser->gradient(p / unit);
    if (!std::isfinite(g[0]) || !std::isfinite(g[1]))
      fail_at(p, "the slope is (" + internal::num(g[0]) + ", " + internal::num(g[1]) + ")",
              "a finite slope (the formula must be differentiable)");
    return g;
  }

  std::string FormulaTopography::description() const
  {
    return "formula s(x, y) = " + expression + " in units of " + internal::nm(unit) +
           (constants_text.empty() ? "" : " with " + constants_text);
  }
} // namespace nappe

#pragma once

#include <deal.II/base/parameter_handler.h>

#include <memory>
#include <string>

namespace nappe
{
  namespace internal
  {
    struct DeclaredSection;
  }

  /**
   * The entries declared in a handler, read once, to check many texts or assignments against them:
   * reading them prints the whole handler (milliseconds for a case file's ~230 entries), which made a
   * sweep of 2000 points take seconds to check. The checks are those of validate_parameter_text() and
   * validate_assignment(); the handler's values play no part.
   */
  class DeclaredEntries
  {
  public:
    explicit DeclaredEntries(const dealii::ParameterHandler &prm);
    ~DeclaredEntries();

    void check_text(const std::string &text, const std::string &file_name) const;
    void check_assignment(const std::string &assignment, const std::string &origin) const;

  private:
    std::unique_ptr<const internal::DeclaredSection> root;
  };

  /**
   * Checks the text of a parameter file against the entries declared in @p prm before it is read, so
   * that a user sees nappe's own one-line messages instead of the library's: "<file>:<line>:" and the
   * section path, the closest declared name for a misspelt entry or subsection ("did you mean …?"),
   * the subsection that holds an entry written in the wrong place, the allowed values of a selection,
   * a hint when a unit is typed after a number, and an unclosed or unexpected "end". Throws on the
   * first problem.
   */
  void validate_parameter_text(const dealii::ParameterHandler &prm, const std::string &text,
                               const std::string &file_name);

  /**
   * The same check for one assignment "Section/…/Entry=value" given on the command line (--set) or
   * by a sweep axis; @p origin names where it came from (e.g. "--set").
   */
  void validate_assignment(const dealii::ParameterHandler &prm, const std::string &assignment,
                           const std::string &origin);

  /// A pattern description of deal.II ("[Double 0...MAX_DOUBLE (inclusive)]") in words ("a number ≥ 0").
  std::string pattern_in_words(const std::string &description);
} // namespace nappe

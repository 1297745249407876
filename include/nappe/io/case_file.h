#pragma once

#include <deal.II/base/parameter_handler.h>

#include <nappe/io/parameter_validation.h>

#include <string>
#include <vector>

namespace nappe
{
  /**
   * Reads a parameter file into @p prm (entries already declared) with nappe's own messages on bad
   * input, then makes the relative paths it names (file_entries()) relative to the file's directory:
   * a relative path means relative to the file that names it, everywhere in nappe.
   */
  void read_parameter_file(dealii::ParameterHandler &prm, const std::string &path);

  /// The same, checked against @p declared, the entries declared in @p prm read beforehand.
  void read_parameter_file(dealii::ParameterHandler &prm, const std::string &path, const DeclaredEntries &declared);

  /// As read_parameter_file() for text that is not a file (e.g. a built-in demo case named @p name);
  /// relative paths stay relative to the working directory.
  void read_parameter_text(dealii::ParameterHandler &prm, const std::string &text, const std::string &name);

  /// The case-file entries that name files or directories ("Section/…/Entry").
  const std::vector<std::string> &file_entries();

  /// Makes every relative path in the file_entries() present in @p prm relative to @p directory.
  void resolve_relative_paths(dealii::ParameterHandler &prm, const std::string &directory);

  /// The value of a "Section/…/Entry" of @p prm as text; throws naming @p entry if it is not declared.
  std::string entry_text(dealii::ParameterHandler &prm, const std::string &entry);
} // namespace nappe

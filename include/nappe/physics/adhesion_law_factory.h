#pragma once

#include <deal.II/base/parameter_handler.h>

#include <nappe/physics/adhesion_law.h>

#include <functional>
#include <map>
#include <memory>
#include <string>
#include <vector>

namespace nappe
{
  /**
   * One entry of the adhesion law registry: how to declare a law's own parameters and how to
   * build it. Built-in laws ("vdw-9-3", "exponential-cohesive") are registered automatically.
   */
  struct AdhesionLawInfo
  {
    /// Registry name; also the name of the law's own subsection inside "Adhesion".
    std::string name;
    /// One line for the documentation of the "Law" entry.
    std::string description;
    /// Declares the law's own entries; called with the law's subsection already entered.
    std::function<void(dealii::ParameterHandler &)> declare_parameters;
    /// Builds the law from Γ [J/m²], h₀ [m] and its own entries (law subsection entered).
    std::function<std::unique_ptr<AdhesionLaw>(double work_of_adhesion, double equilibrium_gap,
                                               const dealii::ParameterHandler &)>
      create;
  };

  /**
   * Adds a law to the registry, so that declare_adhesion_parameters() offers it and
   * parse_adhesion_parameters() / create_adhesion_law() can build it. Call before declaring
   * parameters; not thread-safe (register at start-up). Throws if the name is taken or empty.
   */
  void register_adhesion_law(AdhesionLawInfo info);

  /// Registered law names, sorted.
  std::vector<std::string> adhesion_law_names();

  /**
   * Declares the subsection "Adhesion" in @p prm:
   *   - "Law"                    registered law name (Selection);
   *   - "Work of adhesion"       Γ, in the unit chosen by "Work of adhesion unit", or "from catalogue";
   *   - "Work of adhesion unit"  "J/m^2" (default), "mJ/m^2" or "meV/A^2" (1 meV/Å² = 0.01602176634 J/m²);
   *   - "Substrate material"     the substrate's name in the catalogue, for "from catalogue";
   *   - "Equilibrium separation" h₀ [nm];
   *   - one subsection per registered law, named after it, with that law's own entries.
   */
  void declare_adhesion_parameters(dealii::ParameterHandler &prm);

  /**
   * Reads the subsection "Adhesion" declared by declare_adhesion_parameters(), converts the
   * values to SI, checks them (Γ between 1e-5 and 50 J/m², h₀ between 0.01 and 50 nm) and builds the
   * selected law; "from catalogue" takes Γ of @p sheet_material on the substrate material. Throws dealii::ExceptionBase with a
   * message naming the offending entry and the expected value if an entry is out of range.
   */
  std::unique_ptr<AdhesionLaw> parse_adhesion_parameters(dealii::ParameterHandler &prm,
                                                         const std::string      &sheet_material = "custom");

  /// The SI factor of a value of "Adhesion/Work of adhesion unit" ("J/m^2" or "meV/A^2"); throws otherwise.
  double work_of_adhesion_unit_factor(const std::string &unit);

  /**
   * Builds a law by name without a parameter file: Γ [J/m²] and h₀ [m] in SI; @p law_options
   * sets the law's own entries by their parameter-file names and in their parameter-file units
   * (e.g. {{"Characteristic length", "0.2"}} in nm for "exponential-cohesive"); entries not
   * given keep their defaults. Goes through the same checks as parse_adhesion_parameters().
   * Throws if @p name is not registered, with the list of registered names.
   */
  std::unique_ptr<AdhesionLaw> create_adhesion_law(const std::string &name, double work_of_adhesion,
                                                   double equilibrium_gap,
                                                   const std::map<std::string, std::string> &law_options = {});
} // namespace nappe

#pragma once

#include <deal.II/base/parameter_handler.h>

#include <nappe/analysis/fabrication_check.h>
#include <nappe/io/electronics_parameters.h>
#include <nappe/solvers/adhesion_path.h>
#include <nappe/solvers/sheet_problem.h>

#include <map>
#include <string>

namespace nappe
{
  /// Where and what a run writes (subsection "Output").
  struct OutputSettings
  {
    std::string directory   = ".";
    std::string base_name   = "sheet";
    bool        write_fields = true;

    /// "<directory>/<base name>": the stem of every result file.
    std::string stem() const { return directory + "/" + base_name; }
  };

  /**
   * A parsed case file: the problem for the solver floor, what to write, and the settings of the
   * threshold search and the fabrication check. Built by parse_sheet_case(); everything in SI.
   */
  struct SheetCase
  {
    std::string    title;
    SheetProblem   problem;
    OutputSettings output;
    /// Range and step control of the threshold search in Γ (subsection "Adhesion limits").
    AdhesionPathSettings limits;
    /// Verdict table over an interface's Γ range and aspect-ratio scan (subsection "Fabrication check").
    FabricationCheckSettings fabrication;
    /// Lattice orientation and strained-lattice export (subsection "Electronics"); the orientation is also
    /// stored in the problem's material (SheetMaterial::lattice), where the electronic quantities read it.
    ElectronicsSettings electronics;
    /// The most memory a run may plan to use (Solver/Memory limit); 0: what the machine has available [bytes].
    double memory_limit = 0.0;
  };

  /**
   * Declares the case file's subsections (Case, Sheet, Domain, Edges, Loads, Substrate,
   * Topography, Adhesion, Adhesion limits, Fabrication check, Electronics, Solver, Output), each
   * entry with a pattern and a documentation string that states its unit. Inputs use the units of
   * the trade (nm, N/m, eV, kPa, nN); parse_sheet_case() converts them to SI.
   */
  void declare_sheet_case_parameters(dealii::ParameterHandler &prm);

  /// Reads a declared and parsed handler into a case; throws with the parameter's name on bad input.
  SheetCase parse_sheet_case(dealii::ParameterHandler &prm);

  /// Parses "id: deflection/in-plane, ..." (or "all: ..."), e.g. "0: clamped/fixed, 1: free/free".
  std::map<dealii::types::boundary_id, EdgeCondition> parse_edge_conditions(const std::string &text,
                                                                            const SheetDomain &domain);
} // namespace nappe

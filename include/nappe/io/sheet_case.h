#pragma once

#include <deal.II/base/parameter_handler.h>

#include <nappe/analysis/fabrication_check.h>
#include <nappe/geometry/sheet_domain.h>
#include <nappe/physics/adhesion_potential.h>
#include <nappe/physics/sheet_model.h>
#include <nappe/solvers/adhesion_path.h>
#include <nappe/solvers/energy_minimizer.h>
#include <nappe/solvers/load_stepping.h>

#include <string>

namespace nappe
{
  /// How the sheet meets the substrate at the start of the load path.
  enum class Protocol
  {
    laid_down,      ///< starts flat at a height above the substrate's top and is pulled in (transfer)
    grown_conformal ///< starts on the surface at the equilibrium gap and relaxes (does it stay?)
  };

  /// Everything a case file defines: the physics, the mesh, the solver and the output.
  struct SheetCase
  {
    std::string          title;
    SheetModel           model;
    SheetDomain          domain;
    LoadSteppingSettings stepping;
    MinimizerSettings    newton;
    std::string          output_directory = ".";
    std::string          output_name      = "sheet";
    bool                 write_fields     = true;
    /// false: compute and measure only, write no file (a sweep writes its own records).
    bool                 write_results    = true;
    /// The substrate (topography + traction–separation law); null for a free sheet.
    std::shared_ptr<const AdhesionPotential> adhesion;
    Protocol protocol = Protocol::laid_down;
    /// Laid down: initial height above the topography's highest point [m].
    double initial_clearance = 0.0;
    /// Range and step control of the threshold search in Γ (subsection "Adhesion limits").
    AdhesionPathSettings limits;
    /// Verdict table over an interface's Γ range and aspect-ratio scan (subsection "Fabrication check").
    FabricationCheckSettings fabrication;
  };

  /**
   * Declares the case file's subsections (Case, Sheet, Domain, Edges, Loads, Substrate,
   * Topography, Adhesion, Adhesion limits, Fabrication check, Solver, Output), each
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

#pragma once

#include <deal.II/base/parameter_handler.h>

#include <nappe/geometry/sheet_domain.h>
#include <nappe/physics/sheet_model.h>
#include <nappe/solvers/energy_minimizer.h>
#include <nappe/solvers/load_stepping.h>

#include <string>

namespace nappe
{
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
  };

  /**
   * Declares the case file's subsections (Case, Sheet, Domain, Edges, Loads, Solver, Output), each
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

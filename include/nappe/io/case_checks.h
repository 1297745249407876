#pragma once

#include <nappe/io/sheet_case.h>

#include <string>
#include <vector>

namespace nappe
{
  /**
   * Values outside what the trade uses, each with its likely cause (e.g. a length typed in metres
   * into an nm entry, or a work of adhesion in mJ/m² typed as J/m²). Warnings, not errors: the values
   * are possible, only unlikely. The ranges are common practice, no source: 0.005–5 J/m² for Γ,
   * 0.1 nm–1 mm for lengths, 1–1000 N/m for the 2D modulus, 0.1–100 eV for the bending rigidity,
   * 0.1–3 nm for the equilibrium separation.
   */
  std::vector<std::string> plausibility_warnings(const SheetCase &sheet_case);

  /// How finely a case is meshed against its features and its adhesion front, and what it will cost.
  struct ResolutionReport
  {
    double             element_size = 0.0; ///< largest element side [m]
    unsigned long long cells        = 0;
    unsigned long long unknowns     = 0;   ///< estimate: 3 fields × (p·√cells + 1)²
    double             memory       = 0.0; ///< estimated peak memory of one Newton step [bytes]
    double             step_time    = 0.0; ///< estimated time of one Newton step on one core [s]
    std::vector<std::string> lines;        ///< the report, one line each, every number with its unit
    std::vector<std::string> warnings;     ///< under-resolved features or adhesion front
  };

  /**
   * The resolution of a case (builds its coarse mesh, solves nothing). The adhesion front is a
   * boundary layer of the sheet on the adhesive well, a plate on an elastic foundation of stiffness
   * k = φ''(h₀): its decay length is ℓ = (4D/k)^{1/4} (Hetényi, Beams on Elastic Foundation, 1946,
   * ch. II); for the 9-3 law k = 27Γ/h₀², so ℓ = (4Dh₀²/27Γ)^{1/4}. It is resolved when a Q_p element
   * has at least one node spacing h/p per ℓ (common practice, no source). Time and memory follow
   * the measured scaling of MUMPS on this project's 2-core machine (benchmarks/README.md): one
   * Newton step ≈ 4 s and 1 GB at 148k unknowns, growing as N^1.3 and N^1.2.
   */
  ResolutionReport resolution_report(const SheetCase &sheet_case);

  /**
   * Loads and checks every input a run will use, without solving: the mesh (resolution_report()), the
   * output directory (exists and is writable), and the topography sampled on a 101 × 101 grid over the
   * sheet (a hole in an STL, a height map sampled outside its scan with Extension = error, a formula
   * that is not finite: each named with the place), and that its slope stays below 10 (84°), beyond
   * which no sheet model applies. Throws on the first problem. Also refuses a case whose estimated
   * memory exceeds Solver/Memory limit (0: the memory this machine has available now).
   */
  void check_case_inputs(const SheetCase &sheet_case, const ResolutionReport &resolution);
} // namespace nappe

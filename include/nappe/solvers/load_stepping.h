#pragma once

#include <nappe/solvers/energy_minimizer.h>

#include <ostream>
#include <vector>

namespace nappe
{
  struct LoadSteppingSettings
  {
    /// Equal increments of the load factor λ from 0 to 1.
    unsigned int load_steps = 4;
    /// How many times in all the increment may be halved along the path before the solve gives up
    /// (after a cut the increment stays at its reduced size).
    unsigned int max_step_cuts = 6;
    /// How many more iteration budgets a step's minimisation may take, from where the last one stopped,
    /// while it is still markedly lowering the energy when its budget runs out (an adhesion front sweeping
    /// across the substrate moves about one element per few Newton iterations: the sheet is on its way).
    unsigned int max_continuations = 4;
    /// Start each step from the tangent predictor U + Δλ·dU/dλ (path_tangent.h) instead of the last state
    /// (off by default: single solves keep their verified warm starts).
    bool tangent_predictor = false;
  };

  struct LoadStep
  {
    double          load_factor = 0.0;
    MinimizerReport report;
  };

  struct LoadPathReport
  {
    bool                  converged = false;
    std::string           message; ///< why the solve stopped, with the last residual and what to try
    std::vector<LoadStep> steps;   ///< converged steps, in order
    unsigned int          newton_iterations = 0;
    unsigned int          step_cuts         = 0;
    double                wall_time         = 0.0; ///< [s]

    /// The report of the last converged step (the result), if any.
    const MinimizerReport &final_state() const { return steps.back().report; }
  };

  /**
   * Follows the load path λ: 0 → 1 at the adhesion factor @p adhesion_factor, minimising the energy
   * at each step from the previous (certified) state, moved along the path's tangent dU/dλ if the
   * settings ask for the tangent predictor. A minimisation that runs out of iterations while still markedly
   * lowering the energy continues from where it stopped (max_continuations); a step that fails otherwise is
   * retried with half the increment.
   * @p state (owned) holds the last certified state on return; it is a result only if the report says
   * converged.
   */
  LoadPathReport follow_load_path(EnergyMinimizer &minimizer, Vector &state, const LoadSteppingSettings &settings,
                                  std::ostream *log = nullptr, double adhesion_factor = 1.0);
} // namespace nappe

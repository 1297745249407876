#pragma once

#include <nappe/analysis/adhesion_limits.h>

#include <functional>
#include <optional>
#include <string>
#include <vector>

namespace nappe
{
  /// What a fabrication check asks: an interface Γ range, and optionally a feature family to scan.
  struct FabricationCheckSettings
  {
    bool enabled = false;
    double       lowest_work_of_adhesion  = 0.2; ///< weakest expected interface [J/m²]
    double       highest_work_of_adhesion = 0.6; ///< strongest expected interface [J/m²]
    unsigned int rows                     = 5;   ///< Γ values in the table, evenly spaced in ln Γ
    /// Lateral size of the feature the aspect ratio refers to (wavelength, pillar diameter…) [m];
    /// 0: no aspect-ratio scan.
    double feature_width = 0.0;
    double feature_height = 0.0; ///< the case's feature height [m]
    /// The case-file entry that holds the feature height in nm, "Section/…/Entry" (for the scan).
    std::string feature_height_entry;
  };

  /// One row of the verdict table: the sheet at one Γ of the interface range.
  struct VerdictRow
  {
    double            work_of_adhesion = 0.0; ///< [J/m²]
    AdhesionPathPoint transferred;            ///< laid down (the raising path) at this Γ
    AdhesionPathPoint grown;                  ///< starting conformed (the lowering path) at this Γ
    std::optional<double> margin;             ///< Γ/Γ_hold, if Γ_hold was found
  };

  struct FabricationCheck
  {
    std::vector<VerdictRow> rows;
    double fracture_strain = 0.0; ///< of the sheet material; 0 if unknown [-]
    /// Largest feature height/width for which the conformed sheet stays conformed at the weakest Γ
    /// with its peak strain below the fracture strain; empty if not scanned or not bracketed.
    std::optional<double> largest_safe_aspect_ratio;
    std::string           aspect_ratio_note; ///< how it was found, or why not
  };

  /// The Γ values of the table (geometric spacing over the settings' range) [J/m²].
  std::vector<double> verdict_work_of_adhesion_values(const FabricationCheckSettings &settings);

  /// The verdict table from limits whose paths stopped at verdict_work_of_adhesion_values().
  FabricationCheck fabrication_verdicts(const AdhesionLimits &limits, const FabricationCheckSettings &settings,
                                        double fracture_strain);

  /// A feature height bracketed between a safe and an unsafe one [m]; a zero end was not found.
  struct HeightBracket
  {
    double safe   = 0.0;
    double unsafe = 0.0;
    bool   found() const { return safe > 0 && unsafe > 0; }
  };

  /**
   * Brackets the largest height for which @p safe holds, assuming one change from safe to unsafe as
   * the height grows: from @p start, doubling while safe or halving while unsafe (at most 8 times),
   * then @p bisections bisections of the bracket.
   */
  HeightBracket bracket_safe_height(const std::function<bool(double height)> &safe, double start,
                                    unsigned int bisections);

  /**
   * The largest safe aspect ratio of a feature family: @p problem_with_height builds the problem with a
   * given feature height [m] (all else fixed). A height is safe when the sheet, lowered in Γ from
   * the conformed state at the strongest Γ, is still conformed (fraction ≥ target) at the weakest Γ
   * and its peak principal strain there is below the fracture strain (if known). The height is
   * bracketed by doubling/halving from the case's height, then bisected @p bisections times.
   */
  void scan_aspect_ratio(FabricationCheck &check, const FabricationCheckSettings &settings,
                         const AdhesionPathSettings &path_settings,
                         const std::function<SheetProblem(double height)> &problem_with_height, MPI_Comm comm,
                         unsigned int bisections = 6, std::ostream *log = nullptr);

  /// The regime name (classify_regime()) of a state of @p path.
  std::string verdict(const AdhesionPath &path, const AdhesionPathPoint &state, double target_fraction);
} // namespace nappe

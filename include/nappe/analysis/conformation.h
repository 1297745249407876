#pragma once

#include <nappe/analysis/sheet_evaluation.h>
#include <nappe/physics/adhesion_potential.h>
#include <nappe/solvers/sheet_system.h>

#include <vector>

namespace nappe
{
  /// A connected region of the sheet that is not conformed (tented, bridging or delaminated).
  struct SuspendedRegion
  {
    double           area    = 0.0; ///< [m²]
    double           max_gap = 0.0; ///< largest height above the substrate [m]
    dealii::Point<2> max_gap_location;

    template <class Archive>
    void serialize(Archive &ar, const unsigned int)
    {
      ar &area &max_gap &max_gap_location;
    }
  };

  /// An area-weighted histogram of a strain measure over the sheet.
  struct StrainHistogram
  {
    std::string         quantity;
    std::vector<double> bin_edges; ///< n + 1 edges [-]
    std::vector<double> area;      ///< area per bin [m²]
  };

  /**
   * How the sheet sits on the substrate. The conformed fraction is the share of the sheet's
   * (projected) area whose gap lies within the attractive range up to the peak traction,
   * g ≤ g_peak of the adhesion law. Suspended regions are the connected sets of cells (across
   * periodic edges too) in which more than half the area is not conformed.
   *
   * Raised parts and floor (our definitions): the floor is where the substrate height lies in the
   * lower half of its range over the sheet, s < (s_min + s_max)/2; the rest is raised (feature tops,
   * crests). A flat substrate is all floor. Contact is split accordingly, so that a sheet tenting on
   * pillar tops (floor untouched) is told apart from one that touches the floor between them.
   */
  struct ConformationMeasures
  {
    double                       conformed_fraction = 0.0; ///< [-]
    double                       conformed_area     = 0.0; ///< [m²]
    double                       sheet_area         = 0.0; ///< [m²]
    double                       floor_area         = 0.0; ///< area over the floor [m²]
    double                       conformed_floor_area = 0.0; ///< conformed area over the floor [m²]
    double                       max_gap            = 0.0; ///< [m]
    dealii::Point<2>             max_gap_location;
    std::vector<SuspendedRegion> suspended_regions; ///< largest first
    /// One per quantity of the table with a histogram label (sheet_quantities.h), in table order.
    std::vector<StrainHistogram> histograms;

    /// Share of the sheet's area in contact over raised parts [-].
    double raised_contact_fraction() const { return (conformed_area - conformed_floor_area) / sheet_area; }
    /// Share of the sheet's area in contact over the floor [-].
    double floor_contact_fraction() const { return conformed_floor_area / sheet_area; }
    /// Share of the floor that the sheet touches [-] (0 if there is no floor).
    double floor_touched() const { return floor_area > 0 ? conformed_floor_area / floor_area : 0.0; }
  };

  /// The conformation of the sheet on its adhesion substrate (the model's), with @p histogram_bins
  /// bins per histogram. Collective.
  ConformationMeasures measure_conformation(const SheetSystem &system, const Vector &state, const LoadLevel &level,
                                            unsigned int histogram_bins = 20);

  /**
   * The conformed fraction with a graded edge, which an adhesion path's branch test compares (our
   * definition): a point counts 1 where g ≤ g_peak, falling linearly to 0 at g_peak + h₀. It changes
   * continuously with the state (a change δw of the deflection changes it by at most δw/h₀ times the
   * share of the area on the ramp), whereas the conformed fraction changes by a Gauss point's whole
   * weight, on a grating cell by a whole column's, whenever a moving front passes one. Collective.
   */
  double graded_conformed_fraction(const SheetSystem &system, const Vector &state);
} // namespace nappe

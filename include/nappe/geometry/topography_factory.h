#pragma once

#include <nappe/geometry/topography.h>

#include <functional>
#include <memory>
#include <string>
#include <vector>

namespace dealii
{
  class ParameterHandler;
}

namespace nappe
{
  /**
   * Registry of topographies by name and their parameters, in subsection "Topography" of a deal.II
   * ParameterHandler. Lengths in the parameter file are in nm, angles in degrees; every entry's
   * documentation states its unit. Layout:
   *
   *   subsection Topography
   *     set Type           = pillar        # a registered name, see registered_names()
   *     set Array          = none          # none | square | hexagonal: repeat the feature
   *     set Array pitch    = 200           # [nm]
   *     set Rotation angle = 0             # [deg], counter-clockwise about the origin
   *     set Offset x = 0, Offset y = 0     # [nm], lateral shift, applied last
   *     set Vertical offset = 0            # [nm]
   *     subsection Pillar                  # one subsection per type, named as the type capitalised
   *       set Height = 20 ...
   *
   * The result is offset ∘ rotation ∘ array(feature). Built-in types: flat, sinusoidal grating, egg
   * carton, gaussian bump, pillar, cone, ring ridge, trench, step, formula, height map, stl.
   */
  namespace TopographyFactory
  {
    /// Declare an entry's parameters inside its own subsection (already entered).
    using Declarer = std::function<void(dealii::ParameterHandler &)>;
    /// Build from the parameters of its own subsection (already entered), in SI.
    using Creator = std::function<std::unique_ptr<Topography>(dealii::ParameterHandler &)>;

    /**
     * Register a type under `name` (lower case, e.g. "pillar") with its parameter subsection name
     * (e.g. "Pillar"). Call before declare_parameters(). Throws if the name is taken.
     */
    void register_type(const std::string &name, const std::string &subsection, Declarer declare, Creator create);

    /// Names of all registered types, sorted.
    std::vector<std::string> registered_names();

    /// Declare subsection "Topography" (entered from the current level of prm).
    void declare_parameters(dealii::ParameterHandler &prm);

    /**
     * Build the topography described by subsection "Topography"; throws naming the offending parameter.
     * Shared because the wrappers (array, rotation, offset) share their members.
     */
    std::shared_ptr<const Topography> parse_parameters(dealii::ParameterHandler &prm);
  } // namespace TopographyFactory
} // namespace nappe

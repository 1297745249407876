#include <deal.II/base/parameter_handler.h>

#include <nappe/base/units.h>
#include <nappe/geometry/height_limit.h>
#include <nappe/geometry/formula_topography.h>
#include <nappe/geometry/height_map.h>
#include <nappe/geometry/lattice_array.h>
#include <nappe/geometry/linear_features.h>
#include <nappe/geometry/radial_features.h>
#include <nappe/geometry/sinusoidal_topography.h>
#include <nappe/geometry/stl_topography.h>
#include <nappe/geometry/topography_factory.h>
#include <nappe/geometry/transformed_topography.h>

#include <algorithm>
#include <cmath>
#include <map>
#include <mutex>
#include <sstream>

#include "format.h"

namespace nappe::TopographyFactory
{
  namespace
  {
    using dealii::ParameterHandler;
    using dealii::Patterns::Bool;
    using dealii::Patterns::Double;
    using dealii::Patterns::Anything;
    using dealii::Patterns::Selection;

    constexpr double nm  = units::nanometer;
    constexpr double deg = M_PI / 180.0;

    struct Entry
    {
      std::string subsection;
      Declarer    declare;
      Creator     create;
    };

    /// Bound of every length entry [nm]: max_topography_height (1 mm), so that a mistyped exponent
    /// (e.g. a height of 1e308) is refused where it is read, naming the entry and the range.
    constexpr double max_length_nm = max_topography_height / nm;

    /// A scan whose node spacing or height range is below this is read in the wrong unit: 0.001 nm is
    /// two orders below an atom (common practice, no source) [m].
    constexpr double sub_atomic_length = 1e-3 * nm;

    /// Refuses a height map whose spacing or height range is sub-atomic: a scan exported in metres and
    /// read in nm would otherwise be a flat surface, and the run a plausible, wrong "conforms".
    void check_scan_units(const HeightMap &map, ParameterHandler &prm)
    {
      const std::string where = "Topography/Height map/";
      for (unsigned int d = 0; d < 2; ++d)
        AssertThrow(map.spacing()[d] >= sub_atomic_length,
                    dealii::ExcMessage(where + "File '" + prm.get("File") + "': the node spacing along " +
                                       (d == 0 ? "x" : "y") + " is " + internal::nm(map.spacing()[d]) +
                                       ", far smaller than an atom; is Length unit = " + prm.get("Length unit") +
                                       " right? (a spacing written in metres needs Length unit = m)"));
      double lowest = map.node_value(0, 0), highest = lowest;
      for (unsigned int j = 0; j < map.n_points_y(); ++j)
        for (unsigned int i = 0; i < map.n_points_x(); ++i)
          {
            lowest  = std::min(lowest, map.node_value(i, j));
            highest = std::max(highest, map.node_value(i, j));
          }
      AssertThrow(highest == lowest || highest - lowest >= sub_atomic_length,
                  dealii::ExcMessage(where + "File '" + prm.get("File") + "': the heights span only " +
                                     internal::nm(highest - lowest) + ", far less than an atom; is Height unit = " +
                                     prm.get("Height unit") + " right? (heights written in metres need Height "
                                     "unit = m)"));
    }

    /// A length entry in [lower, 1e6] nm, or in [−1e6, 1e6] nm when @p signed_length.
    void declare_length(ParameterHandler &prm, const std::string &name, const std::string &value,
                        const std::string &doc, const bool signed_length = false)
    {
      prm.declare_entry(name, value, Double(signed_length ? -max_length_nm : 0.0, max_length_nm),
                        doc + " [nm], at most 1e6 nm (1 mm) in magnitude");
    }

    void declare_angle(ParameterHandler &prm, const std::string &doc)
    {
      prm.declare_entry("Sidewall angle", "80", Double(0.0, 90.0),
                        doc + " [deg], strictly between 0 and 90: a height field cannot have a vertical wall");
    }

    void register_builtins(std::map<std::string, Entry> &r)
    {
      r["flat"] = {"Flat", [](ParameterHandler &) {},
                   [](ParameterHandler &) { return std::make_unique<FlatTopography>(); }};

      r["sinusoidal grating"] = {"Sinusoidal grating",
        [](ParameterHandler &prm) {
          declare_length(prm, "Amplitude", "5", "Amplitude A of s = A cos(2 pi x / lambda)", true);
          declare_length(prm, "Wavelength", "100", "Wavelength lambda (period along x)");
        },
        [](ParameterHandler &prm) {
          return std::make_unique<SinusoidalGrating>(prm.get_double("Amplitude") * nm, prm.get_double("Wavelength") * nm);
        }};

      r["egg carton"] = {"Egg carton",
        [](ParameterHandler &prm) {
          declare_length(prm, "Amplitude", "5", "Amplitude A of s = A cos(kx) cos(ky)", true);
          declare_length(prm, "Wavelength", "100", "Wavelength lambda = 2 pi / k (period along x and y)");
        },
        [](ParameterHandler &prm) {
          return std::make_unique<EggCarton>(prm.get_double("Amplitude") * nm, prm.get_double("Wavelength") * nm);
        }};

      r["gaussian bump"] = {"Gaussian bump",
        [](ParameterHandler &prm) {
          declare_length(prm, "Height", "10", "Peak height H of s = H exp(-r^2/(2 sigma^2)); negative for a dimple",
                         true);
          declare_length(prm, "Width", "20", "Standard deviation sigma");
        },
        [](ParameterHandler &prm) {
          return std::make_unique<GaussianBump>(prm.get_double("Height") * nm, prm.get_double("Width") * nm);
        }};

      r["pillar"] = {"Pillar",
        [](ParameterHandler &prm) {
          declare_length(prm, "Height", "20", "Pillar height H");
          declare_length(prm, "Radius", "50", "Pillar radius at half height");
          declare_length(prm, "Edge radius", "5", "Rounding radius of the top edge");
          declare_length(prm, "Foot radius", "5", "Rounding radius of the foot, where the sidewall meets the substrate");
          declare_angle(prm, "Sidewall angle to the substrate plane");
        },
        [](ParameterHandler &prm) {
          return std::make_unique<Pillar>(prm.get_double("Height") * nm, prm.get_double("Radius") * nm,
                                          prm.get_double("Edge radius") * nm, prm.get_double("Foot radius") * nm,
                                          prm.get_double("Sidewall angle") * deg);
        }};

      r["cone"] = {"Cone",
        [](ParameterHandler &prm) {
          declare_length(prm, "Height", "20", "Cone height H");
          declare_length(prm, "Base radius", "50", "Radius of the (unrounded) base circle");
          declare_length(prm, "Tip radius", "5", "Rounding radius of the tip");
          declare_length(prm, "Foot radius", "5", "Rounding radius where the cone meets the substrate");
        },
        [](ParameterHandler &prm) {
          return std::make_unique<Cone>(prm.get_double("Height") * nm, prm.get_double("Base radius") * nm,
                                        prm.get_double("Tip radius") * nm, prm.get_double("Foot radius") * nm);
        }};

      r["ring ridge"] = {"Ring ridge",
        [](ParameterHandler &prm) {
          declare_length(prm, "Height", "10", "Ridge height H");
          declare_length(prm, "Ring radius", "100", "Radius of the ridge's centre line");
          declare_length(prm, "Width", "30", "Ridge width at half height");
          declare_length(prm, "Edge radius", "3", "Rounding radius of all four edges of the cross-section");
          declare_angle(prm, "Sidewall angle to the substrate plane");
        },
        [](ParameterHandler &prm) {
          return std::make_unique<RingRidge>(prm.get_double("Height") * nm, prm.get_double("Ring radius") * nm,
                                             prm.get_double("Width") * nm, prm.get_double("Edge radius") * nm,
                                             prm.get_double("Sidewall angle") * deg);
        }};

      r["trench"] = {"Trench",
        [](ParameterHandler &prm) {
          declare_length(prm, "Depth", "20", "Trench depth D (the bottom is at s = -D)");
          declare_length(prm, "Width", "100", "Trench width at half depth");
          declare_length(prm, "Edge radius", "5", "Rounding radius of the rims and bottom corners");
          declare_angle(prm, "Sidewall angle to the substrate plane");
        },
        [](ParameterHandler &prm) {
          return std::make_unique<Trench>(prm.get_double("Depth") * nm, prm.get_double("Width") * nm,
                                          prm.get_double("Edge radius") * nm, prm.get_double("Sidewall angle") * deg);
        }};

      r["step"] = {"Step",
        [](ParameterHandler &prm) {
          declare_length(prm, "Height", "10", "Step height H (s = 0 for x << 0, H for x >> 0); negative steps down",
                         true);
          declare_length(prm, "Edge radius", "5", "Rounding radius of both edges");
          declare_angle(prm, "Sidewall angle to the substrate plane");
        },
        [](ParameterHandler &prm) {
          return std::make_unique<Step>(prm.get_double("Height") * nm, prm.get_double("Edge radius") * nm,
                                        prm.get_double("Sidewall angle") * deg);
        }};

      r["formula"] = {"Formula",
        [](ParameterHandler &prm) {
          prm.declare_entry("Expression", "0", Anything(),
                            "muParser expression for the height in nm of the variables x and y in nm, e.g. "
                            "'A*exp(-(x^2+y^2)/(2*w^2))'; pi is predefined");
          prm.declare_entry("Constants", "", Anything(),
                            "Constants of the expression, 'name=value, name=value', values in nm where they are "
                            "lengths");
          prm.declare_entry("Finite difference step", "1e-3", Double(0.0),
                            "Step of the fourth-order central difference for the gradient [nm]");
          declare_length(prm, "Support radius", "0",
                         "Radius around the origin outside which the expression is zero, needed to array it; 0 "
                         "means not localised");
        },
        [](ParameterHandler &prm) {
          std::map<std::string, double> constants;
          std::istringstream            list(prm.get("Constants"));
          for (std::string item; std::getline(list, item, ',');)
            {
              if (item.find_first_not_of(" \t") == std::string::npos)
                continue;
              const auto eq = item.find('=');
              AssertThrow(eq != std::string::npos,
                          dealii::ExcMessage("Topography/Formula/Constants: expected 'name=value', found '" +
                                             internal::excerpt(item) + "'"));
              std::string name = item.substr(0, eq);
              name.erase(0, name.find_first_not_of(" \t"));
              name.erase(name.find_last_not_of(" \t") + 1);
              const std::string value = item.substr(eq + 1);
              char             *end   = nullptr;
              const double      v     = std::strtod(value.c_str(), &end);
              AssertThrow(!name.empty() && end != value.c_str() &&
                            std::string(end).find_first_not_of(" \t") == std::string::npos && std::isfinite(v),
                          dealii::ExcMessage("Topography/Formula/Constants: expected 'name=number', found '" +
                                             internal::excerpt(item) + "'"));
              constants[name] = v;
            }
          const double support = prm.get_double("Support radius");
          return std::make_unique<FormulaTopography>(prm.get("Expression"), constants, nm,
                                                     prm.get_double("Finite difference step"),
                                                     support > 0.0 ? support * nm
                                                                   : std::numeric_limits<double>::infinity());
        }};

      r["height map"] = {"Height map",
        [](ParameterHandler &prm) {
          prm.declare_entry("File", "", Anything(), "Plain-text height map (AFM export)");
          prm.declare_entry("Format", "matrix", Selection("matrix|xyz"),
                            "matrix: one row of heights per line; xyz: one 'x y z' point per line on a regular grid");
          prm.declare_entry("Length unit", "nm", Selection("m|mm|um|nm|A"),
                            "Unit of the x, y coordinates in the file (xyz) and of Spacing and Origin");
          prm.declare_entry("Height unit", "nm", Selection("m|mm|um|nm|A|pm"), "Unit of the heights in the file");
          prm.declare_entry("Spacing x", "1", Double(0.0), "Matrix format: node spacing along x [Length unit]");
          prm.declare_entry("Spacing y", "1", Double(0.0), "Matrix format: node spacing along y [Length unit]");
          prm.declare_entry("Origin x", "0", Double(), "Matrix format: x of the first column [Length unit]");
          prm.declare_entry("Origin y", "0", Double(), "Matrix format: y of the first row [Length unit]");
          prm.declare_entry("First row at top", "false", Bool(),
                            "Matrix format: the first row is the largest y (image convention)");
          prm.declare_entry("Levelling", "none", Selection("none|plane"),
                            "plane: subtract the least-squares plane (the mean height becomes zero)");
          prm.declare_entry("Smoothing width", "0", Double(0.0),
                            "Standard deviation of a Gaussian smoothing applied after levelling; 0 for none [nm]");
          prm.declare_entry("Extension", "clamped", Selection("clamped|periodic|error"),
                            "Outside the scan: clamped (flat continuation, zero edge slope), periodic (period = "
                            "number of nodes x spacing), error");
        },
        [](ParameterHandler &prm) {
          const std::string file = prm.get("File");
          AssertThrow(!file.empty(), dealii::ExcMessage("Topography/Height map/File: no file name given"));
          HeightMap::ReadOptions o;
          o.format           = prm.get("Format") == "xyz" ? HeightMap::ReadOptions::Format::xyz
                                                          : HeightMap::ReadOptions::Format::matrix;
          o.length_unit      = length_unit_from_name(prm.get("Length unit"));
          o.height_unit      = length_unit_from_name(prm.get("Height unit"));
          o.spacing[0]       = prm.get_double("Spacing x") * o.length_unit;
          o.spacing[1]       = prm.get_double("Spacing y") * o.length_unit;
          o.origin[0]        = prm.get_double("Origin x") * o.length_unit;
          o.origin[1]        = prm.get_double("Origin y") * o.length_unit;
          o.first_row_at_top = prm.get_bool("First row at top");
          const std::string e = prm.get("Extension");
          o.extension = e == "periodic" ? HeightMap::Extension::periodic
                        : e == "error"  ? HeightMap::Extension::error
                                        : HeightMap::Extension::clamped;
          if (o.format == HeightMap::ReadOptions::Format::matrix)
            AssertThrow(o.spacing[0] > 0.0 && o.spacing[1] > 0.0,
                        dealii::ExcMessage("Topography/Height map/Spacing x and Spacing y must be positive for the "
                                           "matrix format"));
          auto map = std::make_unique<HeightMap>(HeightMap::read(file, o));
          check_scan_units(*map, prm);
          if (prm.get("Levelling") == "plane")
            map->level_plane();
          map->smooth(prm.get_double("Smoothing width") * nm);
          return map;
        }};

      r["stl"] = {"STL",
        [](ParameterHandler &prm) {
          prm.declare_entry("File", "", Anything(), "STL file (ASCII or binary), read as a height field");
          prm.declare_entry("Length unit", "nm", Selection("m|mm|um|nm|A"), "Unit of the STL coordinates");
          prm.declare_entry("Outside", "error", Selection("error|constant"),
                            "Off the STL's footprint: error, or constant = Outside height");
          declare_length(prm, "Outside height", "0", "Height off the footprint when Outside = constant",
                         true);
        },
        [](ParameterHandler &prm) {
          const std::string file = prm.get("File");
          AssertThrow(!file.empty(), dealii::ExcMessage("Topography/STL/File: no file name given"));
          StlTopography::Options o;
          o.length_unit    = length_unit_from_name(prm.get("Length unit"));
          o.outside        = prm.get("Outside") == "constant" ? StlTopography::Outside::constant
                                                              : StlTopography::Outside::error;
          o.outside_height = prm.get_double("Outside height") * nm;
          auto stl         = std::make_unique<StlTopography>(file, o);
          const dealii::Tensor<1, 2> extent = stl->footprint_upper() - stl->footprint_lower();
          AssertThrow(std::max(extent[0], extent[1]) >= sub_atomic_length,
                      dealii::ExcMessage("Topography/STL/File '" + file + "': the footprint spans only " +
                                         internal::nm(std::max(extent[0], extent[1])) +
                                         ", far less than an atom; is Length unit = " + prm.get("Length unit") +
                                         " right? (an STL in mm needs Length unit = mm)"));
          return stl;
        }};
    }

    std::map<std::string, Entry> &registry()
    {
      static std::map<std::string, Entry> r = [] {
        std::map<std::string, Entry> m;
        register_builtins(m);
        return m;
      }();
      return r;
    }

    std::mutex registry_mutex;

    /// Enters a subsection and leaves it again on scope exit, also when a parameter check throws,
    /// so that a caller catching the error finds prm at the level it left it.
    struct SubsectionGuard
    {
      SubsectionGuard(dealii::ParameterHandler &prm, const std::string &name)
        : prm(prm)
      {
        prm.enter_subsection(name);
      }
      ~SubsectionGuard() { prm.leave_subsection(); }
      dealii::ParameterHandler &prm;
    };
  } // namespace


  void register_type(const std::string &name, const std::string &subsection, Declarer declare, Creator create)
  {
    std::lock_guard<std::mutex> lock(registry_mutex);
    AssertThrow(!name.empty() && name.find('|') == std::string::npos && name.find(',') == std::string::npos,
                dealii::ExcMessage("Topography registry: invalid type name '" + name + "'"));
    AssertThrow(registry().count(name) == 0,
                dealii::ExcMessage("Topography registry: the type name '" + name + "' is already registered"));
    registry()[name] = {subsection, std::move(declare), std::move(create)};
  }

  std::vector<std::string> registered_names()
  {
    std::lock_guard<std::mutex> lock(registry_mutex);
    std::vector<std::string>    names;
    for (const auto &e : registry())
      names.push_back(e.first);
    return names;
  }

  void declare_parameters(dealii::ParameterHandler &prm)
  {
    std::string selection;
    for (const auto &n : registered_names())
      selection += (selection.empty() ? "" : "|") + n;
    prm.enter_subsection("Topography");
    prm.declare_entry("Type", "flat", Selection(selection), "Substrate topography, one of: " + selection);
    prm.declare_entry("Array", "none", Selection("none|square|hexagonal"),
                      "Repeat the feature on a lattice (the feature must be localised)");
    declare_length(prm, "Array pitch", "200", "Lattice constant (nearest-neighbour distance)");
    prm.declare_entry("Rotation angle", "0", Double(-360.0, 360.0), "Counter-clockwise rotation about the origin [deg]");
    declare_length(prm, "Offset x", "0", "Lateral shift along x, applied after the rotation", true);
    declare_length(prm, "Offset y", "0", "Lateral shift along y, applied after the rotation", true);
    declare_length(prm, "Vertical offset", "0", "Added to the height", true);
    std::lock_guard<std::mutex> lock(registry_mutex);
    for (const auto &e : registry())
      {
        prm.enter_subsection(e.second.subsection);
        e.second.declare(prm);
        prm.leave_subsection();
      }
    prm.leave_subsection();
  }

  std::shared_ptr<const Topography> parse_parameters(dealii::ParameterHandler &prm)
  {
    SubsectionGuard   topography(prm, "Topography");
    const std::string type = prm.get("Type");
    Entry             entry;
    {
      std::lock_guard<std::mutex> lock(registry_mutex);
      const auto                  it = registry().find(type);
      AssertThrow(it != registry().end(),
                  dealii::ExcMessage("Topography/Type: '" + type + "' is not a registered topography"));
      entry = it->second;
    }
    std::shared_ptr<const Topography> t;
    {
      SubsectionGuard own(prm, entry.subsection);
      t = entry.create(prm);
    }

    const std::string array = prm.get("Array");
    if (array != "none")
      {
        const double pitch = prm.get_double("Array pitch") * nm;
        AssertThrow(pitch > 0.0, dealii::ExcMessage("Topography/Array pitch must be positive when Array = " + array));
        AssertThrow(std::isfinite(t->support_radius()),
                    dealii::ExcMessage("Topography/Array = " + array + " needs a localised feature, but Type = '" +
                                       type + "' is not localised"));
        t = array == "square" ? std::shared_ptr<const Topography>(LatticeArray::square(t, pitch))
                              : std::shared_ptr<const Topography>(LatticeArray::hexagonal(t, pitch));
      }
    const double angle = prm.get_double("Rotation angle") * deg;
    if (angle != 0.0)
      t = std::make_shared<RotatedTopography>(t, angle);
    const dealii::Point<2> shift(prm.get_double("Offset x") * nm, prm.get_double("Offset y") * nm);
    const double           dz = prm.get_double("Vertical offset") * nm;
    if (shift.norm() > 0.0 || dz != 0.0)
      t = std::make_shared<OffsetTopography>(t, shift, dz);
    return t;
  }
} // namespace nappe::TopographyFactory

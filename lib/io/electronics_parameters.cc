#include <deal.II/base/utilities.h>

#include <nappe/base/units.h>
#include <nappe/io/electronics_parameters.h>

#include <cmath>

namespace nappe
{
  using namespace dealii;

  namespace
  {
    const char *const where = "Electronics/Lattice export/";

    std::vector<double> numbers(const std::string &text, const std::string &entry)
    {
      try
        {
          return Utilities::string_to_double(Utilities::split_string_list(text, ','));
        }
      catch (...)
        {
          AssertThrow(false, ExcMessage(std::string(where) + entry + ": expected numbers in nm, found '" + text + "'."));
        }
      return {};
    }

    std::vector<Point<2>> parse_box(const std::string &text)
    {
      const auto v = numbers(text, "Box");
      AssertThrow(v.size() == 4 && v[2] > v[0] && v[3] > v[1],
                  ExcMessage(std::string(where) + "Box: expected 'x0, y0, x1, y1' in nm with x1 > x0 and y1 > y0, "
                             "found '" + text + "'."));
      const double nm = units::nanometer;
      return {Point<2>(v[0] * nm, v[1] * nm), Point<2>(v[2] * nm, v[1] * nm), Point<2>(v[2] * nm, v[3] * nm),
              Point<2>(v[0] * nm, v[3] * nm)};
    }

    std::vector<Point<2>> parse_polygon(const std::string &text)
    {
      std::vector<Point<2>> polygon;
      for (const std::string &vertex : Utilities::split_string_list(text, ';'))
        {
          const auto v = numbers(vertex, "Polygon");
          AssertThrow(v.size() == 2, ExcMessage(std::string(where) + "Polygon: expected 'x y' pairs in nm separated "
                                                "by ';' (e.g. '0, 0; 10, 0; 5, 8'), found '" + vertex + "'."));
          polygon.emplace_back(v[0] * units::nanometer, v[1] * units::nanometer);
        }
      AssertThrow(polygon.size() >= 3,
                  ExcMessage(std::string(where) + "Polygon: expected at least 3 vertices, found " +
                             std::to_string(polygon.size()) + "."));
      return polygon;
    }
  } // namespace

  void declare_electronics_parameters(ParameterHandler &prm)
  {
    prm.enter_subsection("Electronics");
    prm.declare_entry("Zigzag angle", "0", Patterns::Double(-360, 360),
                      "Angle from the x axis to a zigzag direction of the sheet's crystal lattice, counter-clockwise. "
                      "60 deg exchanges the sublattices (the pseudo-magnetic field changes sign), 120 deg gives the "
                      "same lattice [deg].");
    prm.enter_subsection("Lattice export");
    prm.declare_entry("Enabled", "false", Patterns::Bool(),
                      "After a converged run, write the strained atoms as <base>_lattice.xyz (extended XYZ with "
                      "per-atom strain and field columns) and <base>_lattice.cif (P 1) [-].");
    prm.declare_entry("Region", "cell", Patterns::Selection("cell|box|polygon"),
                      "cell: the whole periodic cell on the nearest commensurate supercell; box or polygon: a flake "
                      "of the undeformed lattice clipped to the region [-].");
    prm.declare_entry("Box", "0, 0, 10, 10", Patterns::Anything(), "Region = box: 'x0, y0, x1, y1' [nm].");
    prm.declare_entry("Polygon", "", Patterns::Anything(),
                      "Region = polygon: vertices 'x y' in order, separated by ';', e.g. '0, 0; 10, 0; 5, 8' [nm].");
    prm.declare_entry("Largest residual strain", "0.001", Patterns::Double(0, 0.1),
                      "Region = cell: refuse if the commensurate supercell strains the lattice by more [-].");
    prm.declare_entry("Vacuum", "2", Patterns::Double(0), "Empty space added around the atoms in the cell [nm].");
    prm.declare_entry("Formats", "xyz, cif", Patterns::MultipleSelection("xyz|cif"), "Files to write [-].");
    prm.leave_subsection();
    prm.leave_subsection();
  }

  ElectronicsSettings parse_electronics_parameters(ParameterHandler &prm)
  {
    ElectronicsSettings s;
    prm.enter_subsection("Electronics");
    s.zigzag_angle = prm.get_double("Zigzag angle") * M_PI / 180.0;
    prm.enter_subsection("Lattice export");
    s.export_lattice  = prm.get_bool("Enabled");
    auto &e           = s.lattice_export;
    const auto region = prm.get("Region");
    e.region = region == "cell" ? LatticeExportSettings::Region::cell : LatticeExportSettings::Region::polygon;
    if (region == "box")
      e.polygon = parse_box(prm.get("Box"));
    else if (region == "polygon")
      e.polygon = parse_polygon(prm.get("Polygon"));
    e.largest_residual_strain = prm.get_double("Largest residual strain");
    e.vacuum                  = prm.get_double("Vacuum") * units::nanometer;
    const auto formats        = Utilities::split_string_list(prm.get("Formats"));
    e.write_xyz = std::find(formats.begin(), formats.end(), "xyz") != formats.end();
    e.write_cif = std::find(formats.begin(), formats.end(), "cif") != formats.end();
    AssertThrow(!s.export_lattice || e.write_xyz || e.write_cif,
                ExcMessage(std::string(where) + "Formats: expected at least one of xyz, cif."));
    prm.leave_subsection();
    prm.leave_subsection();
    return s;
  }
} // namespace nappe

#include <deal.II/base/utilities.h>

#include <nappe/base/units.h>
#include <nappe/io/sheet_case.h>
#include <nappe/geometry/topography_factory.h>
#include <nappe/physics/adhesion_law_factory.h>
#include <nappe/physics/material_catalogue.h>

namespace nappe
{
  using namespace dealii;

  namespace
  {
    void declare_tensor(ParameterHandler &prm, const std::string &name, const std::string &doc)
    {
      for (const std::string c : {"xx", "yy", "xy"})
        prm.declare_entry(name + " " + c, "0", Patterns::Double(-0.5, 0.5), doc + " component " + c + " [-]");
    }

    SymmetricTensor<2, 2> parse_tensor(ParameterHandler &prm, const std::string &name)
    {
      SymmetricTensor<2, 2> t;
      t[0][0] = prm.get_double(name + " xx");
      t[1][1] = prm.get_double(name + " yy");
      t[0][1] = prm.get_double(name + " xy");
      return t;
    }

    [[noreturn]] void bad_edges(const std::string &text, const std::string &why)
    {
      AssertThrow(false, ExcMessage("Edges/Conditions = '" + text + "': " + why +
                                    ". Expected a list 'id: deflection/in-plane' with deflection one of "
                                    "free, simply supported, clamped and in-plane one of free, fixed; "
                                    "'all' stands for every boundary id."));
      throw;
    }

    DeflectionCondition parse_deflection(const std::string &s, const std::string &text)
    {
      if (s == "free")
        return DeflectionCondition::free;
      if (s == "simply supported")
        return DeflectionCondition::simply_supported;
      if (s == "clamped")
        return DeflectionCondition::clamped;
      bad_edges(text, "unknown deflection condition '" + s + "'");
    }

    std::vector<types::boundary_id> all_ids(const SheetDomain &d) { return d.boundary_ids(); }

    void declare_limit_parameters(ParameterHandler &prm)
    {
      prm.enter_subsection("Adhesion limits");
      prm.declare_entry("Lowest work of adhesion", "0.01", Patterns::Double(0),
                        "Lower end of the range of Gamma searched for the thresholds (nappe-limits) [unit of "
                        "Adhesion/Work of adhesion unit].");
      prm.declare_entry("Highest work of adhesion", "1", Patterns::Double(0),
                        "Upper end of that range [unit of Adhesion/Work of adhesion unit].");
      prm.declare_entry("Target conformed fraction", "0.99", Patterns::Double(0, 1),
                        "A state counts as conformed when its conformed fraction is at least this [-].");
      prm.declare_entry("Relative tolerance", "0.002", Patterns::Double(1e-6, 0.5),
                        "Thresholds are bracketed to [G1, G2] with ln(G2/G1) at most this [-].");
      prm.declare_entry("Initial step", "0.05", Patterns::Double(1e-6, 1),
                        "First continuation step in ln Gamma [-].");
      prm.declare_entry("Largest step", "0.1", Patterns::Double(1e-6, 2), "Largest step in ln Gamma [-].");
      prm.declare_entry("Largest fraction change", "0.02", Patterns::Double(1e-4, 1),
                        "A step stays on its branch only if the conformed fraction changes by at most this [-].");
      prm.declare_entry("Largest deflection change", "1", Patterns::Double(1e-3, 100),
                        "... and the deflection by at most this many equilibrium separations h0 [-].");
      prm.declare_entry("Maximum solves", "600", Patterns::Integer(10, 100000),
                        "Minimisations one path may spend [-].");
      prm.leave_subsection();

      prm.enter_subsection("Fabrication check");
      prm.declare_entry("Enabled", "false", Patterns::Bool(),
                        "nappe-limits: add a verdict table over an interface's range of Gamma (and an aspect-ratio "
                        "scan if Feature height entry is set).");
      prm.declare_entry("Work of adhesion range", "0.2, 0.6", Patterns::List(Patterns::Double(0), 2, 2),
                        "Weakest and strongest expected Gamma of the interface [unit of Adhesion/Work of adhesion "
                        "unit].");
      prm.declare_entry("Table rows", "5", Patterns::Integer(1, 50), "Gamma values in the verdict table [-].");
      prm.declare_entry("Feature height entry", "", Patterns::Anything(),
                        "Case entry holding the feature height in nm, e.g. 'Topography/Pillar/Height'; empty: no "
                        "aspect-ratio scan.");
      prm.declare_entry("Feature width", "0", Patterns::Double(0),
                        "Lateral size the aspect ratio height/width refers to (wavelength, pillar diameter) [nm].");
      prm.leave_subsection();
    }

    AdhesionPathSettings parse_limit_parameters(ParameterHandler &prm)
    {
      prm.enter_subsection("Adhesion");
      const double unit = work_of_adhesion_unit_factor(prm.get("Work of adhesion unit"));
      prm.leave_subsection();
      prm.enter_subsection("Adhesion limits");
      AdhesionPathSettings s;
      s.lowest_work_of_adhesion   = prm.get_double("Lowest work of adhesion") * unit;
      s.highest_work_of_adhesion  = prm.get_double("Highest work of adhesion") * unit;
      s.target_fraction           = prm.get_double("Target conformed fraction");
      s.relative_tolerance        = prm.get_double("Relative tolerance");
      s.initial_step              = prm.get_double("Initial step");
      s.largest_step              = prm.get_double("Largest step");
      s.largest_fraction_change   = prm.get_double("Largest fraction change");
      s.largest_deflection_change = prm.get_double("Largest deflection change");
      s.max_solves                = prm.get_integer("Maximum solves");
      prm.leave_subsection();
      check_adhesion_path_settings(s);
      return s;
    }

    /// The value of a "Section/…/Entry" of the handler as a number.
    double entry_value(ParameterHandler &prm, const std::string &path_text, const std::string &what)
    {
      auto path = Utilities::split_string_list(path_text, '/');
      AssertThrow(path.size() >= 2, ExcMessage(what + ": expected Section/Entry, found '" + path_text + "'."));
      const std::string entry = path.back();
      path.pop_back();
      std::size_t entered = 0;
      double      value   = 0.0;
      try
        {
          for (const auto &section : path)
            prm.enter_subsection(section), ++entered;
          value = prm.get_double(entry);
        }
      catch (const std::exception &)
        {
          for (; entered > 0; --entered)
            prm.leave_subsection();
          AssertThrow(false, ExcMessage(what + ": '" + path_text + "' is not a numeric entry of the case file."));
        }
      for (; entered > 0; --entered)
        prm.leave_subsection();
      return value;
    }

    FabricationCheckSettings parse_fabrication_parameters(ParameterHandler &prm)
    {
      prm.enter_subsection("Adhesion");
      const double unit = work_of_adhesion_unit_factor(prm.get("Work of adhesion unit"));
      prm.leave_subsection();
      FabricationCheckSettings f;
      prm.enter_subsection("Fabrication check");
      f.enabled                   = prm.get_bool("Enabled");
      const auto range            = Utilities::string_to_double(Utilities::split_string_list(prm.get("Work of adhesion range")));
      f.lowest_work_of_adhesion   = range[0] * unit;
      f.highest_work_of_adhesion  = range[1] * unit;
      f.rows                      = prm.get_integer("Table rows");
      f.feature_height_entry      = prm.get("Feature height entry");
      f.feature_width             = prm.get_double("Feature width") * units::nanometer;
      prm.leave_subsection();
      AssertThrow(f.lowest_work_of_adhesion > 0 && f.highest_work_of_adhesion >= f.lowest_work_of_adhesion,
                  ExcMessage("Fabrication check/Work of adhesion range: expected 'weakest, strongest' with "
                             "0 < weakest <= strongest."));
      if (!f.feature_height_entry.empty())
        {
          f.feature_height = entry_value(prm, f.feature_height_entry, "Fabrication check/Feature height entry") *
                             units::nanometer;
          AssertThrow(f.feature_width > 0 && f.feature_height > 0,
                      ExcMessage("Fabrication check: an aspect-ratio scan needs a positive Feature width [nm] and a "
                                 "positive height in '" + f.feature_height_entry + "'."));
        }
      return f;
    }
  } // namespace

  std::map<types::boundary_id, EdgeCondition> parse_edge_conditions(const std::string &text, const SheetDomain &domain)
  {
    std::map<types::boundary_id, EdgeCondition> edges;
    for (const std::string &item : Utilities::split_string_list(text, ','))
      {
        const auto colon = item.find(':');
        if (colon == std::string::npos)
          bad_edges(text, "'" + item + "' has no ':'");
        const std::string id_text = Utilities::trim(item.substr(0, colon));
        const auto        parts   = Utilities::split_string_list(item.substr(colon + 1), '/');
        if (parts.size() != 2)
          bad_edges(text, "'" + item + "' needs 'deflection/in-plane'");
        EdgeCondition edge;
        edge.deflection = parse_deflection(parts[0], text);
        if (parts[1] == "fixed")
          edge.in_plane = InPlaneCondition::fixed;
        else if (parts[1] != "free")
          bad_edges(text, "unknown in-plane condition '" + parts[1] + "'");
        std::vector<types::boundary_id> ids;
        if (id_text == "all")
          ids = all_ids(domain);
        else
          {
            try
              {
                ids.push_back(Utilities::string_to_int(id_text));
              }
            catch (...)
              {
                bad_edges(text, "'" + id_text + "' is not a boundary id");
              }
          }
        for (const auto id : ids)
          edges[id] = edge;
      }
    return edges;
  }

  void declare_sheet_case_parameters(ParameterHandler &prm)
  {
    prm.enter_subsection("Case");
    prm.declare_entry("Title", "sheet case", Patterns::Anything(), "A name for the case, printed in reports.");
    prm.leave_subsection();

    prm.enter_subsection("Sheet");
    prm.declare_entry("Material", "custom", Patterns::Anything(),
                      "A name from the material catalogue (nappe-solve --list-materials), or 'custom' to use the "
                      "constants below.");
    prm.declare_entry("Young's modulus 2D", "340", Patterns::Double(0), "2D Young's modulus Y = E·t [N/m].");
    prm.declare_entry("Poisson's ratio", "0.165", Patterns::Double(-0.99, 0.5), "Poisson's ratio ν [-].");
    prm.declare_entry("Bending rigidity", "1.4", Patterns::Double(0), "Bending rigidity D [eV].");
    prm.declare_entry("Geometric nonlinearity", "true", Patterns::Bool(),
                      "Use the von Kármán strain (true) or the linear plate/membrane theory (false).");
    declare_tensor(prm, "Eigenstrain",
                   "Eigenstrain ε₀ (thermal or lattice mismatch); the flat sheet with u = 0 carries −ε₀, so a "
                   "negative value pre-tensions it.");
    prm.leave_subsection();

    prm.enter_subsection("Domain");
    prm.declare_entry("Shape", "disk", Patterns::Selection("rectangle|rhombus|disk|mesh file"),
                      "rectangle [0, Lx]×[0, Ly] (ids 0 left, 1 right, 2 bottom, 3 top); rhombus spanned by (a, 0) "
                      "and (a/2, a√3/2), the unit cell of a hexagonal array; disk of given radius centred at 0 (id 0); "
                      "mesh file: the Gmsh quadrilateral mesh named by 'Mesh file' (ids = its physical line tags; "
                      "a periodic one pairs 0/1 and 2/3, see meshes/README.md).");
    prm.declare_entry("Length x", "1000", Patterns::Double(0), "Rectangle side along x, or rhombus lattice constant [nm].");
    prm.declare_entry("Length y", "1000", Patterns::Double(0), "Rectangle side along y [nm].");
    prm.declare_entry("Radius", "500", Patterns::Double(0), "Disk radius [nm].");
    prm.declare_entry("Periodic", "false", Patterns::Bool(), "Periodic unit cell (rectangle, rhombus or mesh file).");
    prm.declare_entry("Mesh file", "", Patterns::Anything(),
                      "Shape = mesh file: Gmsh .msh file (ASCII format 2.2 or 4.1, quadrilaterals), absolute or "
                      "relative to the working directory of the run (not to the case file).");
    prm.declare_entry("Mesh scale", "1", Patterns::Double(0),
                      "Shape = mesh file: length of one mesh unit [nm]; coordinates in the file are multiplied by it.");
    prm.declare_entry("Coarse cells x", "1", Patterns::Integer(1, 64), "Coarse cells along x before refinement [-].");
    prm.declare_entry("Coarse cells y", "1", Patterns::Integer(1, 64), "Coarse cells along y before refinement [-].");
    prm.declare_entry("Global refinements", "4", Patterns::Integer(0, 10), "Uniform refinements of the coarse mesh [-].");
    prm.leave_subsection();

    prm.enter_subsection("Edges");
    prm.declare_entry("Conditions", "all: clamped/fixed", Patterns::Anything(),
                      "Comma-separated 'id: deflection/in-plane' with deflection in {free, simply supported, clamped} "
                      "and in-plane in {free, fixed}; 'all' means every boundary id. Ids not listed are free/free.");
    prm.leave_subsection();

    prm.enter_subsection("Loads");
    prm.declare_entry("Pressure", "0", Patterns::Double(), "Uniform pressure acting in +z [kPa].");
    prm.declare_entry("Point load", "0", Patterns::Double(), "Concentrated force in +z [nN]; 0 for none.");
    prm.declare_entry("Point load x", "0", Patterns::Double(), "x of the point load [nm].");
    prm.declare_entry("Point load y", "0", Patterns::Double(), "y of the point load [nm].");
    declare_tensor(prm, "Mean strain", "Prescribed mean in-plane strain E (u = E·x + periodic part)");
    prm.leave_subsection();

    prm.enter_subsection("Substrate");
    prm.declare_entry("Enabled", "false", Patterns::Bool(),
                      "Lay the sheet on the substrate described by subsections Topography and Adhesion.");
    prm.declare_entry("Gap measure", "normal", Patterns::Selection("vertical|normal"),
                      "Gap g = w − s (vertical) or (w − s)/√(1 + |∇s|²) (along the substrate normal, first order).");
    prm.declare_entry("Protocol", "laid down", Patterns::Selection("laid down|grown conformal"),
                      "laid down: the sheet starts flat above the substrate's top and is pulled in (transfer); "
                      "grown conformal: it starts on the surface at the equilibrium gap and relaxes.");
    prm.declare_entry("Initial clearance", "0", Patterns::Double(0),
                      "Laid down: initial height of the flat sheet above the equilibrium gap over the highest "
                      "point of the topography [nm].");
    prm.leave_subsection();
    TopographyFactory::declare_parameters(prm);
    declare_adhesion_parameters(prm);
    declare_limit_parameters(prm);

    prm.enter_subsection("Solver");
    prm.declare_entry("Element degree", "2", Patterns::Integer(2, 4), "Degree p of the Lagrange elements [-].");
    prm.declare_entry("Penalty factor", "2", Patterns::Double(0),
                      "C0 interior penalty factor η; the edge penalty is η·p(p+1)·D/h [-].");
    prm.declare_entry("Load steps", "4", Patterns::Integer(1, 10000), "Equal load increments from 0 to full load [-].");
    prm.declare_entry("Max Newton iterations", "80", Patterns::Integer(1, 10000), "Per load step [-].");
    prm.declare_entry("Relative tolerance", "1e-9", Patterns::Double(0),
                      "Newton stops when |R| ≤ tolerance · (initial |R| of the step) [-].");
    prm.leave_subsection();

    prm.enter_subsection("Output");
    prm.declare_entry("Directory", ".", Patterns::DirectoryName(), "Where results are written (must exist).");
    prm.declare_entry("Base name", "sheet", Patterns::FileName(), "Prefix of the result files.");
    prm.declare_entry("Write fields", "true", Patterns::Bool(), "Write VTU/PVTU fields for ParaView.");
    prm.leave_subsection();
  }

  SheetCase parse_sheet_case(ParameterHandler &prm)
  {
    SheetCase c;
    prm.enter_subsection("Case");
    c.title = prm.get("Title");
    prm.leave_subsection();

    prm.enter_subsection("Sheet");
    const std::string material = prm.get("Material");
    if (material == "custom")
      {
        c.model.material.name              = "custom";
        c.model.material.youngs_modulus_2d = prm.get_double("Young's modulus 2D");
        c.model.material.poisson_ratio     = prm.get_double("Poisson's ratio");
        c.model.material.bending_rigidity  = prm.get_double("Bending rigidity") * units::electronvolt;
      }
    else
      c.model.material = MaterialCatalogue().material(material);
    c.model.geometric_nonlinearity = prm.get_bool("Geometric nonlinearity");
    c.model.loads.eigenstrain      = parse_tensor(prm, "Eigenstrain");
    prm.leave_subsection();

    prm.enter_subsection("Domain");
    c.domain.shape              = SheetDomain::parse_shape(prm.get("Shape"));
    c.domain.length_x           = prm.get_double("Length x") * units::nanometer;
    c.domain.length_y           = prm.get_double("Length y") * units::nanometer;
    c.domain.radius             = prm.get_double("Radius") * units::nanometer;
    c.domain.periodic           = prm.get_bool("Periodic");
    c.domain.coarse_cells_x     = prm.get_integer("Coarse cells x");
    c.domain.coarse_cells_y     = prm.get_integer("Coarse cells y");
    c.domain.global_refinements = prm.get_integer("Global refinements");
    c.domain.mesh_file          = prm.get("Mesh file");
    c.domain.mesh_scale         = prm.get_double("Mesh scale") * units::nanometer;
    AssertThrow(!(c.domain.periodic && c.domain.shape == SheetDomain::Shape::disk),
                ExcMessage("Domain/Periodic = true needs Domain/Shape = rectangle, rhombus or mesh file, not disk."));
    AssertThrow(c.domain.shape != SheetDomain::Shape::mesh_file || !c.domain.mesh_file.empty(),
                ExcMessage("Domain/Shape = mesh file needs Domain/Mesh file (a Gmsh .msh file)."));
    AssertThrow(c.domain.mesh_scale > 0, ExcMessage("Domain/Mesh scale must be positive [nm per mesh unit]."));
    AssertThrow(c.domain.length_x > 0 && c.domain.length_y > 0 && c.domain.radius > 0,
                ExcMessage("Domain/Length x, Length y and Radius must be positive [nm]."));
    prm.leave_subsection();

    prm.enter_subsection("Edges");
    c.model.edges = parse_edge_conditions(prm.get("Conditions"), c.domain);
    prm.leave_subsection();

    prm.enter_subsection("Loads");
    c.model.loads.pressure = prm.get_double("Pressure") * units::kilopascal;
    if (const double force = prm.get_double("Point load"); force != 0.0)
      c.model.loads.point_loads.push_back(
        {Point<2>(prm.get_double("Point load x") * units::nanometer, prm.get_double("Point load y") * units::nanometer),
         force * units::nanonewton});
    c.model.loads.mean_strain = parse_tensor(prm, "Mean strain");
    prm.leave_subsection();

    prm.enter_subsection("Substrate");
    const bool  with_substrate = prm.get_bool("Enabled");
    const auto  gap_measure    = parse_gap_measure(prm.get("Gap measure"));
    c.protocol = prm.get("Protocol") == "laid down" ? Protocol::laid_down : Protocol::grown_conformal;
    c.initial_clearance = prm.get_double("Initial clearance") * units::nanometer;
    prm.leave_subsection();
    if (with_substrate)
      {
        std::shared_ptr<const AdhesionLaw> law = parse_adhesion_parameters(prm);
        c.adhesion      = std::make_shared<AdhesionPotential>(TopographyFactory::parse_parameters(prm), law, gap_measure);
        c.model.substrate = c.adhesion;
      }
    c.limits      = parse_limit_parameters(prm);
    c.fabrication = parse_fabrication_parameters(prm);

    prm.enter_subsection("Solver");
    c.model.discretization.degree         = prm.get_integer("Element degree");
    c.model.discretization.penalty_factor = prm.get_double("Penalty factor");
    AssertThrow(c.model.discretization.penalty_factor > 0,
                ExcMessage("Solver/Penalty factor must be positive."));
    c.stepping.load_steps        = prm.get_integer("Load steps");
    c.newton.max_iterations      = prm.get_integer("Max Newton iterations");
    c.newton.relative_tolerance  = prm.get_double("Relative tolerance");
    prm.leave_subsection();

    prm.enter_subsection("Output");
    c.output_directory = prm.get("Directory");
    c.output_name      = prm.get("Base name");
    c.write_fields     = prm.get_bool("Write fields");
    prm.leave_subsection();
    return c;
  }
} // namespace nappe

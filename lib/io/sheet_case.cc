#include <deal.II/base/utilities.h>

#include <nappe/base/units.h>
#include <nappe/geometry/topography_factory.h>
#include <nappe/geometry/topography_periodicity.h>
#include <nappe/io/sheet_case.h>
#include <nappe/physics/adhesion_law_factory.h>
#include <nappe/physics/adhesion_potential.h>
#include <nappe/physics/material_catalogue.h>

#include <algorithm>
#include <cmath>
#include <iomanip>
#include <sstream>

namespace nappe
{
  using namespace dealii;

  namespace
  {
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

    /**
     * The entry's value, checked against the range any sheet model admits (wider than what the trade
     * uses; plausibility_warnings() covers that): throws naming the entry, its value and the range.
     * @p low_open excludes the lower bound. (A length in metres typed into an nm entry is caught, with that
     * hint, when the file is read: validate_parameter_text().)
     */
    double admissible(ParameterHandler &prm, const std::string &section, const std::string &entry, double low,
                      double high, const std::string &unit, bool low_open = false)
    {
      const double value = prm.get_double(entry);
      const bool   ok    = std::isfinite(value) && (low_open ? value > low : value >= low) && value <= high;
      std::ostringstream range;
      range << (low_open ? "(" : "[") << low << ", " << high << "]";
      AssertThrow(ok, ExcMessage(section + "/" + entry + " = " + prm.get(entry) + " " + unit +
                                 " is outside the admissible range " + range.str() + " " + unit + "."));
      return value;
    }

    /// A length as a reader writes it, in nm (30, not 30.000000).
    std::string in_nm(const double length)
    {
      std::ostringstream s;
      s << std::setprecision(6) << length / units::nanometer;
      return s.str();
    }

    std::string id_list(const std::vector<types::boundary_id> &ids)
    {
      std::string text;
      for (const auto id : ids)
        text += (text.empty() ? "" : ", ") + std::to_string(id);
      return text;
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
        const std::vector<types::boundary_id> existing = domain.boundary_ids();
        std::vector<types::boundary_id>       ids;
        if (id_text == "all")
          ids = existing;
        else
          {
            int id = -1;
            try
              {
                id = Utilities::string_to_int(id_text);
              }
            catch (...)
              {
                bad_edges(text, "'" + id_text + "' is not a boundary id");
              }
            if (std::find(existing.begin(), existing.end(), id) == existing.end())
              bad_edges(text, "this domain has no edge with id " + id_text + " (its edge ids: " +
                                (existing.empty() ? std::string("none, it is periodic") : id_list(existing)) + ")");
            ids.push_back(id);
          }
        for (const auto id : ids)
          edges[id] = edge;
      }
    return edges;
  }

  namespace
  {
    void parse_sheet(ParameterHandler &prm, SheetModel &model)
    {
      prm.enter_subsection("Sheet");
      const std::string material = prm.get("Material");
      if (material == "custom")
        {
          model.material.name              = "custom";
          model.material.youngs_modulus_2d = admissible(prm, "Sheet", "Young's modulus 2D", 0, 1e4, "N/m", true);
          model.material.poisson_ratio     = prm.get_double("Poisson's ratio");
          model.material.bending_rigidity =
            admissible(prm, "Sheet", "Bending rigidity", 0, 1e4, "eV", true) * units::electronvolt;
        }
      else
        model.material = MaterialCatalogue().material(material);
      model.geometric_nonlinearity = prm.get_bool("Geometric nonlinearity");
      model.loads.eigenstrain      = parse_tensor(prm, "Eigenstrain");
      prm.leave_subsection();
    }

    SheetDomain parse_domain(ParameterHandler &prm, unsigned int &periods_per_cell)
    {
      SheetDomain d;
      prm.enter_subsection("Domain");
      periods_per_cell     = prm.get_integer("Periods per cell");
      d.shape              = SheetDomain::parse_shape(prm.get("Shape"));
      d.length_x           = admissible(prm, "Domain", "Length x", 1e-3, 1e7, "nm") * units::nanometer;
      d.length_y           = admissible(prm, "Domain", "Length y", 1e-3, 1e7, "nm") * units::nanometer;
      d.radius             = admissible(prm, "Domain", "Radius", 1e-3, 1e7, "nm") * units::nanometer;
      d.periodic           = prm.get_bool("Periodic");
      d.coarse_cells_x     = prm.get_integer("Coarse cells x");
      d.coarse_cells_y     = prm.get_integer("Coarse cells y");
      d.global_refinements = prm.get_integer("Global refinements");
      d.mesh_file          = prm.get("Mesh file");
      d.mesh_scale         = prm.get_double("Mesh scale") * units::nanometer;
      prm.leave_subsection();
      AssertThrow(!(d.periodic && d.shape == SheetDomain::Shape::disk),
                  ExcMessage("Domain/Periodic = true needs Domain/Shape = rectangle, rhombus or mesh file, not disk."));
      AssertThrow(d.shape != SheetDomain::Shape::mesh_file || !d.mesh_file.empty(),
                  ExcMessage("Domain/Shape = mesh file needs Domain/Mesh file (a Gmsh .msh file)."));
      AssertThrow(d.mesh_scale > 0, ExcMessage("Domain/Mesh scale must be positive [nm per mesh unit]."));
      AssertThrow(d.length_x > 0 && d.length_y > 0 && d.radius > 0,
                  ExcMessage("Domain/Length x, Length y and Radius must be positive [nm]."));
      return d;
    }

    void parse_loads(ParameterHandler &prm, SheetLoads &loads)
    {
      prm.enter_subsection("Loads");
      loads.pressure = admissible(prm, "Loads", "Pressure", -1e6, 1e6, "kPa") * units::kilopascal;
      if (const double force = admissible(prm, "Loads", "Point load", -1e6, 1e6, "nN"); force != 0.0)
        loads.point_loads.push_back({Point<2>(prm.get_double("Point load x") * units::nanometer,
                                              prm.get_double("Point load y") * units::nanometer),
                                     force * units::nanonewton});
      loads.mean_strain = parse_tensor(prm, "Mean strain");
      prm.leave_subsection();
    }

    /// The periodic cell made @p n periods of the topography's lattice (Domain/Periods per cell).
    void fit_cell_to_topography(SheetDomain &d, const Topography &t, unsigned int n)
    {
      const auto l = t.lattice();
      AssertThrow(d.periodic, ExcMessage("Domain/Periods per cell = " + std::to_string(n) +
                                         " needs a periodic cell (Domain/Periodic = true)."));
      AssertThrow(l && l->kind != TopographyLattice::Kind::oblique,
                  ExcMessage("Domain/Periods per cell: the topography (" + t.description() +
                             ") has no square, hexagonal, rectangular or stripe lattice to fit the cell to; set the "
                             "cell's lengths instead."));
      AssertThrow(std::abs(l->a1[1]) <= 1e-9 * l->a1.norm() && l->a1[0] > 0,
                  ExcMessage("Domain/Periods per cell: the topography's first period must lie along +x (no rotation); "
                             "set the cell's lengths instead."));
      d.length_x = n * l->a1[0];
      switch (l->kind)
        {
          case TopographyLattice::Kind::stripes: d.shape = SheetDomain::Shape::rectangle; break;
          case TopographyLattice::Kind::hexagonal: d.shape = SheetDomain::Shape::rhombus; break;
          default:
            d.shape    = SheetDomain::Shape::rectangle;
            d.length_y = n * l->a2.norm();
        }
    }

    void parse_substrate(ParameterHandler &prm, SheetProblem &p, unsigned int periods_per_cell)
    {
      prm.enter_subsection("Substrate");
      const bool with_substrate = prm.get_bool("Enabled");
      const auto gap_measure    = parse_gap_measure(prm.get("Gap measure"));
      p.start = prm.get("Protocol") == "laid down" ? StartProtocol::laid_down : StartProtocol::grown_conformal;
      p.initial_clearance = admissible(prm, "Substrate", "Initial clearance", 0, 1e3, "nm") * units::nanometer;
      prm.leave_subsection();
      if (with_substrate)
        {
          std::shared_ptr<const AdhesionLaw> law = parse_adhesion_parameters(prm, p.model.material.name);
          const auto                         topography = TopographyFactory::parse_parameters(prm);
          if (periods_per_cell > 0)
            fit_cell_to_topography(p.domain, *topography, periods_per_cell);
          if (p.domain.periodic)
            {
              const auto [a1, a2]   = p.domain.lattice_vectors();
              const std::string why = periodicity_mismatch(*topography, p.domain.bounding_box().first, a1, a2);
              AssertThrow(why.empty(),
                          ExcMessage("Topography is not periodic on the cell (Domain/Length x = " +
                                     in_nm(p.domain.length_x) + " nm, Length y = " +
                                     in_nm(p.domain.length_y) + " nm): " + why +
                                     ". Make the cell a whole number of periods, or set Domain/Periods per cell."));
            }
          p.model.substrate = std::make_shared<AdhesionPotential>(topography, law, gap_measure);
        }
      else
        AssertThrow(periods_per_cell == 0, ExcMessage("Domain/Periods per cell needs a substrate topography "
                                                      "(Substrate/Enabled = true)."));
    }

    void parse_solver(ParameterHandler &prm, SheetProblem &p, double &memory_limit)
    {
      prm.enter_subsection("Solver");
      p.model.discretization.degree         = prm.get_integer("Element degree");
      p.model.discretization.penalty_factor = prm.get_double("Penalty factor");
      AssertThrow(p.model.discretization.penalty_factor > 0, ExcMessage("Solver/Penalty factor must be positive."));
      p.stepping.load_steps       = prm.get_integer("Load steps");
      p.newton.max_iterations     = prm.get_integer("Max Newton iterations");
      p.newton.relative_tolerance = prm.get_double("Relative tolerance");
      p.solver.linear_solver      = prm.get("Linear solver");
      p.solver.certificate        = prm.get("Stability certificate");
      p.solver.multilevel.coarsest_cells = prm.get_integer("Multilevel coarsest cells");
      p.solver.multilevel.max_iterations = prm.get_integer("Multilevel iteration limit");
      check_solver_settings(p.solver);
      memory_limit                = prm.get_double("Memory limit") * 1e9;
      prm.leave_subsection();
    }

    MeshAdaptationSettings parse_adaptation(ParameterHandler &prm, const SolverSettings &solver)
    {
      MeshAdaptationSettings a;
      prm.enter_subsection("Mesh adaptation");
      a.cycles          = prm.get_integer("Cycles");
      a.refined_share   = prm.get_double("Refined error share");
      a.coarsened_share = prm.get_double("Coarsened error share");
      a.strain_concentration_share = prm.get_double("Strain concentration share");
      prm.leave_subsection();
      AssertThrow(a.refined_share + a.coarsened_share < 1.0,
                  ExcMessage("Mesh adaptation/Refined error share + Coarsened error share must be below 1."));
      AssertThrow(a.cycles == 0 || (solver.linear_solver != "multilevel CG" && solver.certificate != "multilevel LOBPCG"),
                  ExcMessage("Mesh adaptation/Cycles > 0 needs the direct solver: Solver/Linear solver = "
                             "multilevel CG and Stability certificate = multilevel LOBPCG coarsen by whole uniform "
                             "refinements. Set them to 'automatic' or 'direct LDLT' / 'LDLT inertia'."));
      return a;
    }

    OutputSettings parse_output(ParameterHandler &prm)
    {
      OutputSettings o;
      prm.enter_subsection("Output");
      o.directory    = prm.get("Directory");
      o.base_name    = prm.get("Base name").empty() ? "sheet" : prm.get("Base name");
      o.write_fields = prm.get_bool("Write fields");
      prm.leave_subsection();
      return o;
    }
  } // namespace

  SheetCase parse_sheet_case(ParameterHandler &prm)
  {
    SheetCase c;
    prm.enter_subsection("Case");
    c.title = prm.get("Title");
    prm.leave_subsection();
    SheetProblem &p = c.problem;
    parse_sheet(prm, p.model);
    unsigned int periods_per_cell = 0;
    p.domain                      = parse_domain(prm, periods_per_cell);
    prm.enter_subsection("Edges");
    p.model.edges = parse_edge_conditions(prm.get("Conditions"), p.domain);
    prm.leave_subsection();
    parse_loads(prm, p.model.loads);
    parse_substrate(prm, p, periods_per_cell);
    c.limits      = parse_limit_parameters(prm);
    c.fabrication = parse_fabrication_parameters(prm);
    c.electronics = parse_electronics_parameters(prm);
    p.model.material.lattice.orientation = c.electronics.zigzag_angle;
    if (c.electronics.export_lattice)
      check_lattice_export(p.model.material, p.domain, c.electronics.lattice_export);
    parse_solver(prm, p, c.memory_limit);
    p.adaptation = parse_adaptation(prm, p.solver);
    c.output = parse_output(prm);
    return c;
  }
} // namespace nappe

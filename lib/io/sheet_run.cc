#include <deal.II/base/function.h>
#include <deal.II/base/mpi.h>
#include <deal.II/numerics/vector_tools.h>

#include <nappe/base/units.h>
#include <nappe/base/version.h>
#include <nappe/io/atomic_file.h>
#include <nappe/geometry/topography_writer.h>
#include <nappe/io/field_output.h>
#include <nappe/io/json_writer.h>
#include <nappe/io/sheet_run.h>

#include <iomanip>

namespace nappe
{
  namespace
  {
    /// w(x) of the starting state; ũ = 0.
    class StartingHeight : public dealii::Function<2>
    {
    public:
      StartingHeight(std::function<double(const dealii::Point<2> &)> w) : dealii::Function<2>(3), w_(std::move(w)) {}
      double value(const dealii::Point<2> &p, const unsigned int component) const override
      {
        return component == 2 ? w_(p) : 0.0;
      }

    private:
      std::function<double(const dealii::Point<2> &)> w_;
    };

    double highest_substrate_point(const SheetSystem &system, const Topography &topography)
    {
      double top = -std::numeric_limits<double>::max();
      for (const auto &cell : system.dof_handler().active_cell_iterators())
        if (cell->is_locally_owned())
          for (const unsigned int v : cell->vertex_indices())
            top = std::max(top, topography.height(cell->vertex(v)));
      return dealii::Utilities::MPI::max(top, system.communicator());
    }

    void write_histogram_csv(const std::string &path, const ConformationMeasures &m)
    {
      write_atomically(path, [&](std::ostream &out) {
        out << "quantity,bin_low,bin_high,area_fraction\n" << std::setprecision(8);
        for (const auto *h : {&m.principal_strain_histogram, &m.areal_strain_histogram})
          for (std::size_t b = 0; b < h->area.size(); ++b)
            out << h->quantity << "," << h->bin_edges[b] << "," << h->bin_edges[b + 1] << ","
                << h->area[b] / m.sheet_area << "\n";
      });
    }

    void write_regions_csv(const std::string &path, const ConformationMeasures &m)
    {
      write_atomically(path, [&](std::ostream &out) {
        out << "region,area_nm2,max_gap_nm,x_nm,y_nm\n" << std::setprecision(8);
        const double nm = units::nanometer;
        for (std::size_t i = 0; i < m.suspended_regions.size(); ++i)
          {
            const auto &r = m.suspended_regions[i];
            out << i + 1 << "," << r.area / (nm * nm) << "," << r.max_gap / nm << "," << r.max_gap_location[0] / nm
                << "," << r.max_gap_location[1] / nm << "\n";
          }
      });
    }

    /// The substrate height and slope sampled on a 101×101 grid over the sheet's bounding box.
    void write_substrate_csv(const std::string &path, const SheetSystem &system, const Topography &topography)
    {
      const auto [lower, upper] = system.domain().bounding_box();
      write_topography_csv(topography, path, lower, upper, 101, 101);
    }

    void write_conformation(JsonWriter &json, const SheetCase &c, const ConformationMeasures &m)
    {
      const double nm = units::nanometer;
      json.begin_object("conformation");
      json.value("verdict", conformation_verdict(m.conformed_fraction));
      json.value("definition", "share of the sheet's projected area with gap <= gap of peak adhesion traction");
      json.quantity("conformed_fraction", m.conformed_fraction, "1");
      json.quantity("conformed_area", m.conformed_area / (nm * nm), "nm^2");
      json.quantity("sheet_area", m.sheet_area / (nm * nm), "nm^2");
      json.quantity("max_gap", m.max_gap / nm, "nm");
      json.value("suspended_regions", static_cast<unsigned int>(m.suspended_regions.size()));
      double suspended_area = 0.0;
      for (const auto &r : m.suspended_regions)
        suspended_area += r.area;
      json.quantity("suspended_area", suspended_area / (nm * nm), "nm^2");
      json.value("adhesion_law", c.adhesion->law().name());
      json.quantity("work_of_adhesion", c.adhesion->law().work_of_adhesion(), "J/m^2");
      json.quantity("equilibrium_gap", c.adhesion->law().equilibrium_gap() / nm, "nm");
      json.quantity("peak_traction_gap", c.adhesion->law().peak_traction_gap() / nm, "nm");
      json.value("gap_measure", c.adhesion->gap_measure() == GapMeasure::normal ? "normal" : "vertical");
      json.value("topography", c.adhesion->topography().description());
      json.value("protocol", c.protocol == Protocol::laid_down ? "laid down" : "grown conformal");
      json.end_object();
    }

    const char *caution = "Model estimate: confirm by measurement before fabrication decisions; lab work follows "
                          "local safety rules and the institution's practice.";

    void write_location(JsonWriter &json, const std::string &key, const LocatedValue &v, double scale,
                        const std::string &unit)
    {
      json.begin_object(key);
      json.value("value", v.value / scale);
      json.value("unit", unit);
      json.quantity("x", v.location[0] / units::nanometer, "nm");
      json.quantity("y", v.location[1] / units::nanometer, "nm");
      json.end_object();
    }

    void write_summary(const SheetCase &c, const SheetSystem &system, const SheetRunResult &r, std::ostream &out)
    {
      JsonWriter json(out);
      json.begin_object();
      json.value("program", "nappe " + version());
      json.value("case", c.title);
      json.value("note", caution);
      json.begin_object("sheet");
      json.value("material", c.model.material.name);
      json.quantity("youngs_modulus_2d", c.model.material.youngs_modulus_2d, "N/m");
      json.quantity("poisson_ratio", c.model.material.poisson_ratio, "1");
      json.quantity("bending_rigidity", c.model.material.bending_rigidity / units::electronvolt, "eV");
      json.end_object();
      json.begin_object("discretization");
      json.value("cells", static_cast<long long>(system.dof_handler().get_triangulation().n_global_active_cells()));
      json.value("degrees_of_freedom", static_cast<long long>(system.n_dofs()));
      json.value("element_degree", c.model.discretization.degree);
      json.value("mpi_ranks", dealii::Utilities::MPI::n_mpi_processes(system.communicator()));
      json.end_object();
      json.begin_object("energy");
      json.quantity("stretching", r.energy.stretching, "J");
      json.quantity("bending", r.energy.bending, "J");
      json.quantity("substrate", r.energy.substrate, "J");
      json.quantity("external_work", r.energy.external_work, "J");
      json.quantity("total", r.energy.total(), "J");
      json.end_object();
      json.begin_object("extremes");
      write_location(json, "max_deflection", r.measures.max_deflection, units::nanometer, "nm");
      write_location(json, "max_principal_strain", r.measures.max_principal_strain, 1.0, "1");
      write_location(json, "min_principal_strain", r.measures.min_principal_strain, 1.0, "1");
      write_location(json, "max_areal_strain", r.measures.max_areal_strain, 1.0, "1");
      write_location(json, "max_shear_strain", r.measures.max_shear_strain, 1.0, "1");
      write_location(json, "max_curvature", r.measures.max_curvature, 1.0 / units::nanometer, "1/nm");
      json.end_object();
      if (r.conformation)
        write_conformation(json, c, *r.conformation);
      json.begin_array("warnings");
      for (const auto &w : r.warnings)
        json.value("", w);
      json.end_array();
      const MinimizerReport &last = r.path.final_state();
      json.begin_object("solver");
      json.value("converged", r.converged);
      json.value("load_steps", static_cast<unsigned int>(r.path.steps.size()));
      json.value("step_cuts", r.path.step_cuts);
      json.value("newton_iterations", r.path.newton_iterations);
      json.quantity("final_residual", last.residual, "N");
      json.quantity("residual_tolerance", last.tolerance, "N");
      json.value("hessian_negative_pivots", last.negative_pivots);
      json.value("stability", last.negative_pivots == 0 ? "stable minimum (Hessian positive definite)" : "unstable");
      json.quantity("wall_time", r.path.wall_time, "s");
      json.end_object();
      json.end_object();
    }
  } // namespace

  std::string conformation_verdict(double fraction)
  {
    if (fraction >= 0.99)
      return "conforms";
    if (fraction >= 0.05)
      return "partially conformed";
    return "suspended";
  }

  Vector initial_state(const SheetSystem &system, const SheetCase &c)
  {
    Vector state = system.make_owned_vector();
    if (!c.adhesion)
      return state;
    const Topography &s  = c.adhesion->topography();
    const double      h0 = c.adhesion->law().equilibrium_gap();
    std::function<double(const dealii::Point<2> &)> w;
    if (c.protocol == Protocol::laid_down)
      {
        const double flat = highest_substrate_point(system, s) + h0 + c.initial_clearance;
        w                 = [flat](const dealii::Point<2> &) { return flat; };
      }
    else
      w = [&s, h0](const dealii::Point<2> &p) { return s.height(p) + h0 * std::sqrt(1.0 + s.gradient(p).norm_square()); };
    if (c.adhesion->gap_measure() == GapMeasure::vertical && c.protocol == Protocol::grown_conformal)
      w = [&s, h0](const dealii::Point<2> &p) { return s.height(p) + h0; };
    dealii::VectorTools::interpolate(system.mapping(), system.dof_handler(), StartingHeight(w), state);
    system.constraints().distribute(state);
    return state;
  }

  SheetRunResult run_sheet_case(const SheetCase &c, MPI_Comm comm, std::ostream *log)
  {
    SheetRunResult result;
    SheetSystem    system(c.model, c.domain, comm);
    if (log)
      *log << "Case '" << c.title << "': " << system.dof_handler().get_triangulation().n_global_active_cells()
           << " cells, " << system.n_dofs() << " unknowns, Q" << c.model.discretization.degree << ", "
           << dealii::Utilities::MPI::n_mpi_processes(comm) << " MPI rank(s)\n";
    EnergyMinimizer minimizer(system, c.newton, log);
    Vector          state = initial_state(system, c);
    result.path           = follow_load_path(minimizer, state, c.stepping, log);
    result.converged      = result.path.converged;
    result.message        = result.path.message;
    if (!result.converged)
      return result;

    Vector ghosted = system.make_ghosted_vector();
    ghosted        = state;
    result.energy   = system.energy(ghosted, 1.0);
    result.measures = measure_sheet(system, ghosted, 1.0);
    if (c.adhesion)
      result.conformation = measure_conformation(system, ghosted, 1.0, *c.adhesion);
    const double fracture = c.model.material.fracture_strain;
    if (fracture > 0.0 && result.measures.max_principal_strain.value > fracture)
      result.warnings.push_back("peak principal strain " + std::to_string(100 * result.measures.max_principal_strain.value) +
                                " % exceeds the fracture strain of " + c.model.material.name + " (" +
                                std::to_string(100 * fracture) + " %)");

    if (!c.write_results)
      return result;
    const std::string base = c.output_directory + "/" + c.output_name;
    if (c.write_fields)
      result.fields_file = write_fields(system, ghosted, 1.0, c.output_directory, c.output_name);
    result.summary_file = base + ".json";
    if (dealii::Utilities::MPI::this_mpi_process(comm) == 0)
      {
        if (result.conformation)
          {
            write_histogram_csv(base + "_strain_histogram.csv", *result.conformation);
            write_regions_csv(base + "_suspended_regions.csv", *result.conformation);
            write_substrate_csv(base + "_topography.csv", system, c.adhesion->topography());
          }
        write_atomically(result.summary_file, [&](std::ostream &out) { write_summary(c, system, result, out); });
      }
    return result;
  }

  void print_summary(const SheetCase &c, const SheetRunResult &r, std::ostream &out)
  {
    out << "\n== " << c.title << " ==\n";
    if (!r.converged)
      {
        out << "NO RESULT: " << r.message << "\n";
        return;
      }
    const auto &m  = r.measures;
    const double nm = units::nanometer;
    out << std::setprecision(4);
    out << "Verdict: stable equilibrium (Hessian positive definite, " << r.path.newton_iterations
        << " Newton iterations in " << r.path.steps.size() << " load steps, " << r.path.wall_time << " s)\n";
    if (r.conformation)
      {
        const auto &cm = *r.conformation;
        out << "Substrate: " << conformation_verdict(cm.conformed_fraction) << " — conformed fraction "
            << 100 * cm.conformed_fraction << " %, " << cm.suspended_regions.size() << " suspended region(s), "
            << "largest gap " << cm.max_gap / nm << " nm\n";
      }
    out << "Max deflection:         " << m.max_deflection.value / nm << " nm at (" << m.max_deflection.location[0] / nm
        << ", " << m.max_deflection.location[1] / nm << ") nm\n";
    out << "Peak principal strain:  " << 100 * m.max_principal_strain.value << " % at ("
        << m.max_principal_strain.location[0] / nm << ", " << m.max_principal_strain.location[1] / nm << ") nm\n";
    out << "Largest areal strain:   " << 100 * m.max_areal_strain.value << " %\n";
    out << "Largest shear strain:   " << 100 * m.max_shear_strain.value << " %\n";
    out << "Energy (aJ): stretching " << r.energy.stretching / 1e-18 << ", bending " << r.energy.bending / 1e-18
        << ", substrate " << r.energy.substrate / 1e-18 << ", external work " << r.energy.external_work / 1e-18
        << ", total " << r.energy.total() / 1e-18 << "\n";
    for (const auto &w : r.warnings)
      out << "WARNING: " << w << "\n";
    out << "Summary: " << r.summary_file << "\n";
    if (!r.fields_file.empty())
      out << "Fields (ParaView): " << r.fields_file << "\n";
    out << caution << "\n";
  }
} // namespace nappe

#include <deal.II/base/mpi.h>

#include <nappe/base/units.h>
#include <nappe/base/version.h>
#include <nappe/io/atomic_file.h>
#include <nappe/io/field_output.h>
#include <nappe/io/json_writer.h>
#include <nappe/io/sheet_run.h>

#include <iomanip>

namespace nappe
{
  namespace
  {
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

  SheetRunResult run_sheet_case(const SheetCase &c, MPI_Comm comm, std::ostream *log)
  {
    SheetRunResult result;
    SheetSystem    system(c.model, c.domain, comm);
    if (log)
      *log << "Case '" << c.title << "': " << system.dof_handler().get_triangulation().n_global_active_cells()
           << " cells, " << system.n_dofs() << " unknowns, Q" << c.model.discretization.degree << ", "
           << dealii::Utilities::MPI::n_mpi_processes(comm) << " MPI rank(s)\n";
    EnergyMinimizer minimizer(system, c.newton, log);
    Vector          state = system.make_owned_vector();
    result.path           = follow_load_path(minimizer, state, c.stepping, log);
    result.converged      = result.path.converged;
    result.message        = result.path.message;
    if (!result.converged)
      return result;

    Vector ghosted = system.make_ghosted_vector();
    ghosted        = state;
    result.energy   = system.energy(ghosted, 1.0);
    result.measures = measure_sheet(system, ghosted, 1.0);

    const std::string base = c.output_directory + "/" + c.output_name;
    if (c.write_fields)
      result.fields_file = write_fields(system, ghosted, 1.0, c.output_directory, c.output_name);
    result.summary_file = base + ".json";
    if (dealii::Utilities::MPI::this_mpi_process(comm) == 0)
      write_atomically(result.summary_file, [&](std::ostream &out) { write_summary(c, system, result, out); });
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
    out << "Max deflection:         " << m.max_deflection.value / nm << " nm at (" << m.max_deflection.location[0] / nm
        << ", " << m.max_deflection.location[1] / nm << ") nm\n";
    out << "Peak principal strain:  " << 100 * m.max_principal_strain.value << " % at ("
        << m.max_principal_strain.location[0] / nm << ", " << m.max_principal_strain.location[1] / nm << ") nm\n";
    out << "Largest areal strain:   " << 100 * m.max_areal_strain.value << " %\n";
    out << "Largest shear strain:   " << 100 * m.max_shear_strain.value << " %\n";
    out << "Energy (aJ): stretching " << r.energy.stretching / 1e-18 << ", bending " << r.energy.bending / 1e-18
        << ", substrate " << r.energy.substrate / 1e-18 << ", external work " << r.energy.external_work / 1e-18
        << ", total " << r.energy.total() / 1e-18 << "\n";
    out << "Summary: " << r.summary_file << "\n";
    if (!r.fields_file.empty())
      out << "Fields (ParaView): " << r.fields_file << "\n";
    out << caution << "\n";
  }
} // namespace nappe

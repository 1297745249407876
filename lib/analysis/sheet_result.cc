#include <deal.II/base/mpi.h>

#include <nappe/analysis/sheet_result.h>

#include <sstream>

namespace nappe
{
  namespace
  {
    std::string percent(double strain)
    {
      std::ostringstream s;
      s << 100 * strain;
      return s.str();
    }
  } // namespace

  SheetResult analyse_solution(const SheetSolution &solution, const SheetProblem &problem)
  {
    SheetResult        r;
    const SheetSystem &system = *solution.system;
    r.path      = solution.path;
    r.converged = solution.path.converged;
    r.message   = solution.path.message;
    r.cells     = system.dof_handler().get_triangulation().n_global_active_cells();
    r.unknowns  = system.n_dofs();
    r.ranks     = dealii::Utilities::MPI::n_mpi_processes(system.communicator());
    r.meshes    = solution.meshes;
    if (!r.converged)
      return r;
    Vector ghosted = system.make_ghosted_vector();
    ghosted        = solution.state;
    r.energy       = system.energy(ghosted, 1.0);
    r.measures     = measure_sheet(system, ghosted, 1.0);
    if (problem.model.adhesion())
      r.conformation = measure_conformation(system, ghosted, 1.0);
    const double fracture = problem.model.material.fracture_strain;
    const double peak     = r.measures.at("max_principal_strain").value;
    if (fracture > 0.0 && peak > fracture)
      r.warnings.push_back("peak principal strain " + percent(peak) + " % exceeds the fracture strain of " +
                           problem.model.material.name + " (" + percent(fracture) + " %)");
    return r;
  }
} // namespace nappe

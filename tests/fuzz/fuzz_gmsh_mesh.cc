// Fuzz target: Gmsh meshes read through make_sheet_mesh (check_gmsh_file, then deal.II's GridIn), with
// the geometric queries of a mesh-file domain, and once more as a periodic cell.
#include <deal.II/distributed/tria.h>

#include <nappe/geometry/sheet_domain.h>

#include <deal.II/base/mpi.h>

#include <sanitizer/lsan_interface.h>

#include "fuzz_common.h"

extern "C" int LLVMFuzzerInitialize(int *argc, char ***argv)
{
  // MPI and p4est as the drivers start them (p4est silent). What Open MPI allocates at start-up and keeps
  // to the end is not a leak of the reader under test.
  __lsan_disable();
  static dealii::Utilities::MPI::MPI_InitFinalize mpi(*argc, *argv, 1);
  __lsan_enable();
  // Runs before mpi's destructor: what MPI_Finalize allocates is not the reader's either.
  std::atexit([] { __lsan_disable(); });
  return 0;
}

extern "C" int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size)
{
  const std::string input(reinterpret_cast<const char *>(data), size);
  using namespace nappe;
  // The domain caches a mesh file's geometry per (path, size, modification time); a name cycled over
  // many files keeps inputs written within one clock tick apart.
  static unsigned long calls = 0;
  const std::string    name = "mesh-" + std::to_string(calls++ % 1000) + ".msh";
  const std::string    file = fuzz::scratch_file(name, data, size);
  for (const bool periodic : {false, true})
    fuzz::run_reader(
      [&] {
        SheetDomain d;
        d.shape              = SheetDomain::Shape::mesh_file;
        d.mesh_file          = file;
        d.global_refinements = 0;
        d.periodic           = periodic;
        // The serial reading first (geometric queries), then the distributed mesh only for a readable
        // file: creating a distributed triangulation costs more than rejecting most inputs.
        fuzz::require_finite(d.area(), "mesh area");
        dealii::parallel::distributed::Triangulation<2> tria(MPI_COMM_SELF);
        make_sheet_mesh(tria, d);
        const auto [a1, a2] = d.lattice_vectors();
        fuzz::require_finite(a1, "lattice vector");
        fuzz::require_finite(a2, "lattice vector");
        fuzz::require_finite(d.center(), "mesh centre");
        (void)d.boundary_ids();
      },
      {name, true, input});
  return 0;
}

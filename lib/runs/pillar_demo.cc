#include <nappe/runs/pillar_demo.h>

namespace nappe
{
  const char *pillar_demo_case()
  {
    return R"(
subsection Case
  set Title = demo: MoS2 monolayer laid on a square array of rounded SiO2 nanopillars
end
subsection Sheet
  set Material = MoS2
end
subsection Domain
  set Shape = rectangle
  set Length x = 100
  set Length y = 100
  set Periodic = true
  set Coarse cells x = 4
  set Coarse cells y = 4
  set Global refinements = 3
end
subsection Edges
  set Conditions =
end
subsection Substrate
  set Enabled = true
  set Protocol = laid down
end
subsection Topography
  set Type = pillar
  set Array = square
  set Array pitch = 100
  subsection Pillar
    set Height = 8
    set Radius = 20
    set Edge radius = 4
    set Foot radius = 4
    set Sidewall angle = 70
  end
end
subsection Adhesion
  set Work of adhesion = 0.22
  set Equilibrium separation = 0.5
end
subsection Solver
  set Load steps = 1
end
subsection Output
  set Base name = demo-pillars
end
)";
  }
} // namespace nappe

// Reading case files (io/sheet_case.h, io/case_file.h): the trade's units converted to SI, edge
// conditions, relative paths, and bad entries named. Conversion factors: CODATA 2018 (1 eV =
// 1.602176634e-19 J exactly); 1 nm = 1e-9 m, 1 kPa = 1e3 Pa, 1 nN = 1e-9 N by definition.
#include <deal.II/base/parameter_handler.h>

#include <nappe/io/case_file.h>
#include <nappe/io/parameter_override.h>
#include <nappe/io/sheet_case.h>
#include <nappe/physics/adhesion_potential.h>

#include <common/thrown_message.h>

#include <gtest/gtest.h>

#include <filesystem>
#include <fstream>

using namespace nappe;
using test_support::user_message_of;
namespace fs = std::filesystem;

namespace
{
  SheetCase parse(const std::string &text, const std::vector<std::string> &overrides = {})
  {
    dealii::ParameterHandler prm;
    declare_sheet_case_parameters(prm);
    read_parameter_text(prm, text, "test case");
    for (const auto &o : overrides)
      apply_override(prm, o);
    return parse_sheet_case(prm);
  }

  const char *rectangle = R"(
subsection Domain
  set Shape = rectangle
  set Length x = 120
  set Length y = 80
end
subsection Edges
  set Conditions = 0: clamped/fixed, 2: simply supported/free
end
subsection Loads
  set Pressure = 50
  set Point load = 2
  set Point load x = 30
  set Point load y = 40
end
subsection Sheet
  set Material = custom
  set Young's modulus 2D = 340
  set Bending rigidity = 1.4
end
)";
} // namespace

TEST(CaseFile, ConvertsTheTradesUnitsToSI)
{
  const SheetCase c = parse(rectangle);
  EXPECT_DOUBLE_EQ(c.problem.domain.length_x, 120e-9);
  EXPECT_DOUBLE_EQ(c.problem.domain.length_y, 80e-9);
  EXPECT_DOUBLE_EQ(c.problem.model.loads.pressure, 50e3);
  ASSERT_EQ(c.problem.model.loads.point_loads.size(), 1u);
  EXPECT_DOUBLE_EQ(c.problem.model.loads.point_loads[0].force, 2e-9);
  EXPECT_DOUBLE_EQ(c.problem.model.loads.point_loads[0].location[1], 40e-9);
  EXPECT_DOUBLE_EQ(c.problem.model.material.bending_rigidity, 1.4 * 1.602176634e-19);
  EXPECT_DOUBLE_EQ(c.problem.model.material.youngs_modulus_2d, 340.0);
}

TEST(CaseFile, ReadsEdgeConditionsPerBoundaryId)
{
  const auto edges = parse(rectangle).problem.model.edges;
  ASSERT_EQ(edges.size(), 2u);
  EXPECT_EQ(edges.at(0).deflection, DeflectionCondition::clamped);
  EXPECT_EQ(edges.at(0).in_plane, InPlaneCondition::fixed);
  EXPECT_EQ(edges.at(2).deflection, DeflectionCondition::simply_supported);
  EXPECT_EQ(edges.at(2).in_plane, InPlaneCondition::free);
  const auto all = parse(rectangle, {"Edges/Conditions=all: clamped/free"}).problem.model.edges;
  EXPECT_EQ(all.size(), 4u); // rectangle ids 0..3
}

TEST(CaseFile, RejectsAnEdgeIdTheDomainDoesNotHaveListingTheExistingOnes)
{
  const std::string m = user_message_of([] { parse(rectangle, {"Edges/Conditions=7: clamped/fixed"}); });
  EXPECT_NE(m.find("Edges/Conditions"), std::string::npos) << m;
  EXPECT_NE(m.find("no edge with id 7"), std::string::npos) << m;
  EXPECT_NE(m.find("0, 1, 2, 3"), std::string::npos) << m;
}

TEST(CaseFile, RejectsUnknownConditionsAndAPeriodicDisk)
{
  EXPECT_NE(user_message_of([] { parse(rectangle, {"Edges/Conditions=0: welded/fixed"}); }).find("'welded'"),
            std::string::npos);
  EXPECT_NE(user_message_of([] { parse(rectangle, {"Edges/Conditions=0: clamped/sliding"}); }).find("'sliding'"),
            std::string::npos);
  EXPECT_NE(user_message_of([] { parse("subsection Domain\n set Shape = disk\n set Periodic = true\nend\n"); })
              .find("Domain/Periodic"),
            std::string::npos);
}

TEST(CaseFile, BuildsOneAdhesionSubstrateWithTheProtocol)
{
  const SheetCase c = parse(std::string(rectangle) + R"(
subsection Substrate
  set Enabled = true
  set Protocol = grown conformal
end
subsection Adhesion
  set Work of adhesion = 0.3
  set Equilibrium separation = 0.6
end
)");
  ASSERT_NE(c.problem.model.adhesion(), nullptr);
  EXPECT_DOUBLE_EQ(c.problem.model.adhesion()->law().work_of_adhesion(), 0.3);
  EXPECT_DOUBLE_EQ(c.problem.model.adhesion()->law().equilibrium_gap(), 0.6e-9);
  EXPECT_EQ(c.problem.start, StartProtocol::grown_conformal);
  EXPECT_EQ(parse(rectangle).problem.model.adhesion(), nullptr);
}

TEST(CaseFile, ChoosesTheSolverSeamByName)
{
  const SheetCase c = parse(rectangle);
  EXPECT_EQ(c.problem.solver.linear_solver, "automatic");
  EXPECT_EQ(c.problem.solver.certificate, "automatic");
  const std::string unknown = user_message_of([] { parse(rectangle, {"Solver/Linear solver=gauss seidel"}); });
  EXPECT_NE(unknown.find("Solver/Linear solver"), std::string::npos) << unknown;
  const SheetCase m = parse(rectangle, {"Solver/Linear solver=multilevel CG", "Solver/Stability certificate=multilevel LOBPCG"});
  EXPECT_EQ(m.problem.solver.linear_solver, "multilevel CG");
  EXPECT_EQ(m.problem.solver.certificate, "multilevel LOBPCG");
  // The eigen-certificate needs the multilevel preconditioner: refused with the direct solver, naming both entries.
  const std::string mismatch = user_message_of([] {
    parse(rectangle, {"Solver/Linear solver=direct LDLT", "Solver/Stability certificate=multilevel LOBPCG"});
  });
  EXPECT_NE(mismatch.find("Solver/Stability certificate"), std::string::npos) << mismatch;
  EXPECT_NE(mismatch.find("Solver/Linear solver = multilevel CG"), std::string::npos) << mismatch;
}

// "automatic" is the direct solver with its inertia below the measured crossover and the multilevel
// solver with LOBPCG from there on; a named certificate is kept, and LOBPCG brings the multilevel solver.
TEST(CaseFile, AutomaticSolverChoiceFollowsTheNumberOfUnknowns)
{
  const SolverSettings automatic;
  const SolverSettings small = resolved(automatic, multilevel_crossover_unknowns - 1);
  const SolverSettings large = resolved(automatic, multilevel_crossover_unknowns);
  EXPECT_EQ(small.linear_solver, "direct LDLT");
  EXPECT_EQ(small.certificate, "LDLT inertia");
  EXPECT_EQ(large.linear_solver, "multilevel CG");
  EXPECT_EQ(large.certificate, "multilevel LOBPCG");
  SolverSettings inertia;
  inertia.certificate = "LDLT inertia";
  EXPECT_EQ(resolved(inertia, multilevel_crossover_unknowns).certificate, "LDLT inertia");
  SolverSettings lobpcg;
  lobpcg.certificate = "multilevel LOBPCG";
  EXPECT_EQ(resolved(lobpcg, 100).linear_solver, "multilevel CG");
  SolverSettings direct;
  direct.linear_solver = "direct LDLT";
  EXPECT_EQ(resolved(direct, 10 * multilevel_crossover_unknowns).linear_solver, "direct LDLT");
}

// A relative path means relative to the file that names it (here: the case file's directory).
TEST(CaseFile, RelativePathsAreRelativeToTheCaseFile)
{
  const fs::path dir = fs::temp_directory_path() / "nappe_case_file_test";
  fs::create_directories(dir / "cases");
  const fs::path file = dir / "cases" / "drum.prm";
  std::ofstream(file) << "subsection Domain\n  set Shape = mesh file\n  set Mesh file = ../meshes/drum.msh\nend\n"
                      << "subsection Output\n  set Directory = results\nend\n";
  dealii::ParameterHandler prm;
  declare_sheet_case_parameters(prm);
  read_parameter_file(prm, file.string());
  EXPECT_EQ(fs::path(entry_text(prm, "Domain/Mesh file")), (dir / "meshes" / "drum.msh").lexically_normal());
  EXPECT_EQ(fs::path(entry_text(prm, "Output/Directory")), (dir / "cases" / "results").lexically_normal());
  fs::remove_all(dir);
}

TEST(CaseFile, AMissingFileIsNamed)
{
  dealii::ParameterHandler prm;
  declare_sheet_case_parameters(prm);
  const std::string m = user_message_of([&] { read_parameter_file(prm, "no/such/case.prm"); });
  EXPECT_NE(m.find("no/such/case.prm"), std::string::npos) << m;
}

namespace
{
  const char *grating_cell = R"(
subsection Domain
  set Shape = rectangle
  set Length x = 20
  set Length y = 2
  set Periodic = true
end
subsection Edges
  set Conditions =
end
subsection Substrate
  set Enabled = true
end
subsection Topography
  set Type = sinusoidal grating
  subsection Sinusoidal grating
    set Wavelength = 30
  end
end
)";
} // namespace

// A periodic cell that is not a whole number of the topography's periods would solve a surface with a
// kink at the cell edge: refused, naming both lengths.
TEST(CaseFile, RefusesACellThatDoesNotMatchTheTopographysPeriod)
{
  const std::string m = user_message_of([] { parse(grating_cell); });
  EXPECT_NE(m.find("not periodic on the cell"), std::string::npos) << m;
  EXPECT_NE(m.find("Length x = 20 nm, Length y = 2 nm"), std::string::npos) << m;
  EXPECT_NE(m.find("(30, 0) nm"), std::string::npos) << m;
  EXPECT_NE(m.find("Periods per cell"), std::string::npos) << m;
  // An array's cell vector is given by its coefficients on both lattice vectors: (90, 0) nm = 0.9 a₁ + 0 a₂.
  const std::string a = user_message_of([] {
    parse(grating_cell, {"Topography/Type=pillar", "Topography/Array=square", "Topography/Array pitch=100",
                         "Domain/Length x=90", "Domain/Length y=100"});
  });
  EXPECT_NE(a.find("(90, 0) nm is not a whole number of periods"), std::string::npos) << a;
  EXPECT_NE(a.find("it spans 0.9 periods of the first and 0 of the second"), std::string::npos) << a;
  // A formula is checked by sampling the cell's edges: sin(2πx/30 nm) on a 20 nm cell.
  const std::string f = user_message_of([] {
    parse(grating_cell, {"Topography/Type=formula", "Topography/Formula/Expression=sin(2*pi*x/30)"});
  });
  EXPECT_NE(f.find("between opposite edges"), std::string::npos) << f;
}

TEST(CaseFile, PeriodsPerCellFitsTheCellToTheLattice)
{
  const SheetCase grating = parse(grating_cell, {"Domain/Periods per cell=2"});
  EXPECT_DOUBLE_EQ(grating.problem.domain.length_x, 60e-9);
  EXPECT_DOUBLE_EQ(grating.problem.domain.length_y, 2e-9); // along the ridges: as given
  const SheetCase hexagonal = parse(grating_cell, {"Domain/Periods per cell=1", "Topography/Type=pillar",
                                                   "Topography/Array=hexagonal", "Topography/Array pitch=80"});
  EXPECT_EQ(hexagonal.problem.domain.shape, SheetDomain::Shape::rhombus);
  EXPECT_DOUBLE_EQ(hexagonal.problem.domain.length_x, 80e-9);
  EXPECT_NE(user_message_of([] { parse(grating_cell, {"Domain/Periods per cell=1", "Topography/Type=formula"}); })
              .find("no square, hexagonal"),
            std::string::npos);
}

TEST(CaseFile, ParameterMessagesNameTheLineAndTheClosestEntry)
{
  dealii::ParameterHandler prm;
  declare_sheet_case_parameters(prm);
  const std::string typo = user_message_of([&] {
    read_parameter_text(prm, "subsection Adhesion\n  set Work of adhesoin = 0.3\nend\n", "t1.prm");
  });
  EXPECT_NE(typo.find("t1.prm:2: no entry 'Work of adhesoin' in Adhesion/ (did you mean 'Work of adhesion'?)"),
            std::string::npos)
    << typo;
  const std::string misplaced =
    user_message_of([&] { read_parameter_text(prm, "subsection Domain\n  set Pressure = 5\nend\n", "t2.prm"); });
  EXPECT_NE(misplaced.find("'Pressure' belongs to subsection Loads"), std::string::npos) << misplaced;
  const std::string selection = user_message_of([&] { apply_override(prm, "Domain/Shape=square"); });
  EXPECT_NE(selection.find("one of 'rectangle', 'rhombus', 'disk', 'mesh file'"), std::string::npos) << selection;
  const std::string unit = user_message_of([&] { apply_override(prm, "Domain/Length x=20 nm"); });
  EXPECT_NE(unit.find("write the number alone"), std::string::npos) << unit;
  // A length in nm given in metres: named, with the hint; a small length that is not metres passes.
  const std::string metres = user_message_of([&] { apply_override(prm, "Topography/Pillar/Height=8e-9"); });
  EXPECT_NE(metres.find("Topography/Pillar/Height = '8e-9': lengths here are in nm"), std::string::npos) << metres;
  EXPECT_NE(metres.find("was it given in metres?"), std::string::npos) << metres;
  EXPECT_NO_THROW(apply_override(prm, "Topography/Pillar/Height=0.05"));
  EXPECT_NO_THROW(apply_override(prm, "Topography/Offset x=0"));
}

// A length typed in metres into an nm entry, or Γ in mJ/m² typed as J/m², is refused with the likely cause.
TEST(CaseFile, AValueInTheWrongUnitIsRefusedWithTheLikelyCause)
{
  const std::string metres = user_message_of([] { parse(rectangle, {"Domain/Length x=2e-8"}); });
  EXPECT_NE(metres.find("Domain/Length x = '2e-8': lengths here are in nm"), std::string::npos) << metres;
  EXPECT_NE(metres.find("was it given in metres?"), std::string::npos) << metres;
  const std::string millijoules = user_message_of([] { parse(grating_cell, {"Adhesion/Work of adhesion=450"}); });
  EXPECT_NE(millijoules.find("A value in mJ/m^2?"), std::string::npos) << millijoules;
  EXPECT_NE(millijoules.find("450 mJ/m^2 = 0.45 J/m^2"), std::string::npos) << millijoules;
}

// Bad input to the topography and mesh readers ends in nappe's own one-line message that names the file
// and line (or the case-file entry) and says what was expected — never a library assertion block, raw
// bytes of a binary file, or a value that only fails later in the solver. Each test reproduces one
// reported failure (syntax errors in formulas, formulas that are not finite where they are sampled,
// heights of 1e308 and STL files scaled by 1e30, binary STL files whose header starts with "solid", paths
// that are directories, and truncated, empty, garbage, wrong-version, NaN-coordinate and wrong-count Gmsh
// files). The files are invented test inputs.
#include <deal.II/distributed/tria.h>

#include <deal.II/base/parameter_handler.h>

#include <nappe/io/sweep_file.h>
#include <nappe/base/units.h>
#include <nappe/geometry/formula_topography.h>
#include <nappe/geometry/gmsh_file_check.h>
#include <nappe/geometry/height_map.h>
#include <nappe/geometry/sheet_domain.h>
#include <nappe/geometry/stl_topography.h>
#include <nappe/geometry/topography_factory.h>
#include <nappe/base/collective.h>

#include <common/thrown_message.h>

#include <gtest/gtest.h>

#include <cstdint>
#include <cstring>
#include <filesystem>
#include <fstream>
#include <iostream>
#include <sstream>

using namespace nappe;
using test_support::user_message_of;
using dealii::Point;

namespace
{
  constexpr double nm = units::nanometer;

  Point<2> P(double x_nm, double y_nm) { return Point<2>(x_nm * nm, y_nm * nm); }

  /// A message a user can read: one line (a trailing line break allowed), printable characters only (UTF-8
  /// letters allowed), none of deal.II's assertion text.
  ::testing::AssertionResult is_clean_one_line(std::string m)
  {
    while (!m.empty() && (m.back() == '\n' || m.back() == ' '))
      m.pop_back();
    if (m.empty())
      return ::testing::AssertionFailure() << "no error";
    for (const char c : m)
      if (static_cast<unsigned char>(c) < 0x20 || c == 0x7f)
        return ::testing::AssertionFailure() << "control character " << int(c) << " in: " << m;
    for (const char *library_text : {"An error occurred in line", "violated condition", "Stacktrace"})
      if (m.find(library_text) != std::string::npos)
        return ::testing::AssertionFailure() << "library text in: " << m;
    return ::testing::AssertionSuccess();
  }

  std::string write(const std::string &name, const std::string &content)
  {
    std::ofstream(name, std::ios::binary) << content;
    return name;
  }

  bool has(const std::string &text, const std::string &part) { return text.find(part) != std::string::npos; }

  /// Runs f with std::cerr captured; returns what was written there.
  template <typename F>
  std::string cerr_during(const F &f)
  {
    std::ostringstream captured;
    std::streambuf    *old = std::cerr.rdbuf(captured.rdbuf());
    try
      {
        f();
      }
    catch (...)
      {
        std::cerr.rdbuf(old);
        throw;
      }
    std::cerr.rdbuf(old);
    return captured.str();
  }

  /// A binary STL with an 80-byte header starting "solid", announcing @p announced facets and holding
  /// the facets given (x, y, z in nm; all on one triangle per entry).
  std::string binary_stl(const std::string &file, const std::uint32_t announced,
                         const std::vector<std::array<float, 9>> &facets)
  {
    std::ofstream out(file, std::ios::binary);
    char          header[80] = {};
    std::strncpy(header, "solid exported by a CAD program", 79);
    out.write(header, 80);
    out.write(reinterpret_cast<const char *>(&announced), 4);
    for (const auto &f : facets)
      {
        const float normal[3] = {0, 0, 1};
        out.write(reinterpret_cast<const char *>(normal), 12);
        out.write(reinterpret_cast<const char *>(f.data()), 36);
        const std::uint16_t attribute = 0;
        out.write(reinterpret_cast<const char *>(&attribute), 2);
      }
    return file;
  }

  /// A valid 2 × 1 quadrilateral mesh on [0, 2] × [0, 1], Gmsh format 2.2, boundary line ids 0..3.
  const std::string two_quads_v22 = "$MeshFormat\n2.2 0 8\n$EndMeshFormat\n"
                                    "$Nodes\n6\n1 0 0 0\n2 1 0 0\n3 2 0 0\n4 0 1 0\n5 1 1 0\n6 2 1 0\n$EndNodes\n"
                                    "$Elements\n8\n"
                                    "1 1 2 0 1 1 4\n2 1 2 1 2 3 6\n3 1 2 2 3 1 2\n4 1 2 2 3 2 3\n"
                                    "5 1 2 3 4 4 5\n6 1 2 3 4 5 6\n"
                                    "7 3 2 7 1 1 2 5 4\n8 3 2 7 1 2 3 6 5\n$EndElements\n";

  /// The same mesh in Gmsh format 4.1 (entities: points 1–4, curves 1–4 with physical tags 0–3, surface 1).
  const std::string two_quads_v41 = "$MeshFormat\n4.1 0 8\n$EndMeshFormat\n"
                                    "$Entities\n4 4 1 0\n"
                                    "1 0 0 0 0\n2 2 0 0 0\n3 2 1 0 0\n4 0 1 0 0\n"
                                    "1 0 0 0 0 1 0 1 0 2 1 -4\n2 2 0 0 2 1 0 1 1 2 2 -3\n"
                                    "3 0 0 0 2 0 0 1 2 2 1 -2\n4 0 1 0 2 1 0 1 3 2 3 -4\n"
                                    "1 0 0 0 2 1 0 1 7 4 1 2 3 4\n$EndEntities\n"
                                    "$Nodes\n2 6 1 6\n0 1 0 4\n1\n2\n3\n4\n0 0 0\n1 0 0\n2 0 0\n0 1 0\n"
                                    "2 1 0 2\n5\n6\n1 1 0\n2 1 0\n$EndNodes\n"
                                    "$Elements\n5 8 1 8\n"
                                    "1 1 1 1\n1 1 4\n1 2 1 1\n2 3 6\n1 3 1 2\n3 1 2\n4 2 3\n1 4 1 2\n5 4 5\n6 5 6\n"
                                    "2 1 3 2\n7 1 2 5 4\n8 2 3 6 5\n$EndElements\n";

  /// The message of make_sheet_mesh on @p file (0 refinements), or "" if it builds.
  std::string mesh_message(const std::string &file, const bool periodic = false)
  {
    return user_message_of([&] {
      SheetDomain d;
      d.shape              = SheetDomain::Shape::mesh_file;
      d.mesh_file          = file;
      d.global_refinements = 0;
      d.periodic           = periodic;
      dealii::parallel::distributed::Triangulation<2> tria(MPI_COMM_WORLD);
      make_sheet_mesh(tria, d);
    });
  }
} // namespace


TEST(FormulaBadInput, SyntaxErrorsGiveOneLineNamingTheEntryAndNothingElseIsPrinted)
{
  // Before: 17 lines — muParser's diagnosis on standard error and deal.II's assertion block.
  for (const std::string expression : {"sin(x*", "A*sin(x)", "x + (y", "x;y", "   "})
    {
      std::string m;
      const std::string printed = cerr_during([&] { m = user_message_of([&] { FormulaTopography f(expression); }); });
      EXPECT_TRUE(is_clean_one_line(m)) << expression;
      EXPECT_TRUE(has(m, "Topography/Formula/Expression")) << m;
      EXPECT_TRUE(has(m, "expected")) << m;
      EXPECT_EQ(printed, "") << "printed on standard error for '" << expression << "'";
    }
  const std::string m = user_message_of([] { FormulaTopography f("A*sin(x)"); });
  EXPECT_TRUE(has(m, "'A*sin(x)'")) << m;
  EXPECT_TRUE(has(m, "\"A\"")) << m;
  EXPECT_TRUE(has(m, "no Constants defined")) << m;
  EXPECT_TRUE(has(user_message_of([] { FormulaTopography f("x*k", {{"2k", 1.0}}); }), "constant name '2k'"));
  // A formula defining its constant is accepted (the same text as above, with A given).
  EXPECT_NEAR(FormulaTopography("A*sin(x)", {{"A", 2.0}}).height(P(0.5, 0)), 2.0 * std::sin(0.5) * nm, 1e-20);
}

TEST(FormulaBadInput, NonFiniteValuesAreReportedWithThePointWhereTheyAreSampled)
{
  // Before: accepted, and the solve ended in "MUMPS … numerically singular".
  const FormulaTopography pole("1/(x-x)"), root("sqrt(-1-x*x)"), huge("1e308");
  for (const FormulaTopography *f : {&pole, &root, &huge})
    {
      const std::string m = user_message_of([&] { f->height(P(10, 20)); });
      EXPECT_TRUE(is_clean_one_line(m)) << m;
      EXPECT_TRUE(has(m, "Topography/Formula/Expression")) << m;
      EXPECT_TRUE(has(m, "(10 nm, 20 nm)")) << m;
      EXPECT_TRUE(has(m, "expected a finite height")) << m;
    }
  const std::string infinite = user_message_of([&] { pole.height(P(1, 2)); });
  EXPECT_TRUE(has(infinite, "is inf")) << infinite;
  EXPECT_TRUE(has(user_message_of([&] { root.height(P(1, 2)); }), "nan"));
  EXPECT_TRUE(has(user_message_of([&] { pole.gradient(P(1, 2)); }), "expected a finite slope"));
}

TEST(HeightMapBadInput, AHeightOf1e308IsRefusedAtItsLine)
{
  HeightMap::ReadOptions o;
  o.spacing = dealii::Tensor<1, 2>({1 * nm, 1 * nm});
  const std::string f =
    write("huge_height_map.txt", "0 0 0 0\n0 0 0 0\n0 0 1e308 0\n0 0 0 0\n");
  const std::string m = user_message_of([&] { HeightMap::read(f, o); });
  EXPECT_TRUE(is_clean_one_line(m)) << m;
  EXPECT_TRUE(has(m, "huge_height_map.txt', line 3")) << m;
  EXPECT_TRUE(has(m, "|height| <= 1e+06 nm")) << m;
  std::filesystem::remove(f);
}

TEST(HeightMapBadInput, RawBytesAreShownEscaped)
{
  HeightMap::ReadOptions o;
  o.spacing = dealii::Tensor<1, 2>({1 * nm, 1 * nm});
  const std::string f = write("binary_height_map.txt", "1 2 3 4\n1 \x01\xff\x1b[2J 3 4\n");
  const std::string m = user_message_of([&] { HeightMap::read(f, o); });
  EXPECT_TRUE(is_clean_one_line(m)) << m;
  EXPECT_TRUE(has(m, "line 2")) << m;
  EXPECT_TRUE(has(m, "\\x01\\xff\\x1b[2J")) << m;
  std::filesystem::remove(f);
}

TEST(HeightMapBadInput, ADirectoryOrAnOversizedSmoothingIsRefusedByName)
{
  HeightMap::ReadOptions o;
  o.spacing = dealii::Tensor<1, 2>({1 * nm, 1 * nm});
  std::filesystem::create_directory("height_map_dir.txt");
  const std::string m = user_message_of([&] { HeightMap::read("height_map_dir.txt", o); });
  EXPECT_TRUE(is_clean_one_line(m)) << m;
  EXPECT_TRUE(has(m, "'height_map_dir.txt' is a directory")) << m;
  std::filesystem::remove("height_map_dir.txt");

  // Before: a width of 1e300 nm overflowed the conversion of 4 sigma to a number of nodes.
  HeightMap map(P(0, 0), dealii::Tensor<1, 2>({1 * nm, 1 * nm}), 4, 4, std::vector<double>(16, 0.0),
                HeightMap::Extension::periodic);
  const std::string s = user_message_of([&] { map.smooth(1e300 * nm); });
  EXPECT_TRUE(is_clean_one_line(s)) << s;
  EXPECT_TRUE(has(s, "smoothing width")) << s;
}

TEST(StlBadInput, BinaryFileWithSolidHeaderAndWrongCountIsReportedAsBinary)
{
  // Before: "ASCII STL file …, line 1: expected 'facet normal …'" followed by the header's raw bytes.
  const std::string f = binary_stl("solid_header_binary.stl", 5, {{0, 0, 0, 1, 0, 0, 0, 1, 0}});
  const std::string m = user_message_of([&] { StlTopography s(f); });
  EXPECT_TRUE(is_clean_one_line(m)) << m;
  EXPECT_TRUE(has(m, "binary STL file 'solid_header_binary.stl'")) << m;
  EXPECT_TRUE(has(m, "announces 5 facets")) << m;
  EXPECT_TRUE(has(m, "134 bytes")) << m;
  EXPECT_FALSE(has(m, "ASCII")) << m;
  std::filesystem::remove(f);
}

TEST(StlBadInput, ADirectoryIsNamedAsSuchNotGivenAByteCount)
{
  // Before: "… the file has 9223372036854775807 bytes".
  std::filesystem::create_directory("stl_dir.stl");
  const std::string m = user_message_of([] { StlTopography s("stl_dir.stl"); });
  EXPECT_TRUE(is_clean_one_line(m)) << m;
  EXPECT_TRUE(has(m, "'stl_dir.stl' is a directory")) << m;
  EXPECT_FALSE(has(m, "bytes")) << m;
  std::filesystem::remove("stl_dir.stl");
}

TEST(StlBadInput, HeightsScaledBy1e30AreRefusedNamingTheFacetOrLine)
{
  const float       z = 1e30f;
  const std::string b = binary_stl("scaled_binary.stl", 2, {{0, 0, 0, 1, 0, 0, 0, 1, 0}, {1, 0, 0, 1, 1, z, 0, 1, 0}});
  std::string       m = user_message_of([&] { StlTopography s(b); });
  EXPECT_TRUE(is_clean_one_line(m)) << m;
  EXPECT_TRUE(has(m, "facet 2 has a vertex at height z = 1e+30")) << m;
  EXPECT_TRUE(has(m, "|z| <= 1e+06 nm")) << m;
  std::filesystem::remove(b);

  const std::string a = write("scaled_ascii.stl", "solid s\nfacet normal 0 0 1\nouter loop\nvertex 0 0 0\n"
                                                  "vertex 1 0 1e30\nvertex 0 1 0\nendloop\nendfacet\nendsolid s\n");
  m = user_message_of([&] { StlTopography s(a); });
  EXPECT_TRUE(is_clean_one_line(m)) << m;
  EXPECT_TRUE(has(m, "'scaled_ascii.stl', line 5")) << m;
  std::filesystem::remove(a);
}

TEST(StlBadInput, RawBytesInAnAsciiFileAreShownEscaped)
{
  const std::string f = write("garbage_ascii.stl", "solid " + std::string(90, 'n') + "\n\x07\x08\xc3\x28 vertex\n");
  const std::string m = user_message_of([&] { StlTopography s(f); });
  EXPECT_TRUE(is_clean_one_line(m)) << m;
  EXPECT_TRUE(has(m, "line 2")) << m;
  EXPECT_TRUE(has(m, "\\x07\\x08\\xc3(")) << m;
  std::filesystem::remove(f);
}

TEST(GmshBadInput, ValidMeshesInFormats22And41GiveTheSameCells)
{
  write("two_quads_v22.msh", two_quads_v22);
  write("two_quads_v41.msh", two_quads_v41);
  for (const std::string file : {"two_quads_v22.msh", "two_quads_v41.msh"})
    {
      EXPECT_NO_THROW(check_gmsh_file(file)) << mesh_message(file);
      SheetDomain d;
      d.shape              = SheetDomain::Shape::mesh_file;
      d.mesh_file          = file;
      d.global_refinements = 0;
      EXPECT_NEAR(d.area(), 2.0, 1e-14) << file;
      EXPECT_EQ(d.boundary_ids(), (std::vector<dealii::types::boundary_id>{0, 1, 2, 3})) << file;
      dealii::parallel::distributed::Triangulation<2> tria(MPI_COMM_WORLD);
      make_sheet_mesh(tria, d);
      EXPECT_EQ(tria.n_global_active_cells(), 2u) << file;
    }
  // The shipped meshes pass the check.
  const auto meshes = (std::filesystem::path(__FILE__).parent_path() / ".." / ".." / "meshes").lexically_normal();
  for (const char *name : {"drum.msh", "square_cell.msh", "rhombic_cell.msh", "trench_flake.msh"})
    EXPECT_NO_THROW(check_gmsh_file((meshes / name).string())) << name;
}

TEST(GmshBadInput, BrokenFilesAreRefusedNamingFileLineAndWhatWasExpected)
{
  // Before: deal.II's assertion block, or a file read wrongly (version 3.0 read as 2.2).
  const std::string header = "$MeshFormat\n2.2 0 8\n$EndMeshFormat\n";
  struct Case
  {
    std::string name, content, expected_part;
  };
  const std::vector<Case> cases = {
    {"empty", "", "line 1: the file is empty"},
    {"truncated", two_quads_v22.substr(0, two_quads_v22.find("7 3 2")), "line 20: the file ends here (truncated?)"},
    {"garbage", std::string("\x7f" "ELF\x02\x01\x01\0\0\0", 10), "line 1: expected '$MeshFormat', found '\\x7fELF"},
    {"version 3.0", "$MeshFormat\n3.0 0 8\n$EndMeshFormat\n", "line 2: the format version is 3; expected 2.2 or 4.1"},
    {"binary", "$MeshFormat\n2.2 1 8\n$EndMeshFormat\n", "line 2: the file is binary"},
    {"nan coordinate", header + "$Nodes\n4\n1 0 0 0\n2 1 0 0\n3 nan 1 0\n4 0 1 0\n$EndNodes\n",
     "line 8: expected the x coordinate of a node (a decimal number), found 'nan'"},
    {"count too large", header + "$Nodes\n400\n1 0 0 0\n2 1 0 0\n$EndNodes\n", "line 5: the number of nodes is 400"},
    {"count too small", header + "$Nodes\n1\n1 0 0 0\n2 1 0 0\n$EndNodes\n", "line 7: expected '$EndNodes', found '2'"},
    {"missing node", header + "$Nodes\n3\n1 0 0 0\n2 1 0 0\n3 1 1 0\n$EndNodes\n$Elements\n1\n1 3 0 1 2 3 9\n"
                              "$EndElements\n", "line 12: the element refers to node 9"},
    {"triangle", header + "$Nodes\n3\n1 0 0 0\n2 1 0 0\n3 0 1 0\n$EndNodes\n$Elements\n1\n1 2 2 1 1 1 2 3\n"
                          "$EndElements\n", "line 12: the mesh contains triangles"},
    {"bow tie", header + "$Nodes\n4\n1 0 0 0\n2 1 0 0\n3 0 1 0\n4 1 1 0\n$EndNodes\n$Elements\n1\n1 3 0 1 2 3 4\n"
                         "$EndElements\n", "line 13: the quadrilateral is degenerate or not convex"},
    {"negative tag", header + "$Nodes\n4\n1 0 0 0\n2 1 0 0\n3 1 1 0\n4 0 1 0\n$EndNodes\n$Elements\n1\n"
                              "1 3 1 -1 1 2 3 4\n$EndElements\n", "line 13: expected the physical tag"},
    {"4.1 block count", "$MeshFormat\n4.1 0 8\n$EndMeshFormat\n$Nodes\n1 2 1 2\n2 1 0 3\n1\n2\n3\n0 0 0\n1 0 0\n"
                        "1 1 0\n$EndNodes\n", "line 6: the node blocks hold more nodes than the 2 announced"},
  };
  for (const Case &c : cases)
    {
      const std::string file = write("bad_mesh.msh", c.content);
      const std::string m    = mesh_message(file);
      EXPECT_TRUE(is_clean_one_line(m)) << c.name << ": " << m;
      EXPECT_TRUE(has(m, "Gmsh mesh file 'bad_mesh.msh', " + c.expected_part)) << c.name << ": " << m;
    }
  std::filesystem::remove("bad_mesh.msh");
}

TEST(FormulaBadInput, ConstantsWithRawBytesAreShownEscaped)
{
  // Found by the formula fuzz target: the Constants entry was echoed byte for byte.
  dealii::ParameterHandler prm;
  TopographyFactory::declare_parameters(prm);
  prm.enter_subsection("Topography");
  prm.set("Type", "formula");
  prm.enter_subsection("Formula");
  prm.set("Expression", "A*x");
  prm.set("Constants", std::string("A\x1a\x1b") + "5");
  prm.leave_subsection();
  prm.leave_subsection();
  const std::string m = user_message_of([&] { TopographyFactory::parse_parameters(prm); });
  EXPECT_TRUE(is_clean_one_line(m)) << m;
  EXPECT_TRUE(has(m, "Topography/Formula/Constants: expected 'name=value', found 'A\\x1a\\x1b5'")) << m;
}

TEST(SweepBadInput, AStepCountBeyondTheLimitIsRefusedBeforeAnyPointIsBuilt)
{
  // Before: 'in 100000000 steps' filled 2 GB with values and then validated every point.
  const std::string f = write("huge_sweep.prm", "subsection Sweep\n  set Case file = no_case.prm\n"
                                                "  subsection Axis 1\n    set Entries = Loads/Pressure\n"
                                                "    set Values = from 0.5 to 2 in 100000000 steps\n  end\nend\n");
  const std::string m = user_message_of([&] { read_sweep(f); });
  EXPECT_TRUE(has(m, "Sweep/Axis 1/Values")) << m;
  EXPECT_TRUE(has(m, "100000000 steps exceed Sweep/Point limit")) << m;
  std::filesystem::remove(f);
}

TEST(GmshBadInput, PeriodicEdgesThatDoNotMatchGiveOneLine)
{
  // Found by the Gmsh fuzz target: deal.II's assertion block was appended to nappe's message.
  std::string skewed = two_quads_v22;
  skewed.replace(skewed.find("6 2 1 0"), 7, "6 2 1.5 0"); // the right edge becomes longer than the left
  const std::string file = write("skewed_cell.msh", skewed);
  EXPECT_EQ(mesh_message(file), "");
  const std::string m = mesh_message(file, true);
  EXPECT_TRUE(is_clean_one_line(m)) << m;
  EXPECT_TRUE(has(m, "periodic mesh file 'skewed_cell.msh' do not match node for node")) << m;
  std::filesystem::remove(file);
}

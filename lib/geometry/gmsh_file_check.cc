#include <deal.II/base/exceptions.h>

#include <nappe/geometry/gmsh_file_check.h>

#include <algorithm>
#include <array>
#include <cctype>
#include <cmath>
#include <cstdlib>
#include <fstream>
#include <iterator>
#include <limits>
#include <map>
#include <set>
#include <vector>

#include "format.h"
#include "input_file.h"

namespace nappe
{
  namespace
  {
    struct Token
    {
      std::string  text;
      unsigned int line;
    };

    bool is_digit(const char c) { return c >= '0' && c <= '9'; }

    /// Decimal floating-point syntax, the subset of numbers that C++ streams and strtod read alike.
    bool is_decimal_number(const std::string &t)
    {
      std::size_t i = 0;
      if (i < t.size() && (t[i] == '+' || t[i] == '-'))
        ++i;
      std::size_t digits = 0;
      for (; i < t.size() && is_digit(t[i]); ++i)
        ++digits;
      if (i < t.size() && t[i] == '.')
        for (++i; i < t.size() && is_digit(t[i]); ++i)
          ++digits;
      if (digits == 0)
        return false;
      if (i < t.size() && (t[i] == 'e' || t[i] == 'E'))
        {
          ++i;
          if (i < t.size() && (t[i] == '+' || t[i] == '-'))
            ++i;
          std::size_t exponent_digits = 0;
          for (; i < t.size() && is_digit(t[i]); ++i)
            ++exponent_digits;
          if (exponent_digits == 0)
            return false;
        }
      return i == t.size();
    }

    /// The file as white-space separated tokens with their line numbers, read like GridIn reads it.
    class MeshTokens
    {
    public:
      explicit MeshTokens(const std::string &filename)
        : filename(filename)
      {
        internal::require_regular_file(filename, "Gmsh mesh");
        std::ifstream in(filename, std::ios::binary);
        AssertThrow(in.good(), dealii::ExcMessage("cannot open Gmsh mesh file '" + filename + "' for reading"));
        unsigned int line = 1;
        std::string  word;
        for (std::istreambuf_iterator<char> it(in), end; it != end; ++it)
          {
            const char c = *it;
            if (std::isspace(static_cast<unsigned char>(c)))
              {
                if (!word.empty())
                  tokens.push_back({std::move(word), line}), word.clear();
                line += c == '\n';
              }
            else
              word += c;
          }
        if (!word.empty())
          tokens.push_back({std::move(word), line});
        last_line = tokens.empty() ? 1 : tokens.back().line;
      }

      [[noreturn]] void fail(const unsigned int line, const std::string &what) const
      {
        AssertThrow(false, dealii::ExcMessage("Gmsh mesh file '" + filename + "', line " + std::to_string(line) +
                                              ": " + what));
        throw; // not reached
      }

      /// Fails at the current token (or the end of the file) with "expected ..., found '...'".
      [[noreturn]] void fail_expected(const std::string &expected) const
      {
        if (at_end())
          fail(last_line, "the file ends here (truncated?); expected " + expected);
        fail(tokens[pos].line, "expected " + expected + ", found '" + internal::excerpt(tokens[pos].text) + "'");
      }

      /// Skips every token up to and including @p end_word; fails at the end of the file.
      void skip_to(const std::string &end_word, const std::string &section)
      {
        while (!at_end() && peek() != end_word)
          ++pos;
        if (at_end())
          fail(last_line, section + " has no '" + end_word + "' (truncated?)");
        ++pos;
      }

      bool               at_end() const { return pos >= tokens.size(); }
      const std::string &peek() const { return tokens[pos].text; }
      unsigned int       line() const { return at_end() ? last_line : tokens[pos].line; }
      std::size_t        remaining() const { return tokens.size() - pos; }
      std::size_t        size() const { return tokens.size(); }

      void keyword(const std::string &word)
      {
        if (at_end() || peek() != word)
          fail_expected("'" + word + "'");
        ++pos;
      }

      /// An integer token in [lower, upper].
      long integer(const std::string &what, const long lower, const long upper)
      {
        if (at_end() || !is_integer(peek()))
          fail_expected(what + " (an integer)");
        errno            = 0;
        const long value = std::strtol(peek().c_str(), nullptr, 10);
        if (errno == ERANGE || value < lower || value > upper)
          fail_expected(what + " in [" + std::to_string(lower) + ", " + std::to_string(upper) + "]");
        ++pos;
        return value;
      }

      /// A count of entries that follow, each at least @p tokens_each tokens long.
      long count(const std::string &what, const std::size_t tokens_each)
      {
        const long n = integer(what, 0, std::numeric_limits<int>::max());
        if (std::size_t(n) > remaining() / std::max<std::size_t>(tokens_each, 1))
          fail(tokens[pos - 1].line, what + " is " + std::to_string(n) + ", but the file is too short for " +
                                       std::to_string(n) + " entries (truncated, or a wrong count)");
        return n;
      }

      double real(const std::string &what)
      {
        if (at_end() || !is_decimal_number(peek()))
          fail_expected(what + " (a decimal number)");
        const double value = std::strtod(peek().c_str(), nullptr);
        if (!std::isfinite(value))
          fail_expected(what + " (a finite number)");
        ++pos;
        return value;
      }

      std::string filename;

    private:
      static bool is_integer(const std::string &t)
      {
        const std::size_t sign = !t.empty() && (t[0] == '-' || t[0] == '+');
        return t.size() > sign && std::all_of(t.begin() + sign, t.end(), is_digit);
      }

      std::vector<Token> tokens;
      std::size_t        pos       = 0;
      unsigned int       last_line = 1;
    };

    constexpr long max_tag = std::numeric_limits<int>::max();

    struct Quad
    {
      std::array<long, 4> nodes;
      unsigned int        line;
    };

    struct Line
    {
      std::array<long, 2> nodes;
      unsigned int        line;
    };

    /// Everything the geometric checks need from the sections.
    struct MeshContent
    {
      std::map<long, std::array<double, 2>> nodes;
      std::vector<Quad>                     quads;
      std::vector<Line>                     lines;
    };

    enum class Format
    {
      v2,
      v41
    };

    Format read_header(MeshTokens &in)
    {
      if (in.size() == 0)
        in.fail(1, "the file is empty; expected a Gmsh mesh starting with '$MeshFormat'");
      if (!in.at_end() && in.peek() == "$NOD")
        in.fail(in.line(), "this is the Gmsh format 1 ('$NOD'); expected format 2.2 or 4.1, starting with "
                           "'$MeshFormat'");
      in.keyword("$MeshFormat");
      const unsigned int version_line = in.line();
      const double       version      = in.real("the format version");
      if (version != 2.0 && version != 2.1 && version != 2.2 && version != 4.1)
        in.fail(version_line, "the format version is " + internal::num(version) +
                                "; expected 2.2 or 4.1 (Gmsh: Mesh.MshFileVersion = 2.2 or 4.1)");
      if (in.integer("the file type (0 for ASCII)", 0, 1) != 0)
        in.fail(version_line, "the file is binary; expected an ASCII file (Gmsh: Mesh.Binary = 0)");
      in.integer("the data size 8", 8, 8);
      in.keyword("$EndMeshFormat");
      return version == 4.1 ? Format::v41 : Format::v2;
    }

    /// $PhysicalNames is skipped token by token up to its end, as GridIn does (names may hold blanks).
    void skip_physical_names(MeshTokens &in)
    {
      const unsigned int start = in.line();
      in.keyword("$PhysicalNames");
      in.skip_to("$EndPhysicalNames", "the section '$PhysicalNames' of line " + std::to_string(start));
    }

    /// 4.1 $Entities: checked entry by entry (GridIn takes each entity's physical tag as its id).
    void read_entities(MeshTokens &in)
    {
      in.keyword("$Entities");
      std::array<long, 4> n;
      for (unsigned int d = 0; d < 4; ++d)
        n[d] = in.count(std::string("the number of ") + (d == 0 ? "points" : d == 1 ? "curves" : d == 2 ? "surfaces"
                                                                                                       : "volumes"),
                        d == 0 ? 5 : 9);
      for (unsigned int d = 0; d < 4; ++d)
        for (long e = 0; e < n[d]; ++e)
          {
            const long tag = in.integer("an entity tag", -max_tag, max_tag);
            for (unsigned int k = 0; k < (d == 0 ? 3u : 6u); ++k)
              in.real(d == 0 ? "a point coordinate" : "a bounding box coordinate");
            const unsigned int line        = in.line();
            const long         n_physicals = in.integer("the number of physical tags", 0, max_tag);
            if (n_physicals > 1)
              in.fail(line, "entity " + std::to_string(tag) + " has " + std::to_string(n_physicals) +
                              " physical tags; expected at most one (it becomes the boundary id)");
            if (n_physicals == 1)
              in.integer("a physical tag (a non-negative integer)", 0, max_tag);
            if (d > 0)
              {
                const long n_bounding = in.count("the number of bounding entities", 1);
                for (long b = 0; b < n_bounding; ++b)
                  in.integer("a bounding entity tag", -max_tag, max_tag);
              }
          }
      in.keyword("$EndEntities");
    }

    void read_node(MeshTokens &in, MeshContent &mesh, const long tag, const unsigned int line)
    {
      const double x = in.real("the x coordinate of a node");
      const double y = in.real("the y coordinate of a node");
      in.real("the z coordinate of a node");
      if (!mesh.nodes.emplace(tag, std::array<double, 2>{{x, y}}).second)
        in.fail(line, "node " + std::to_string(tag) + " is defined a second time");
    }

    void read_nodes(MeshTokens &in, const Format format, MeshContent &mesh)
    {
      in.keyword("$Nodes");
      if (format == Format::v2)
        {
          const long n = in.count("the number of nodes", 4);
          for (long k = 0; k < n; ++k)
            {
              const unsigned int line = in.line();
              read_node(in, mesh, in.integer("a node tag", 1, max_tag), line);
            }
        }
      else
        {
          const long n_blocks = in.count("the number of node blocks", 4);
          const long n_nodes  = in.count("the number of nodes", 4);
          in.integer("the smallest node tag", 0, max_tag);
          in.integer("the largest node tag", 0, max_tag);
          long read = 0;
          for (long b = 0; b < n_blocks; ++b)
            {
              in.integer("the dimension of an entity", 0, 3);
              in.integer("an entity tag", -max_tag, max_tag);
              const unsigned int line = in.line();
              if (in.integer("the parametric flag", 0, 1) != 0)
                in.fail(line, "the nodes carry parametric coordinates; expected a mesh saved without them "
                              "(Gmsh: Mesh.SaveParametric = 0)");
              const long in_block = in.count("the number of nodes in the block", 4);
              if (read + in_block > n_nodes)
                in.fail(line, "the node blocks hold more nodes than the " + std::to_string(n_nodes) +
                                " announced in the $Nodes header");
              // 4.1 lists the block's node tags first, then their coordinates.
              std::vector<std::pair<long, unsigned int>> tags; // (tag, line)
              for (long k = 0; k < in_block; ++k)
                {
                  const unsigned int tag_line = in.line();
                  tags.emplace_back(in.integer("a node tag", 1, max_tag), tag_line);
                }
              for (const auto &[tag, tag_line] : tags)
                read_node(in, mesh, tag, tag_line);
              read += in_block;
            }
          if (read != n_nodes)
            in.fail(in.line(), "the node blocks hold " + std::to_string(read) + " nodes, but the $Nodes header "
                               "announces " + std::to_string(n_nodes));
        }
      in.keyword("$EndNodes");
    }

    /// Number of nodes of an element type nappe accepts; fails for every other type.
    unsigned int nodes_of_type(MeshTokens &in, const long type, const unsigned int line)
    {
      switch (type)
        {
          case 1:
            return 2; // boundary line
          case 3:
            return 4; // quadrilateral
          case 15:
            return 1; // point
          case 2:
            in.fail(line, "the mesh contains triangles (element type 2); nappe's elements need an "
                          "all-quadrilateral mesh (Gmsh: Recombine Surface, Mesh.SubdivisionAlgorithm = 1)");
          default:
            in.fail(line, "element type " + std::to_string(type) + " is not supported; expected first-order "
                          "quadrilaterals (type 3), boundary lines (type 1) and points (type 15)");
        }
    }

    void read_element_nodes(MeshTokens &in, MeshContent &mesh, const long type, const unsigned int line)
    {
      const unsigned int  n = nodes_of_type(in, type, line);
      std::array<long, 4> nodes{};
      for (unsigned int k = 0; k < n; ++k)
        {
          nodes[k] = in.integer("a node tag of the element", 1, max_tag);
          if (mesh.nodes.count(nodes[k]) == 0)
            in.fail(line, "the element refers to node " + std::to_string(nodes[k]) + ", which $Nodes does not "
                          "define");
        }
      if (type == 3)
        mesh.quads.push_back({nodes, line});
      else if (type == 1)
        mesh.lines.push_back({{{nodes[0], nodes[1]}}, line});
    }

    void read_elements(MeshTokens &in, const Format format, MeshContent &mesh)
    {
      in.keyword("$Elements");
      if (format == Format::v2)
        {
          const long n = in.count("the number of elements", 4);
          for (long k = 0; k < n; ++k)
            {
              const unsigned int line = in.line();
              in.integer("an element number", 0, max_tag);
              const long type   = in.integer("an element type", 0, max_tag);
              const long n_tags = in.count("the number of element tags", 1);
              for (long t = 0; t < n_tags; ++t)
                in.integer(t == 0 ? "the physical tag (a non-negative integer)" : "an element tag (non-negative)",
                           0, max_tag);
              read_element_nodes(in, mesh, type, line);
            }
        }
      else
        {
          const long n_blocks   = in.count("the number of element blocks", 4);
          const long n_elements = in.count("the number of elements", 2);
          in.integer("the smallest element tag", 0, max_tag);
          in.integer("the largest element tag", 0, max_tag);
          long read = 0;
          for (long b = 0; b < n_blocks; ++b)
            {
              const unsigned int line = in.line();
              in.integer("the dimension of an entity", 0, 3);
              in.integer("an entity tag", -max_tag, max_tag);
              const long type     = in.integer("an element type", 0, max_tag);
              const long in_block = in.count("the number of elements in the block", 2);
              if (read + in_block > n_elements)
                in.fail(line, "the element blocks hold more elements than the " + std::to_string(n_elements) +
                                " announced in the $Elements header");
              nodes_of_type(in, type, line);
              for (long k = 0; k < in_block; ++k)
                {
                  const unsigned int element_line = in.line();
                  in.integer("an element tag", 1, max_tag);
                  read_element_nodes(in, mesh, type, element_line);
                }
              read += in_block;
            }
          if (read != n_elements)
            in.fail(in.line(), "the element blocks hold " + std::to_string(read) + " elements, but the $Elements "
                               "header announces " + std::to_string(n_elements));
        }
      in.keyword("$EndElements");
    }

    void check_geometry(const MeshTokens &in, const MeshContent &mesh)
    {
      if (mesh.quads.empty())
        in.fail(in.line(), "the mesh has no quadrilaterals (element type 3); expected a quadrilateral mesh");
      std::map<std::pair<long, long>, unsigned int> edge_cells;
      std::set<std::array<long, 4>>                 seen;
      for (const Quad &q : mesh.quads)
        {
          std::array<long, 4> sorted = q.nodes;
          std::sort(sorted.begin(), sorted.end());
          if (std::adjacent_find(sorted.begin(), sorted.end()) != sorted.end())
            in.fail(q.line, "the quadrilateral lists a node twice; expected four different nodes");
          if (!seen.insert(sorted).second)
            in.fail(q.line, "the quadrilateral on nodes " + std::to_string(q.nodes[0]) + ", " +
                              std::to_string(q.nodes[1]) + ", " + std::to_string(q.nodes[2]) + ", " +
                              std::to_string(q.nodes[3]) + " appears a second time");
          // Strictly convex in one sense of rotation: the four corner cross products share their sign
          // and none is negligible against the cell's size (a degenerate or bow-tie cell has no valid
          // bilinear map).
          std::array<std::array<double, 2>, 4> p;
          double                               scale = 0.0;
          for (unsigned int k = 0; k < 4; ++k)
            p[k] = mesh.nodes.at(q.nodes[k]);
          for (unsigned int k = 0; k < 4; ++k)
            scale = std::max({scale, std::abs(p[k][0] - p[0][0]), std::abs(p[k][1] - p[0][1])});
          unsigned int positive = 0, negative = 0;
          for (unsigned int k = 0; k < 4; ++k)
            {
              const auto  &a = p[k], &b = p[(k + 1) % 4], &c = p[(k + 2) % 4];
              const double cross = (b[0] - a[0]) * (c[1] - b[1]) - (b[1] - a[1]) * (c[0] - b[0]);
              positive += cross > 1e-10 * scale * scale;
              negative += cross < -1e-10 * scale * scale;
            }
          if (!(std::isfinite(scale) && scale > 0.0 && (positive == 4 || negative == 4)))
            in.fail(q.line, "the quadrilateral is degenerate or not convex; expected its four nodes in order "
                            "around a convex cell");
          for (unsigned int k = 0; k < 4; ++k)
            ++edge_cells[std::minmax(q.nodes[k], q.nodes[(k + 1) % 4])];
        }
      for (const auto &[edge, n] : edge_cells)
        if (n > 2)
          in.fail(mesh.quads.front().line, "the edge between nodes " + std::to_string(edge.first) + " and " +
                                             std::to_string(edge.second) + " belongs to " + std::to_string(n) +
                                             " quadrilaterals; expected at most two");
      for (const Line &l : mesh.lines)
        {
          const auto edge = std::minmax(l.nodes[0], l.nodes[1]);
          const auto it   = edge_cells.find(edge);
          if (it == edge_cells.end())
            in.fail(l.line, "the boundary line from node " + std::to_string(l.nodes[0]) + " to node " +
                              std::to_string(l.nodes[1]) + " is not an edge of any quadrilateral");
          if (it->second != 1)
            in.fail(l.line, "the boundary line from node " + std::to_string(l.nodes[0]) + " to node " +
                              std::to_string(l.nodes[1]) + " lies between two quadrilaterals; expected boundary "
                              "lines on the mesh boundary only");
        }
    }
  } // namespace


  void check_gmsh_file(const std::string &filename)
  {
    MeshTokens   in(filename);
    const Format format = read_header(in);
    if (!in.at_end() && in.peek() == "$PhysicalNames")
      skip_physical_names(in);
    if (!in.at_end() && in.peek() == "$Entities")
      {
        if (format != Format::v41)
          in.fail(in.line(), "'$Entities' belongs to format 4.1, but the file declares version 2.2");
        read_entities(in);
      }
    if (!in.at_end() && in.peek() != "$Nodes")
      in.fail_expected("'$Nodes' (after $MeshFormat and the optional $PhysicalNames" +
                       std::string(format == Format::v41 ? " and $Entities)" : ")"));
    MeshContent mesh;
    read_nodes(in, format, mesh);
    read_elements(in, format, mesh);
    check_geometry(in, mesh);
  }
} // namespace nappe

#include <deal.II/base/exceptions.h>

#include <nappe/base/units.h>
#include <nappe/io/atomic_file.h>
#include <nappe/io/atomistic_writers.h>

#include <cmath>
#include <cstdio>
#include <ostream>

namespace nappe
{
  using namespace dealii;

  namespace
  {
    constexpr double angstrom = units::angstrom;
    constexpr double degree   = 3.14159265358979323846 / 180.0;

    /// printf into a string (the writers format up to 10⁶ lines; streams are slower by a large factor).
    template <typename... Args>
    void append(std::string &out, const char *format, Args... args)
    {
      char buffer[128];
      const int n = std::snprintf(buffer, sizeof buffer, format, args...);
      out.append(buffer, std::min<std::size_t>(n, sizeof buffer - 1));
    }

    /// The map from Cartesian to fractional coordinates: the inverse of [v₁ v₂ v₃] (columns).
    Tensor<2, 3> to_fractional(const std::array<Tensor<1, 3>, 3> &cell)
    {
      Tensor<2, 3> m;
      for (unsigned int r = 0; r < 3; ++r)
        for (unsigned int c = 0; c < 3; ++c)
          m[r][c] = cell[c][r];
      return invert(m);
    }
  } // namespace

  void write_extended_xyz(const std::string &path, const AtomTable &atoms)
  {
    write_atomically(path, [&](std::ostream &out) {
      std::string text;
      text.reserve(atoms.size() * (48 + 16 * atoms.n_columns()) + 1024);
      append(text, "%zu\n", atoms.size());
      text += "Lattice=\"";
      for (unsigned int v = 0; v < 3; ++v)
        for (unsigned int c = 0; c < 3; ++c)
          append(text, v + c == 0 ? "%.10g" : " %.10g", atoms.cell[v][c] / angstrom);
      text += "\" Properties=species:S:1:pos:R:3";
      for (const auto &name : atoms.column_names)
        text += ":" + name + ":R:1";
      text += " pbc=\"";
      for (unsigned int c = 0; c < 3; ++c)
        text += std::string(c == 0 ? "" : " ") + (atoms.pbc[c] ? "T" : "F");
      text += "\"";
      for (const auto &[key, value] : atoms.info)
        text += " " + key + "=\"" + value + "\"";
      text += "\n";
      for (std::size_t a = 0; a < atoms.size(); ++a)
        {
          text += atoms.species_names[atoms.species[a]];
          const Point<3> &x = atoms.positions[a];
          append(text, " %.8f %.8f %.8f", x[0] / angstrom, x[1] / angstrom, x[2] / angstrom);
          for (std::size_t k = 0; k < atoms.n_columns(); ++k)
            append(text, " %.8g", atoms.columns[a * atoms.n_columns() + k] + 0.0); // + 0.0: no "-0"
          text += "\n";
          if (text.size() > (1u << 24))
            out << text, text.clear();
        }
      out << text;
    });
  }

  void write_cif(const std::string &path, const AtomTable &atoms, const std::string &title)
  {
    const auto &v = atoms.cell;
    const double a = v[0].norm(), b = v[1].norm(), c = v[2].norm();
    AssertThrow(a > 0 && b > 0 && c > 0, ExcMessage("write_cif: the cell of <" + path + "> is degenerate."));
    const double alpha = std::acos(v[1] * v[2] / (b * c)) / degree, beta = std::acos(v[0] * v[2] / (a * c)) / degree,
                 gamma = std::acos(v[0] * v[1] / (a * b)) / degree;
    const Tensor<2, 3> fractional = to_fractional(v);
    write_atomically(path, [&](std::ostream &out) {
      std::string text;
      text.reserve(atoms.size() * 64 + 1024);
      text += "# " + title + "\n";
      text += "data_nappe_strained_monolayer\n";
      text += "_symmetry_space_group_name_H-M 'P 1'\n_symmetry_Int_Tables_number 1\n";
      append(text, "_cell_length_a %.8f\n_cell_length_b %.8f\n_cell_length_c %.8f\n", a / angstrom, b / angstrom,
             c / angstrom);
      append(text, "_cell_angle_alpha %.8f\n_cell_angle_beta %.8f\n_cell_angle_gamma %.8f\n", alpha, beta, gamma);
      text += "loop_\n_symmetry_equiv_pos_as_xyz\n'x, y, z'\n";
      text += "loop_\n_atom_site_label\n_atom_site_type_symbol\n_atom_site_fract_x\n_atom_site_fract_y\n"
              "_atom_site_fract_z\n";
      for (std::size_t i = 0; i < atoms.size(); ++i)
        {
          const std::string &symbol = atoms.species_names[atoms.species[i]];
          const Tensor<1, 3> f      = fractional * Tensor<1, 3>(atoms.positions[i]);
          append(text, "%s%zu %s %.10f %.10f %.10f\n", symbol.c_str(), i + 1, symbol.c_str(), f[0], f[1], f[2]);
          if (text.size() > (1u << 24))
            out << text, text.clear();
        }
      out << text;
    });
  }
} // namespace nappe

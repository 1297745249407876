#include <deal.II/base/exceptions.h>
#include <deal.II/base/parameter_handler.h>
#include <deal.II/base/utilities.h>

#include <nappe/base/units.h>
#include <nappe/physics/material_catalogue.h>

#include <algorithm>
#include <cctype>
#include <cstdlib>
#include <fstream>
#include <iomanip>
#include <mutex>
#include <optional>
#include <ostream>
#include <sstream>

#ifndef NAPPE_DATA_DIR
#  error "NAPPE_DATA_DIR must be defined by the build system (the directory holding materials.prm)."
#endif

namespace nappe
{
  namespace
  {
    const char *const materials_section  = "Materials";
    const char *const interfaces_section = "Interfaces";

    std::string lower(std::string s)
    {
      std::transform(s.begin(), s.end(), s.begin(), [](unsigned char c) { return std::tolower(c); });
      return s;
    }

    std::string trim(const std::string &s)
    {
      const auto first = s.find_first_not_of(" \t\r");
      if (first == std::string::npos)
        return "";
      const auto last = s.find_last_not_of(" \t\r");
      return s.substr(first, last - first + 1);
    }

    std::string joined(const std::vector<std::string> &names)
    {
      std::string out;
      for (const auto &n : names)
        out += (out.empty() ? "" : ", ") + n;
      return out.empty() ? "(none)" : out;
    }

    // The catalogue writes 0 for a value no source gives: print it as unknown, never as a number.
    std::string value_or_unknown(double value)
    {
      std::ostringstream text;
      text << std::setprecision(4) << value;
      return value == 0.0 ? "unknown" : text.str();
    }

    /**
     * The names of the subsections nested directly in "Materials" and in "Interfaces", found by
     * a lexical scan (ParameterHandler needs every entry declared before it parses a file).
     */
    void scan_subsections(const std::string &text, std::vector<std::string> &material_sections,
                          std::vector<std::string> &interface_sections)
    {
      std::istringstream       in(text);
      std::string              line;
      std::vector<std::string> path;
      while (std::getline(in, line))
        {
          const auto hash = line.find('#');
          line            = trim(line.substr(0, hash));
          if (line.rfind("subsection", 0) == 0 && line.size() > 10 && std::isspace((unsigned char)line[10]))
            {
              path.push_back(trim(line.substr(10)));
              if (path.size() == 2 && path[0] == materials_section)
                material_sections.push_back(path[1]);
              else if (path.size() == 2 && path[0] == interfaces_section)
                interface_sections.push_back(path[1]);
            }
          else if (line == "end" && !path.empty())
            path.pop_back();
        }
    }

    void declare_lattice(dealii::ParameterHandler &prm)
    {
      prm.enter_subsection("Lattice");
      prm.declare_entry("Type", "none",
                        dealii::Patterns::Selection("none|honeycomb|binary honeycomb|1H dichalcogenide"),
                        "Crystal lattice: none, honeycomb (2 identical atoms), binary honeycomb (hBN), "
                        "1H dichalcogenide (metal between two chalcogen planes).");
      prm.declare_entry("Species", "", dealii::Patterns::Anything(),
                        "Chemical symbols on sublattice A and B, e.g. 'Mo, S' (the metal first).");
      prm.declare_entry("Lattice constant", "0", dealii::Patterns::Double(0.0),
                        "In-plane lattice constant a = |a1|. Unit: angstrom.");
      prm.declare_entry("Chalcogen height", "0", dealii::Patterns::Double(0.0),
                        "1H dichalcogenide: height of each chalcogen plane above/below the metal plane. Unit: angstrom.");
      prm.leave_subsection();
    }

    void declare_coefficient(dealii::ParameterHandler &prm, const std::string &name, const std::string &doc)
    {
      prm.declare_entry(name, "0", dealii::Patterns::Double(), doc);
      prm.declare_entry(name + " kind", "", dealii::Patterns::Anything(),
                        "What the value is: measured or computed, which quantity, which strain state.");
      prm.declare_entry(name + " source", "", dealii::Patterns::Anything(),
                        "Authors, journal, volume, page, year, and whether the number was checked.");
    }

    void declare_electronic(dealii::ParameterHandler &prm)
    {
      prm.enter_subsection("Electronic");
      prm.declare_entry("Hopping decay beta", "0", dealii::Patterns::Double(0.0),
                        "beta = -dln t/dln d of the nearest-neighbour hopping of a honeycomb lattice; 0 = unknown. "
                        "Dimensionless.");
      prm.declare_entry("Hopping decay beta source", "", dealii::Patterns::Anything(), "Source of beta.");
      prm.declare_entry("Deformation potential", "0", dealii::Patterns::Double(),
                        "Scalar deformation potential g in V = g tr(strain); 0 = unknown. Unit: eV.");
      prm.declare_entry("Deformation potential source", "", dealii::Patterns::Anything(), "Source of g.");
      declare_coefficient(prm, "Biaxial gap coefficient",
                          "Optical gap change per % of equibiaxial strain; 0 = unknown. Unit: meV/%.");
      declare_coefficient(prm, "Uniaxial gap coefficient",
                          "Optical gap change per % of uniaxial strain; 0 = unknown. Unit: meV/%.");
      prm.leave_subsection();
    }

    void declare_material(dealii::ParameterHandler &prm)
    {
      prm.declare_entry("2D Young modulus", "0", dealii::Patterns::Double(0.0),
                        "2D Young's modulus Y = E*t of the sheet. Unit: N/m.");
      prm.declare_entry("Poisson ratio", "0", dealii::Patterns::Double(-1.0, 1.0),
                        "Poisson's ratio of the sheet. Dimensionless, -1 < nu < 1.");
      prm.declare_entry("Bending rigidity", "0", dealii::Patterns::Double(0.0),
                        "Bending rigidity D of the sheet. Unit: eV.");
      prm.declare_entry("Nominal thickness", "0", dealii::Patterns::Double(0.0),
                        "Nominal thickness, used only to report bulk-equivalent stresses. Unit: nm.");
      prm.declare_entry("Fracture strain", "0", dealii::Patterns::Double(0.0, 1.0),
                        "Strain at which the sheet is expected to fracture; 0 means unknown. Dimensionless.");
      declare_lattice(prm);
      declare_electronic(prm);
    }

    void declare_interface(dealii::ParameterHandler &prm)
    {
      prm.declare_entry("Sheet", "", dealii::Patterns::Anything(),
                        "Name of the sheet material (a subsection of 'Materials').");
      prm.declare_entry("Substrate", "", dealii::Patterns::Anything(), "Name of the substrate.");
      prm.declare_entry("Work of adhesion", "0", dealii::Patterns::Double(0.0),
                        "Work of adhesion of the sheet on the substrate. Unit: J/m^2.");
    }

    /// Reads a positive entry and names the material, the entry and the unit if it is not positive.
    double positive(const dealii::ParameterHandler &prm, const std::string &where, const std::string &entry,
                    const std::string &unit)
    {
      const double value = prm.get_double(entry);
      AssertThrow(value > 0.0, dealii::ExcMessage(where + "/" + entry + ": expected a positive value in " + unit +
                                                  ", found " + prm.get(entry) + " (missing from the file?)."));
      return value;
    }
    MonolayerLattice parse_lattice(dealii::ParameterHandler &prm, const std::string &where)
    {
      prm.enter_subsection("Lattice");
      MonolayerLattice l;
      l.type = parse_lattice_type(prm.get("Type"));
      if (l.defined())
        {
          const auto species = dealii::Utilities::split_string_list(prm.get("Species"));
          AssertThrow(species.size() == 2 && !species[0].empty() && !species[1].empty(),
                      dealii::ExcMessage(where + "/Lattice/Species: expected two chemical symbols 'A, B', found '" +
                                         prm.get("Species") + "'."));
          l.species_a        = species[0];
          l.species_b        = species[1];
          l.lattice_constant = positive(prm, where + "/Lattice", "Lattice constant", "angstrom") * units::angstrom;
          if (l.type == LatticeType::trigonal_prismatic)
            l.chalcogen_height = positive(prm, where + "/Lattice", "Chalcogen height", "angstrom") * units::angstrom;
        }
      prm.leave_subsection();
      return l;
    }

    /// A value that is 0 (unknown) or comes with its source (and kind, if @p needs_kind).
    void require_source(dealii::ParameterHandler &prm, const std::string &where, const std::string &entry,
                        bool needs_kind)
    {
      if (prm.get_double(entry) == 0.0)
        return;
      for (const std::string &suffix : {std::string(" source"), needs_kind ? std::string(" kind") : std::string()})
        if (!suffix.empty())
          AssertThrow(!trim(prm.get(entry + suffix)).empty(),
                      dealii::ExcMessage(where + "/" + entry + suffix + ": a non-zero " + entry +
                                         " needs its" + suffix + " (published values only)."));
    }

    GapStrainCoefficient parse_coefficient(dealii::ParameterHandler &prm, const std::string &where,
                                           const std::string &name)
    {
      require_source(prm, where, name, true);
      GapStrainCoefficient c;
      c.value  = prm.get_double(name) * units::mev_per_percent;
      c.kind   = trim(prm.get(name + " kind"));
      c.source = trim(prm.get(name + " source"));
      return c;
    }

    ElectronicCoupling parse_electronic(dealii::ParameterHandler &prm, const std::string &where_material)
    {
      const std::string where = where_material + "/Electronic";
      prm.enter_subsection("Electronic");
      ElectronicCoupling e;
      require_source(prm, where, "Hopping decay beta", false);
      require_source(prm, where, "Deformation potential", false);
      e.hopping_decay                = prm.get_double("Hopping decay beta");
      e.hopping_decay_source         = trim(prm.get("Hopping decay beta source"));
      e.deformation_potential        = prm.get_double("Deformation potential") * units::electronvolt;
      e.deformation_potential_source = trim(prm.get("Deformation potential source"));
      e.biaxial_gap                  = parse_coefficient(prm, where, "Biaxial gap coefficient");
      e.uniaxial_gap                 = parse_coefficient(prm, where, "Uniaxial gap coefficient");
      prm.leave_subsection();
      return e;
    }
  } // namespace

  std::string MaterialCatalogue::default_path()
  {
    // The environment wins; then the installed copy; then the source tree (build-tree use).
    const char *env = std::getenv("NAPPE_DATA_DIR");
    if (env != nullptr && *env != '\0')
      return std::string(env) + "/materials.prm";
    const std::string installed = std::string(NAPPE_INSTALLED_DATA_DIR) + "/materials.prm";
    if (std::ifstream(installed).good())
      return installed;
    return std::string(NAPPE_DATA_DIR) + "/materials.prm";
  }

  MaterialCatalogue::MaterialCatalogue()
    : MaterialCatalogue(default_path())
  {}

  MaterialCatalogue::MaterialCatalogue(const std::string &path)
    : MaterialCatalogue(loaded(path))
  {}

  MaterialCatalogue MaterialCatalogue::loaded(const std::string &path)
  {
    std::ifstream file(path);
    AssertThrow(file.good(), dealii::ExcMessage("MaterialCatalogue: cannot open the catalogue file <" + path +
                                                "> for reading. Pass an explicit path or set the "
                                                "environment variable NAPPE_DATA_DIR to the directory "
                                                "holding materials.prm."));
    const std::string text((std::istreambuf_iterator<char>(file)), std::istreambuf_iterator<char>());
    // Reading declares every entry of every material (milliseconds), and a sweep reads one case per
    // point: the last catalogue read is kept, and used again while its file's text is the same.
    static std::mutex                       mutex;
    static std::string                      last_path, last_text;
    static std::optional<MaterialCatalogue> last;
    const std::lock_guard<std::mutex>       lock(mutex);
    if (!last || path != last_path || text != last_text)
      {
        last      = MaterialCatalogue(path, text);
        last_path = path;
        last_text = text;
      }
    return *last;
  }

  MaterialCatalogue::MaterialCatalogue(const std::string &path, const std::string &text)
    : file_path(path)
  {
    std::vector<std::string> material_sections, interface_sections;
    scan_subsections(text, material_sections, interface_sections);
    AssertThrow(!material_sections.empty(),
                dealii::ExcMessage("MaterialCatalogue: the file <" + path +
                                   "> lists no material (expected subsections inside 'subsection Materials')."));

    dealii::ParameterHandler prm;
    prm.enter_subsection(materials_section);
    for (const auto &name : material_sections)
      {
        prm.enter_subsection(name);
        declare_material(prm);
        prm.leave_subsection();
      }
    prm.leave_subsection();
    prm.enter_subsection(interfaces_section);
    for (const auto &name : interface_sections)
      {
        prm.enter_subsection(name);
        declare_interface(prm);
        prm.leave_subsection();
      }
    prm.leave_subsection();

    std::istringstream in(text);
    prm.parse_input(in, path);

    prm.enter_subsection(materials_section);
    for (const auto &name : material_sections)
      {
        AssertThrow(!has_material(name), dealii::ExcMessage("MaterialCatalogue <" + path + ">: material <" + name +
                                                            "> is listed twice (names are case-insensitive)."));
        const std::string where = "Materials/" + name;
        prm.enter_subsection(name);
        SheetMaterial m;
        m.name              = name;
        m.youngs_modulus_2d = positive(prm, where, "2D Young modulus", "N/m") * units::newton_per_m;
        m.poisson_ratio     = prm.get_double("Poisson ratio");
        AssertThrow(m.poisson_ratio > -1.0 && m.poisson_ratio < 1.0,
                    dealii::ExcMessage(where + "/Poisson ratio: expected a value strictly between -1 and 1, found " +
                                       prm.get("Poisson ratio") + "."));
        m.bending_rigidity  = positive(prm, where, "Bending rigidity", "eV") * units::electronvolt;
        m.nominal_thickness = positive(prm, where, "Nominal thickness", "nm") * units::nanometer;
        m.fracture_strain   = prm.get_double("Fracture strain");
        AssertThrow(m.fracture_strain >= 0.0 && m.fracture_strain < 1.0,
                    dealii::ExcMessage(where + "/Fracture strain: expected 0 (unknown) or a strain in (0, 1), found " +
                                       prm.get("Fracture strain") + "."));
        m.lattice    = parse_lattice(prm, where);
        m.electronic = parse_electronic(prm, where);
        AssertThrow(m.electronic.hopping_decay == 0.0 || m.lattice.type == LatticeType::honeycomb ||
                      m.lattice.type == LatticeType::binary_honeycomb,
                    dealii::ExcMessage(where + "/Electronic/Hopping decay beta: defined only for a honeycomb "
                                               "lattice (Lattice/Type = honeycomb or binary honeycomb)."));
        prm.leave_subsection();
        materials.push_back(m);
      }
    prm.leave_subsection();

    prm.enter_subsection(interfaces_section);
    for (const auto &name : interface_sections)
      {
        const std::string where = "Interfaces/" + name;
        prm.enter_subsection(name);
        Interface i;
        i.sheet     = trim(prm.get("Sheet"));
        i.substrate = trim(prm.get("Substrate"));
        AssertThrow(has_material(i.sheet),
                    dealii::ExcMessage(where + "/Sheet: expected one of the listed materials (" +
                                       joined(material_names()) + "), found <" + i.sheet + ">."));
        i.sheet = material(i.sheet).name; // canonical spelling
        AssertThrow(!i.substrate.empty(),
                    dealii::ExcMessage(where + "/Substrate: expected a substrate name, found an empty value."));
        AssertThrow(!has_interface(i.sheet, i.substrate),
                    dealii::ExcMessage("MaterialCatalogue <" + path + ">: interface " + i.sheet + " on " +
                                       i.substrate + " is listed twice."));
        i.work_of_adhesion = positive(prm, where, "Work of adhesion", "J/m^2") * units::joule_per_m2;
        prm.leave_subsection();
        interface_list.push_back(i);
      }
    prm.leave_subsection();
  }

  bool MaterialCatalogue::has_material(const std::string &name) const
  {
    const std::string key = lower(trim(name));
    return std::any_of(materials.begin(), materials.end(),
                       [&](const SheetMaterial &m) { return lower(m.name) == key; });
  }

  const SheetMaterial &MaterialCatalogue::material(const std::string &name) const
  {
    const std::string key = lower(trim(name));
    for (const auto &m : materials)
      if (lower(m.name) == key)
        return m;
    AssertThrow(false, dealii::ExcMessage("MaterialCatalogue: unknown material <" + name + ">. Known materials (" +
                                          file_path + "): " + joined(material_names()) + "."));
    return materials.front(); // not reached
  }

  std::vector<std::string> MaterialCatalogue::material_names() const
  {
    std::vector<std::string> names;
    for (const auto &m : materials)
      names.push_back(m.name);
    return names;
  }

  bool MaterialCatalogue::has_interface(const std::string &sheet, const std::string &substrate) const
  {
    const std::string s = lower(trim(sheet)), t = lower(trim(substrate));
    return std::any_of(interface_list.begin(), interface_list.end(), [&](const Interface &i) {
      return lower(i.sheet) == s && lower(i.substrate) == t;
    });
  }

  std::vector<std::string> MaterialCatalogue::substrate_names(const std::string &sheet) const
  {
    const std::string canonical = material(sheet).name; // throws for an unknown sheet
    std::vector<std::string> names;
    for (const auto &i : interface_list)
      if (i.sheet == canonical)
        names.push_back(i.substrate);
    return names;
  }

  double MaterialCatalogue::work_of_adhesion(const std::string &sheet, const std::string &substrate) const
  {
    const std::string s = lower(trim(sheet)), t = lower(trim(substrate));
    for (const auto &i : interface_list)
      if (lower(i.sheet) == s && lower(i.substrate) == t)
        return i.work_of_adhesion;
    const std::vector<std::string> known = substrate_names(sheet); // throws, listing materials, if sheet is unknown
    AssertThrow(false, dealii::ExcMessage("MaterialCatalogue: no work of adhesion listed for " + sheet + " on <" +
                                          substrate + ">. Substrates listed for " + sheet + ": " + joined(known) +
                                          ". Give the value explicitly (subsection Adhesion) instead."));
    return 0.0; // not reached
  }

  void MaterialCatalogue::print(std::ostream &out) const
  {
    const auto flags     = out.flags();
    const auto precision = out.precision();
    out << "Sheet materials (" << file_path << ")\n";
    out << std::left << std::setw(12) << "name" << std::right << std::setw(12) << "Y [N/m]" << std::setw(8)
        << "nu [-]" << std::setw(10) << "D [eV]" << std::setw(10) << "t [nm]" << std::setw(16)
        << "fracture strain" << '\n';
    out << std::setprecision(4);
    for (const auto &m : materials)
      {
        out << std::left << std::setw(12) << m.name << std::right << std::setw(12) << m.youngs_modulus_2d
            << std::setw(8) << m.poisson_ratio << std::setw(10) << m.bending_rigidity / units::electronvolt
            << std::setw(10) << m.nominal_thickness / units::nanometer << std::setw(16)
            << value_or_unknown(m.fracture_strain) << '\n';
      }
    out << "\nLattices and electron-strain coupling (sources in the catalogue file)\n";
    out << std::left << std::setw(12) << "name" << std::setw(19) << "lattice" << std::right << std::setw(8) << "a [A]"
        << std::setw(10) << "beta [-]" << std::setw(9) << "g [eV]" << std::setw(22) << "biaxial gap [meV/%]"
        << std::setw(23) << "uniaxial gap [meV/%]" << '\n';
    for (const auto &m : materials)
      out << std::left << std::setw(12) << m.name << std::setw(19) << lattice_type_name(m.lattice.type) << std::right
          << std::setw(8) << m.lattice.lattice_constant / units::angstrom << std::setw(10)
          << value_or_unknown(m.electronic.hopping_decay) << std::setw(9)
          << value_or_unknown(m.electronic.deformation_potential / units::electronvolt) << std::setw(22)
          << value_or_unknown(m.electronic.biaxial_gap.value / units::mev_per_percent) << std::setw(23)
          << value_or_unknown(m.electronic.uniaxial_gap.value / units::mev_per_percent) << '\n';
    out << "\nInterfaces\n";
    out << std::left << std::setw(12) << "sheet" << std::setw(12) << "substrate" << std::right << std::setw(16)
        << "Gamma [J/m^2]" << std::setw(18) << "Gamma [meV/A^2]" << '\n';
    for (const auto &i : interface_list)
      out << std::left << std::setw(12) << i.sheet << std::setw(12) << i.substrate << std::right << std::setw(16)
          << i.work_of_adhesion << std::setw(18) << i.work_of_adhesion / units::mev_per_angstrom2 << '\n';
    out.flags(flags);
    out.precision(precision);
  }
} // namespace nappe

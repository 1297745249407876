#pragma once

#include <nappe/physics/sheet_material.h>

#include <iosfwd>
#include <string>
#include <vector>

namespace nappe
{
  /**
   * The catalogue of sheet materials and sheet–substrate interfaces shipped with nappe
   * (share/materials.prm, a deal.II parameter file with a published source beside each value).
   *
   * File layout: subsection "Materials" holds one subsection per material (its name is the
   * material name) with the entries "2D Young modulus" [N/m], "Poisson ratio" [-],
   * "Bending rigidity" [eV], "Nominal thickness" [nm] and "Fracture strain" [-, 0 = unknown], and optionally
   * the subsections "Lattice" (Type, Species, "Lattice constant" [Å], "Chalcogen height" [Å]) and "Electronic"
   * ("Hopping decay beta" [-], "Deformation potential" [eV], "Biaxial/Uniaxial gap coefficient" [meV/%], each
   * non-zero value with its "… source" and, for gap coefficients, "… kind");
   * subsection "Interfaces" holds one subsection per pair with "Sheet", "Substrate" and
   * "Work of adhesion" [J/m²]. Values are converted to SI on loading and checked (Y > 0,
   * −1 < ν < 1, D > 0, t > 0, 0 ≤ fracture strain < 1, Γ > 0, every interface sheet listed).
   *
   * Name lookups are case-insensitive ("mos2" finds "MoS2"); unknown names throw an exception
   * whose message lists the known names. The object owns its data; it is immutable after loading.
   */
  class MaterialCatalogue
  {
  public:
    /// One listed (sheet, substrate) pair.
    struct Interface
    {
      std::string sheet;
      std::string substrate;
      /// Work of adhesion Γ [J/m²].
      double work_of_adhesion = 0.0;
    };

    /**
     * Path of the shipped catalogue: $NAPPE_DATA_DIR/materials.prm if the environment variable
     * NAPPE_DATA_DIR is set; otherwise the installed copy (<prefix>/share/nappe/materials.prm) if
     * it exists; otherwise the source tree's share/materials.prm (use from the build tree).
     */
    static std::string default_path();

    /// Loads default_path().
    MaterialCatalogue();

    /// Loads the catalogue at @p path. Throws if the file cannot be read, is malformed, or a value is out of range.
    explicit MaterialCatalogue(const std::string &path);

    /// The file this catalogue was loaded from.
    const std::string &path() const { return file_path; }

    /// Whether a material of this name is listed (case-insensitive).
    bool has_material(const std::string &name) const;

    /// The material @p name, in SI. Throws, listing the known names, if it is not listed.
    const SheetMaterial &material(const std::string &name) const;

    /// Names of the listed materials, in file order.
    std::vector<std::string> material_names() const;

    /// Whether a work of adhesion is listed for @p sheet on @p substrate (case-insensitive).
    bool has_interface(const std::string &sheet, const std::string &substrate) const;

    /**
     * Work of adhesion Γ [J/m²] of @p sheet on @p substrate. Throws if the pair is not listed;
     * the message lists the substrates known for that sheet (or the known sheets).
     */
    double work_of_adhesion(const std::string &sheet, const std::string &substrate) const;

    /// Substrates listed for @p sheet (empty if none), in file order. Throws if @p sheet is unknown.
    std::vector<std::string> substrate_names(const std::string &sheet) const;

    /// All listed interfaces, in file order.
    const std::vector<Interface> &interfaces() const { return interface_list; }

    /// Prints two tables (materials, interfaces) with units, e.g. for a driver's --list option.
    void print(std::ostream &out) const;

  private:
    /// Parses @p text, the contents of the catalogue file @p path.
    MaterialCatalogue(const std::string &path, const std::string &text);

    /// The catalogue in the file @p path (parsed again only when the file's text changed).
    static MaterialCatalogue loaded(const std::string &path);

    std::string                file_path;
    std::vector<SheetMaterial> materials;
    std::vector<Interface>     interface_list;
  };
} // namespace nappe

#pragma once

#include <iosfwd>
#include <string>
#include <vector>

namespace nappe
{
  /// One catalogue value with the source written beside it in share/materials.prm.
  struct CatalogueSource
  {
    std::string subject; ///< the material or interface subsection, e.g. "graphene" or "graphene on SiO2"
    std::string entry;   ///< e.g. "2D Young modulus"
    std::string value;   ///< as written in the file, in the file's units
    std::string source;  ///< the comment beside the value (authors, journal, year; "verified" or "from memory")
  };

  /**
   * The sources of the catalogue at @p path: every "set Entry = value # source" line inside a material or
   * interface subsection, in file order. Entries of a nested subsection of a material are named with its path
   * ("Lattice/Lattice constant"); their "<entry> source" and "<entry> kind" entries become the source of the
   * value they describe (kind in brackets). Names rather than values (Sheet, Substrate, Type, Species) are not
   * listed. The deal.II parameter reader drops comments, so they are read here from the text; entries without
   * a source are listed with an empty one. Throws naming the file if it cannot be read.
   */
  std::vector<CatalogueSource> read_catalogue_sources(const std::string &path);

  /// Prints the sources grouped by subject, one value per line ("  Entry = value: source").
  void print_catalogue_sources(const std::vector<CatalogueSource> &sources, std::ostream &out);
} // namespace nappe

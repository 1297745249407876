#pragma once
// Valid companion files for the fuzz targets that read a case file: written once into the scratch
// directory (the working directory of the target), so that seeds can name them by relative path and
// the fuzzer reaches the readers behind Domain/Mesh file, Topography/Height map/File and Topography/STL/File.
#include <fstream>
#include <string>

#include "fuzz_common.h"

namespace nappe::fuzz
{
  inline void write_companion_files()
  {
    std::filesystem::current_path(scratch_directory());
    std::ofstream("mesh.msh") << "$MeshFormat\n2.2 0 8\n$EndMeshFormat\n"
                                 "$Nodes\n4\n1 0 0 0\n2 1 0 0\n3 1 1 0\n4 0 1 0\n$EndNodes\n"
                                 "$Elements\n5\n1 1 2 0 1 4 1\n2 1 2 1 2 2 3\n3 1 2 2 3 1 2\n4 1 2 3 4 3 4\n"
                                 "5 3 2 7 1 1 2 3 4\n$EndElements\n";
    std::ofstream("map.txt") << "0 1 2 3\n1 2 3 4\n2 3 4 5\n3 4 5 6\n";
    std::ofstream("surface.stl") << "solid s\nfacet normal 0 0 1\nouter loop\nvertex -100 -100 0\nvertex 2000 -100 1\n"
                                    "vertex -100 2000 2\nendloop\nendfacet\nendsolid s\n";
    // The base case of the sweep target: a small clamped disk.
    std::ofstream("case.prm") << "subsection Domain\n  set Shape = disk\n  set Radius = 100\nend\n";
  }
} // namespace nappe::fuzz

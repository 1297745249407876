// A lab program linking the installed nappe package: prints the version it was built against.
#include <nappe/base/units.h>
#include <nappe/base/version.h>

#include <iostream>

int main()
{
  std::cout << "nappe " << nappe::version() << ", 1 meV/A^2 = " << nappe::units::mev_per_angstrom2
            << " J/m^2\n";
  return nappe::version().empty() ? 1 : 0;
}

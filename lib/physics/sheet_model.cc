#include <nappe/physics/adhesion_potential.h>
#include <nappe/physics/sheet_model.h>

namespace nappe
{
  const AdhesionPotential *SheetModel::adhesion() const
  {
    return dynamic_cast<const AdhesionPotential *>(substrate.get());
  }
} // namespace nappe

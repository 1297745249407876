#include <deal.II/base/exceptions.h>
#include <deal.II/base/utilities.h>

#include <nappe/base/units.h>
#include <nappe/physics/adhesion_law_factory.h>
#include <nappe/physics/material_catalogue.h>
#include <nappe/physics/exponential_cohesive_law.h>
#include <nappe/physics/vdw_93_law.h>

#include <cmath>
#include <iomanip>
#include <sstream>

namespace nappe
{
  namespace
  {
    const char *const subsection_name   = "Adhesion";
    const char *const unit_j_per_m2     = "J/m^2";
    const char *const unit_mj_per_m2    = "mJ/m^2";
    const char *const unit_mev_per_ang2 = "meV/A^2";
    const char *const from_catalogue    = "from catalogue";
    /// The works of adhesion any adhesion model may be given (our bounds: van der Waals adhesion of
    /// 2D sheets is 0.01–1 J/m², and nothing sticks with more than tens of J/m²) [J/m²].
    const double lowest_gamma = 1e-5, highest_gamma = 50.0;

    /// A bound as a reader writes it (1e-05, 50), not as std::to_string does (0.000010, 50.000000).
    std::string short_number(const double value)
    {
      std::ostringstream out;
      out << std::setprecision(6) << value;
      return out.str();
    }

    /// The likely cause of a Γ far above any adhesion: a value in mJ/m² given in J/m².
    std::string unit_hint(const double gamma, const std::string &unit)
    {
      if (unit != unit_j_per_m2 || !(gamma > highest_gamma) || gamma / 1000 > highest_gamma)
        return "";
      return " A value in mJ/m^2? Then set 'Work of adhesion unit = mJ/m^2' (" + short_number(gamma) +
             " mJ/m^2 = " + short_number(gamma / 1000) + " J/m^2).";
    }

    /// The registry, seeded with the built-in laws on first use (no static-initialisation order issues).
    std::map<std::string, AdhesionLawInfo> &registry()
    {
      static std::map<std::string, AdhesionLawInfo> laws = [] {
        std::map<std::string, AdhesionLawInfo> built_in;
        built_in[Vdw93Law::registered_name] =
          AdhesionLawInfo{Vdw93Law::registered_name,
                          "van der Waals 9-3 law (Aitken & Huang 2010), regularised below a fraction of h0",
                          &Vdw93Law::declare_parameters, &Vdw93Law::parse_parameters};
        built_in[ExponentialCohesiveLaw::registered_name] =
          AdhesionLawInfo{ExponentialCohesiveLaw::registered_name,
                          "exponential cohesive law (Xu & Needleman 1994) with a quadratic penetration penalty",
                          &ExponentialCohesiveLaw::declare_parameters,
                          &ExponentialCohesiveLaw::parse_parameters};
        return built_in;
      }();
      return laws;
    }

    std::string joined_names(const std::string &separator)
    {
      std::string out;
      for (const auto &name : adhesion_law_names())
        out += (out.empty() ? "" : separator) + name;
      return out;
    }

    std::string to_text(const double value)
    {
      std::ostringstream out;
      out << std::setprecision(17) << value;
      return out.str();
    }
  } // namespace

  void register_adhesion_law(AdhesionLawInfo info)
  {
    AssertThrow(!info.name.empty(), dealii::ExcMessage("register_adhesion_law: the law name must not be empty."));
    AssertThrow(info.name.find('|') == std::string::npos && info.name.find(',') == std::string::npos,
                dealii::ExcMessage("register_adhesion_law: the law name <" + info.name +
                                   "> must not contain '|' or ','."));
    AssertThrow(info.declare_parameters && info.create,
                dealii::ExcMessage("register_adhesion_law: law <" + info.name +
                                   "> needs both a declare_parameters and a create function."));
    AssertThrow(registry().count(info.name) == 0,
                dealii::ExcMessage("register_adhesion_law: a law named <" + info.name +
                                   "> is already registered. Registered laws: " + joined_names(", ") + "."));
    const std::string name = info.name;
    registry().emplace(name, std::move(info));
  }

  std::vector<std::string> adhesion_law_names()
  {
    std::vector<std::string> names;
    for (const auto &entry : registry())
      names.push_back(entry.first);
    return names;
  }

  void declare_adhesion_parameters(dealii::ParameterHandler &prm)
  {
    std::string law_doc = "Adhesion (traction-separation) law between sheet and substrate. One of:";
    for (const auto &entry : registry())
      law_doc += " '" + entry.first + "': " + entry.second.description + ";";
    law_doc += " each law reads its own entries from the subsection of the same name.";

    prm.enter_subsection(subsection_name);
    {
      prm.declare_entry("Law", Vdw93Law::registered_name, dealii::Patterns::Selection(joined_names("|")),
                        law_doc);
      prm.declare_entry("Work of adhesion", "0.45",
                        dealii::Patterns::Anything(),
                        "Work of adhesion Gamma (energy per area released when the sheet adheres; the "
                        "depth of the adhesion well): a positive number in 'Work of adhesion unit' (J/m^2 by "
                        "default), or 'from catalogue': the catalogue's value for Sheet/Material on 'Substrate "
                        "material' (nappe-solve --list-materials). Default: graphene on SiO2, 0.45 J/m^2 (Koenig "
                        "et al., Nature Nanotechnology 6, 543, 2011).");
      prm.declare_entry("Work of adhesion unit", unit_j_per_m2,
                        dealii::Patterns::Selection(std::string(unit_j_per_m2) + "|" + unit_mj_per_m2 + "|" +
                                                    unit_mev_per_ang2),
                        "Unit of 'Work of adhesion': J/m^2, mJ/m^2, or meV/A^2 (milli-electronvolt per square "
                        "angstrom; 1 meV/A^2 = 0.01602176634 J/m^2).");
      prm.declare_entry("Substrate material", "", dealii::Patterns::Anything(),
                        "Name of the substrate in the catalogue's interfaces (e.g. SiO2); used with Work of "
                        "adhesion = from catalogue.");
      prm.declare_entry("Equilibrium separation", "0.6", dealii::Patterns::Double(0.0),
                        "Equilibrium gap h0 between sheet and substrate surface, where the adhesion energy "
                        "is minimal and the traction vanishes. Positive. Unit: nm.");
      for (const auto &entry : registry())
        {
          prm.enter_subsection(entry.first);
          entry.second.declare_parameters(prm);
          prm.leave_subsection();
        }
    }
    prm.leave_subsection();
  }

  double work_of_adhesion_unit_factor(const std::string &unit)
  {
    if (unit == unit_j_per_m2)
      return units::joule_per_m2;
    if (unit == unit_mj_per_m2)
      return 1e-3 * units::joule_per_m2;
    AssertThrow(unit == unit_mev_per_ang2,
                dealii::ExcMessage("Adhesion/Work of adhesion unit: expected J/m^2, mJ/m^2 or meV/A^2, found <" +
                                   unit + ">."));
    return units::mev_per_angstrom2;
  }

  std::unique_ptr<AdhesionLaw> parse_adhesion_parameters(dealii::ParameterHandler &prm,
                                                         const std::string      &sheet_material)
  {
    prm.enter_subsection(subsection_name);

    const std::string law = prm.get("Law");
    const auto        it  = registry().find(law);
    AssertThrow(it != registry().end(),
                dealii::ExcMessage("Adhesion/Law: expected one of " + joined_names(", ") + ", found <" + law +
                                   ">."));

    const std::string unit        = prm.get("Work of adhesion unit");
    const double      unit_factor = work_of_adhesion_unit_factor(unit);
    const std::string text        = dealii::Utilities::trim(prm.get("Work of adhesion"));
    double            gamma       = 0.0;
    if (text == from_catalogue)
      {
        const std::string substrate = prm.get("Substrate material");
        AssertThrow(!substrate.empty() && sheet_material != "custom",
                    dealii::ExcMessage("Adhesion/Work of adhesion = from catalogue needs Sheet/Material from the "
                                       "catalogue and Adhesion/Substrate material (e.g. SiO2)."));
        gamma = MaterialCatalogue().work_of_adhesion(sheet_material, substrate);
      }
    else
      {
        std::size_t used = 0;
        try
          {
            gamma = std::stod(text, &used) * unit_factor;
          }
        catch (...)
          {
            used = 0;
          }
        AssertThrow(used == text.size() && !text.empty(),
                    dealii::ExcMessage("Adhesion/Work of adhesion = '" + text + "': expected a number in " + unit +
                                       " or 'from catalogue'."));
      }
    AssertThrow(std::isfinite(gamma) && gamma >= lowest_gamma && gamma <= highest_gamma,
                dealii::ExcMessage("Adhesion/Work of adhesion = " + text + " " + unit +
                                   " is outside the admissible range " + short_number(lowest_gamma / unit_factor) +
                                   " to " + short_number(highest_gamma / unit_factor) + " " + unit + "." +
                                   unit_hint(gamma, unit)));

    const double h0 = prm.get_double("Equilibrium separation") * units::nanometer;
    AssertThrow(std::isfinite(h0) && h0 >= 0.01 * units::nanometer && h0 <= 50 * units::nanometer,
                dealii::ExcMessage("Adhesion/Equilibrium separation = " + prm.get("Equilibrium separation") +
                                   " nm is outside the admissible range 0.01 to 50 nm."));

    prm.enter_subsection(law);
    std::unique_ptr<AdhesionLaw> result;
    try
      {
        result = it->second.create(gamma, h0, prm);
      }
    catch (...)
      {
        prm.leave_subsection();
        prm.leave_subsection();
        throw;
      }
    prm.leave_subsection();
    prm.leave_subsection();
    return result;
  }

  std::unique_ptr<AdhesionLaw> create_adhesion_law(const std::string &name, const double work_of_adhesion,
                                                   const double equilibrium_gap,
                                                   const std::map<std::string, std::string> &law_options)
  {
    AssertThrow(registry().count(name) == 1,
                dealii::ExcMessage("create_adhesion_law: unknown adhesion law <" + name +
                                   ">. Registered laws: " + joined_names(", ") + "."));
    AssertThrow(std::isfinite(work_of_adhesion) && work_of_adhesion > 0.0,
                dealii::ExcMessage("create_adhesion_law: the work of adhesion must be positive [J/m^2], found " +
                                   to_text(work_of_adhesion) + "."));
    AssertThrow(std::isfinite(equilibrium_gap) && equilibrium_gap > 0.0,
                dealii::ExcMessage("create_adhesion_law: the equilibrium gap must be positive [m], found " +
                                   to_text(equilibrium_gap) + "."));

    // Go through a parameter handler so that a law is validated in one place only. Values are
    // written with 17 significant digits, so the round trip through text is exact to round-off.
    dealii::ParameterHandler prm;
    declare_adhesion_parameters(prm);
    prm.enter_subsection(subsection_name);
    prm.set("Law", name);
    prm.set("Work of adhesion unit", unit_j_per_m2);
    prm.set("Work of adhesion", to_text(work_of_adhesion / units::joule_per_m2));
    prm.set("Equilibrium separation", to_text(equilibrium_gap / units::nanometer));
    prm.enter_subsection(name);
    for (const auto &[entry, value] : law_options)
      {
        try
          {
            prm.set(entry, value);
          }
        catch (const dealii::ExceptionBase &e)
          {
            AssertThrow(false, dealii::ExcMessage("create_adhesion_law: cannot set entry <Adhesion/" + name + "/" +
                                                  entry + "> to <" + value + ">: " + e.get_exc_name() +
                                                  ". Check the entry name and its documented unit and range."));
          }
      }
    prm.leave_subsection();
    prm.leave_subsection();
    return parse_adhesion_parameters(prm);
  }
} // namespace nappe

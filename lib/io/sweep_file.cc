#include <deal.II/base/utilities.h>

#include <nappe/base/version.h>
#include <nappe/io/case_file.h>
#include <nappe/io/parameter_override.h>
#include <nappe/io/sweep_file.h>
#include <nappe/physics/material_catalogue.h>

#include <algorithm>
#include <cstdint>
#include <filesystem>
#include <fstream>
#include <iomanip>
#include <set>
#include <sstream>

namespace nappe
{
  using dealii::ExcMessage;
  namespace fs = std::filesystem;

  namespace
  {
    void declare_axis(dealii::ParameterHandler &prm, const std::string &name)
    {
      prm.enter_subsection(name);
      prm.declare_entry("Entries", "", dealii::Patterns::Anything(),
                        "Case-file entries set to each value, separated by ';', e.g. "
                        "'Topography/Sinusoidal grating/Wavelength; Domain/Length x'. Empty: no such axis.");
      prm.declare_entry("Name", "", dealii::Patterns::Anything(), "Name of the axis in tables and plots.");
      prm.declare_entry("Unit", "", dealii::Patterns::Anything(),
                        "Unit of the values: the unit the case file documents for the entries (e.g. nm, J/m^2).");
      prm.declare_entry("Values", "", dealii::Patterns::Anything(),
                        "Comma-separated values, or 'from A to B in N steps' (evenly spaced, N >= 2) [Unit]; or "
                        "comma-separated names (e.g. materials of the catalogue): a categorical axis.");
      prm.leave_subsection();
    }

    std::string number(double v)
    {
      std::ostringstream s;
      s << std::setprecision(10) << v;
      return s.str();
    }

    bool is_number(const std::string &text)
    {
      std::size_t used = 0;
      try
        {
          std::stod(text, &used);
        }
      catch (...)
        {
          return false;
        }
      return used == text.size();
    }

    /// "from A to B in N steps", checked against the point limit before anything is allocated.
    std::vector<std::string> evenly_spaced(const std::string &text, const std::string &where, unsigned int limit)
    {
      std::istringstream in(text);
      std::string        from, to, in_word, steps_word;
      double             a = 0, b = 0;
      long long          n = 0;
      AssertThrow((in >> from >> a >> to >> b >> in_word >> n >> steps_word) && to == "to" && in_word == "in" &&
                    steps_word == "steps" && n >= 2,
                  ExcMessage(where + ": expected 'from A to B in N steps' with N >= 2, found '" + text + "'."));
      AssertThrow(n <= limit, ExcMessage(where + ": " + std::to_string(n) + " steps exceed Sweep/Point limit = " +
                                         std::to_string(limit) + "; raise the limit if you mean it."));
      std::vector<std::string> v;
      for (long long i = 0; i < n; ++i)
        v.push_back(number(a + (b - a) * i / (n - 1)));
      return v;
    }

    SweepAxis parse_axis(dealii::ParameterHandler &prm, const std::string &name, unsigned int limit)
    {
      SweepAxis axis;
      prm.enter_subsection(name);
      axis.entries           = dealii::Utilities::split_string_list(prm.get("Entries"), ';');
      axis.name              = prm.get("Name");
      axis.unit              = prm.get("Unit");
      const std::string text = prm.get("Values");
      prm.leave_subsection();
      if (axis.entries.empty())
        return axis;
      const std::string where = "Sweep/" + name + "/Values";
      axis.values = text.rfind("from", 0) == 0 ? evenly_spaced(text, where, limit)
                                                : dealii::Utilities::split_string_list(text, ',');
      AssertThrow(!axis.values.empty(), ExcMessage(where + ": expected at least one value."));
      axis.categorical = !std::all_of(axis.values.begin(), axis.values.end(), is_number);
      std::set<std::string> seen;
      for (const auto &v : axis.values)
        {
          const std::string key = axis.categorical ? v : number(std::stod(v));
          AssertThrow(seen.insert(key).second,
                      ExcMessage(where + ": the value '" + v + "' is listed twice; every value must be different."));
        }
      if (axis.name.empty())
        axis.name = axis.entries.front();
      return axis;
    }

    /// 64-bit FNV-1a (Fowler, Noll & Vo), a stable hash across runs and machines.
    std::uint64_t fnv1a(const std::string &text, std::uint64_t hash = 1469598103934665603ull)
    {
      for (const unsigned char c : text)
        hash = (hash ^ c) * 1099511628211ull;
      return hash;
    }

    std::string file_contents(const std::string &path)
    {
      std::ifstream      in(path, std::ios::binary);
      std::ostringstream s;
      s << in.rdbuf();
      return s.str();
    }
  } // namespace

  unsigned int SweepSpec::n_points() const
  {
    unsigned int n = 1;
    for (const auto &a : axes)
      n *= a.size();
    return n;
  }

  std::vector<std::size_t> SweepSpec::indices(unsigned int point) const
  {
    std::vector<std::size_t> v;
    unsigned int             index = point - 1;
    for (const auto &a : axes)
      {
        v.push_back(index % a.size());
        index /= a.size();
      }
    return v;
  }

  namespace
  {
    /// The entries that @p declare declares, read once.
    template <void (*declare)(dealii::ParameterHandler &)>
    const DeclaredEntries &entries_of()
    {
      static const DeclaredEntries entries = [] {
        dealii::ParameterHandler prm;
        declare(prm);
        return DeclaredEntries(prm);
      }();
      return entries;
    }

    /// The entries of a case file: every point's handler declares exactly these.
    const DeclaredEntries &case_entries()
    {
      return entries_of<declare_sheet_case_parameters>();
    }

    /// The case-file handler every point starts from: base case file and fixed overrides.
    void base_parameters(const SweepSpec &spec, dealii::ParameterHandler &prm)
    {
      declare_sheet_case_parameters(prm);
      read_parameter_file(prm, spec.case_file, case_entries());
      for (const auto &o : spec.overrides)
        apply_override(prm, case_entries(), o, spec.sweep_file + ": Sweep/Case overrides");
    }

    /// Sets every axis entry to point @p point's value; relative paths are relative to the sweep file.
    void set_point(const SweepSpec &spec, unsigned int point, dealii::ParameterHandler &prm)
    {
      const auto indices = spec.indices(point);
      for (std::size_t a = 0; a < spec.axes.size(); ++a)
        for (const auto &entry : spec.axes[a].entries)
          apply_override(prm, case_entries(), entry + "=" + spec.axes[a].values[indices[a]],
                         spec.sweep_file + ": Sweep/Axis " + std::to_string(a + 1));
      resolve_relative_paths(prm, fs::absolute(spec.sweep_file).parent_path().string());
    }

    /// Parses every point's case, naming the first that fails. One handler serves all points: each
    /// point sets every axis entry, and resolving paths twice changes nothing, so the handler holds
    /// exactly point_parameters() of each point (declaring the ~230 entries anew per point made a
    /// long sweep take seconds to check).
    void check_every_point(const SweepSpec &spec)
    {
      dealii::ParameterHandler prm;
      base_parameters(spec, prm);
      for (unsigned int p = 1; p <= spec.n_points(); ++p)
        try
          {
            set_point(spec, p, prm);
            (void)parse_sheet_case(prm);
          }
        catch (const std::exception &e)
          {
            AssertThrow(false, ExcMessage(spec.sweep_file + ": point " + std::to_string(p) +
                                          " is not a valid case: " + user_message(e)));
          }
    }
  } // namespace

  void declare_sweep_parameters(dealii::ParameterHandler &prm)
  {
    prm.enter_subsection("Sweep");
    prm.declare_entry("Title", "design sweep", dealii::Patterns::Anything(), "Title of tables and plots.");
    prm.declare_entry("Case file", "", dealii::Patterns::Anything(),
                      "The base case (a nappe case file), relative to the sweep file's directory.");
    prm.declare_entry("Case overrides", "", dealii::Patterns::Anything(),
                      "'Section/Entry=value' assignments applied to every point, separated by ';'.");
    prm.declare_entry("Output directory", "sweep", dealii::Patterns::Anything(),
                      "Where the records, tables and plots go, relative to the sweep file's directory.");
    prm.declare_entry("Thresholds", "false", dealii::Patterns::Bool(),
                      "true: every point follows both Gamma paths (Gamma_hold, Gamma_eq, Gamma_snap); false: one solve "
                      "at the case's Gamma.");
    prm.declare_entry("Point limit", "2000", dealii::Patterns::Integer(1),
                      "The most points the sweep may have; a larger sweep is refused before any work starts [-].");
    declare_axis(prm, "Axis 1");
    declare_axis(prm, "Axis 2");
    prm.leave_subsection();
  }

  SweepSpec read_sweep(const std::string &sweep_file)
  {
    dealii::ParameterHandler prm;
    declare_sweep_parameters(prm);
    read_parameter_file(prm, sweep_file, entries_of<declare_sweep_parameters>());
    const fs::path here = fs::absolute(sweep_file).parent_path();
    SweepSpec      spec;
    spec.sweep_file = sweep_file;
    prm.enter_subsection("Sweep");
    spec.title               = prm.get("Title");
    const fs::path case_file = prm.get("Case file");
    spec.overrides           = dealii::Utilities::split_string_list(prm.get("Case overrides"), ';');
    spec.output_directory    = (here / prm.get("Output directory")).lexically_normal().string();
    spec.thresholds          = prm.get_bool("Thresholds");
    spec.point_limit         = prm.get_integer("Point limit");
    for (const std::string axis : {"Axis 1", "Axis 2"})
      if (SweepAxis a = parse_axis(prm, axis, spec.point_limit); !a.entries.empty())
        spec.axes.push_back(a);
    prm.leave_subsection();
    AssertThrow(!case_file.empty(), ExcMessage(sweep_file + ": Sweep/Case file: expected the base case file."));
    spec.case_file = (here / case_file).lexically_normal().string();
    AssertThrow(!spec.axes.empty(), ExcMessage(sweep_file + ": Sweep/Axis 1/Entries: expected at least one entry."));
    std::error_code error; // a name the system refuses (e.g. too long) does not exist either
    AssertThrow(fs::is_regular_file(spec.case_file, error),
                ExcMessage(sweep_file + ": Sweep/Case file: '" + spec.case_file + "' does not exist" +
                           (error && error != std::errc::no_such_file_or_directory ? " (" + error.message() + ")" :
                                                                                     std::string()) +
                           "."));
    AssertThrow(spec.n_points() <= spec.point_limit,
                ExcMessage(sweep_file + ": the sweep has " + std::to_string(spec.n_points()) +
                           " points, more than Sweep/Point limit = " + std::to_string(spec.point_limit) +
                           "; raise the limit if you mean it."));
    check_every_point(spec);
    return spec;
  }

  void point_parameters(const SweepSpec &spec, unsigned int point, dealii::ParameterHandler &prm)
  {
    base_parameters(spec, prm);
    set_point(spec, point, prm);
  }

  SheetCase point_case(const SweepSpec &spec, unsigned int point)
  {
    dealii::ParameterHandler prm;
    point_parameters(spec, point, prm);
    return parse_sheet_case(prm);
  }

  std::string point_fingerprint(const SweepSpec &spec, unsigned int point)
  {
    dealii::ParameterHandler prm;
    point_parameters(spec, point, prm);
    prm.enter_subsection("Output"); // where a point would write does not change its result
    prm.set("Directory", ".");
    prm.set("Base name", "sheet");
    prm.leave_subsection();
    std::ostringstream resolved;
    prm.print_parameters(resolved, dealii::ParameterHandler::ShortPRM);
    std::uint64_t hash = fnv1a("nappe " + version() + (spec.thresholds ? " thresholds\n" : " single solve\n"));
    hash               = fnv1a(resolved.str(), hash);
    std::error_code error; // a file that cannot be checked is not part of the fingerprint
    for (const auto &entry : file_entries())
      if (entry != "Output/Directory")
        if (const std::string path = entry_text(prm, entry); !path.empty() && fs::is_regular_file(path, error))
          hash = fnv1a(file_contents(path), hash);
    hash = fnv1a(file_contents(MaterialCatalogue::default_path()), hash);
    std::ostringstream hex;
    hex << std::hex << std::setw(16) << std::setfill('0') << hash;
    return hex.str();
  }
} // namespace nappe

#include <deal.II/base/exceptions.h>

#include <nappe/io/atomic_file.h>
#include <nappe/io/caution.h>
#include <nappe/io/json_writer.h>
#include <nappe/io/sweep_records.h>

#include <filesystem>
#include <fstream>
#include <iomanip>
#include <sstream>

namespace nappe
{
  namespace fs = std::filesystem;

  namespace
  {
    const char *const record_magic = "nappe sweep record 1";

    std::string number(double v)
    {
      std::ostringstream s;
      s << std::setprecision(10) << v;
      return s.str();
    }

    /// A CSV text field: quoted, with quotes and line breaks replaced.
    std::string quoted(std::string text)
    {
      for (auto &ch : text)
        if (ch == '"' || ch == '\n' || ch == '\r')
          ch = '\'';
      return "\"" + text + "\"";
    }

    std::size_t field_count(const std::string &row)
    {
      std::size_t n = 1;
      bool        in_quotes = false;
      for (const char ch : row)
        if (ch == '"')
          in_quotes = !in_quotes;
        else if (ch == ',' && !in_quotes)
          ++n;
      return n;
    }
  } // namespace

  std::string sweep_table_header(const SweepSpec &spec, const std::vector<std::string> &value_columns)
  {
    std::string h = "point";
    for (std::size_t a = 0; a < spec.axes.size(); ++a)
      h += ",axis_" + std::to_string(a + 1);
    h += ",status,regime,work_of_adhesion_J_per_m2,fracture_strain";
    for (const auto &c : value_columns)
      h += "," + c;
    if (spec.thresholds)
      h += ",gamma_hold_J_per_m2,gamma_snap_J_per_m2,gamma_eq_J_per_m2";
    return h + ",message";
  }

  std::string sweep_table_row(const SweepSpec &spec, const PointRecord &r)
  {
    std::string line    = std::to_string(r.point);
    const auto  indices = spec.indices(r.point);
    for (std::size_t a = 0; a < spec.axes.size(); ++a)
      line += "," + (spec.axes[a].categorical ? quoted(spec.axes[a].values[indices[a]])
                                              : spec.axes[a].values[indices[a]]);
    line += r.ok ? ",ok," + r.regime : ",failed,";
    line += "," + (r.work_of_adhesion > 0 ? number(r.work_of_adhesion) : std::string());
    line += "," + (r.fracture_strain > 0 ? number(r.fracture_strain) : std::string());
    for (const double v : r.values)
      line += "," + (r.ok ? number(v) : std::string());
    if (spec.thresholds)
      for (std::size_t i = 0; i < 3; ++i)
        line += "," + (i < r.thresholds.size() ? r.thresholds[i] : std::string());
    return line + "," + quoted(r.message);
  }

  std::string point_record_path(const SweepSpec &spec, unsigned int point)
  {
    std::ostringstream name;
    name << "point-" << std::setw(4) << std::setfill('0') << point << ".rec";
    return (fs::path(spec.output_directory) / "points" / name.str()).string();
  }

  void write_point_record(const SweepSpec &spec, const std::vector<std::string> &value_columns,
                          const PointRecord &record)
  {
    write_atomically(point_record_path(spec, record.point), [&](std::ostream &out) {
      out << record_magic << "\nfingerprint " << record.fingerprint << "\nstatus " << (record.ok ? "ok" : "failed")
          << "\nheader " << sweep_table_header(spec, value_columns) << "\nrow " << sweep_table_row(spec, record)
          << "\nend\n";
    });
  }

  std::optional<StoredRecord> read_point_record(const SweepSpec &spec, const std::vector<std::string> &value_columns,
                                                unsigned int point, std::string &why)
  {
    const std::string path = point_record_path(spec, point);
    std::ifstream     in(path);
    if (!in)
      {
        why = "no record";
        return std::nullopt;
      }
    std::string lines[6];
    for (auto &l : lines)
      std::getline(in, l);
    const std::string header = "header " + sweep_table_header(spec, value_columns);
    if (lines[0] != record_magic || lines[1].rfind("fingerprint ", 0) != 0 || lines[2].rfind("status ", 0) != 0 ||
        lines[4].rfind("row ", 0) != 0 || lines[5] != "end")
      {
        why = "its record is truncated or malformed";
        return std::nullopt;
      }
    if (lines[3] != header || field_count(lines[4].substr(4)) != field_count(header.substr(7)))
      {
        why = "its record belongs to a table with other columns";
        return std::nullopt;
      }
    return StoredRecord{lines[1].substr(12), lines[2] == "status ok", lines[4].substr(4)};
  }

  void write_sweep_table(const SweepSpec &spec, const std::vector<std::string> &value_columns,
                         const std::vector<std::string> &rows)
  {
    const fs::path dir = spec.output_directory;
    write_atomically((dir / "sweep.csv").string(), [&](std::ostream &out) {
      out << sweep_table_header(spec, value_columns) << "\n";
      for (const auto &row : rows)
        out << row << "\n";
    });
    write_atomically((dir / "sweep.json").string(), [&](std::ostream &out) {
      JsonWriter json(out);
      json.begin_object();
      json.value("title", spec.title);
      json.value("note", model_caution());
      json.value("case_file", spec.case_file);
      json.begin_array("axes");
      for (const auto &a : spec.axes)
        {
          json.begin_object();
          std::string entries;
          for (const auto &e : a.entries)
            entries += (entries.empty() ? "" : "; ") + e;
          json.value("parameter", entries);
          json.value("name", a.name);
          json.value("unit", a.unit);
          json.value("categorical", a.categorical);
          json.begin_array("values");
          for (const auto &v : a.values)
            a.categorical ? json.value("", v) : json.value("", std::stod(v));
          json.end_array();
          json.end_object();
        }
      json.end_array();
      json.value("target_fraction", point_case(spec, 1).limits.target_fraction);
      json.value("thresholds", spec.thresholds);
      json.end_object();
    });
  }
} // namespace nappe

#include <deal.II/base/exceptions.h>

#include <nappe/io/atomic_file.h>
#include <nappe/io/caution.h>
#include <nappe/io/json_writer.h>
#include <nappe/io/sweep_records.h>

#include <algorithm>
#include <cmath>
#include <cstdlib>
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

    bool is_control(const char ch) { return static_cast<unsigned char>(ch) < 0x20 || ch == 0x7f; }

    /// A CSV text field: quoted, with quotes and line breaks replaced, other control characters blanked.
    std::string quoted(std::string text)
    {
      for (auto &ch : text)
        if (ch == '"' || ch == '\n' || ch == '\r')
          ch = '\'';
        else if (is_control(ch))
          ch = ' ';
      return "\"" + text + "\"";
    }

    /// The fields of a table row, split at the commas outside quotes; quoted fields keep their quotes.
    std::vector<std::string> fields_of(const std::string &row)
    {
      std::vector<std::string> fields(1);
      bool                     in_quotes = false;
      for (const char ch : row)
        {
          if (ch == '"')
            in_quotes = !in_quotes;
          if (ch == ',' && !in_quotes)
            fields.emplace_back();
          else
            fields.back() += ch;
        }
      return fields;
    }

    /// A number as number() writes it: only digits, sign, point and exponent (no "nan", "inf" or
    /// hexadecimal), and finite.
    bool is_number(const std::string &field)
    {
      if (field.empty() || field.find_first_not_of("0123456789+-.eE") != std::string::npos)
        return false;
      char        *end   = nullptr;
      const double value = std::strtod(field.c_str(), &end);
      return *end == '\0' && std::isfinite(value);
    }

    /**
     * What is wrong with the stored row of @p point, or "" if it is a row sweep_table_row() could have
     * written for it: a damaged or hand-edited record is computed again instead of going into sweep.csv.
     * The row has as many fields as the header (checked before).
     */
    std::string row_defect(const SweepSpec &spec, const std::size_t n_values, const unsigned int point, const bool ok,
                           const std::string &row)
    {
      if (std::any_of(row.begin(), row.end(), is_control))
        return "a control character";
      const auto  f = fields_of(row);
      std::size_t i = 0;
      if (f[i++] != std::to_string(point))
        return "another point's number";
      const auto indices = spec.indices(point);
      for (std::size_t a = 0; a < spec.axes.size(); ++a)
        {
          const std::string &value = spec.axes[a].values[indices[a]];
          if (f[i++] != (spec.axes[a].categorical ? quoted(value) : value))
            return "another point's axis values";
        }
      if (f[i++] != (ok ? "ok" : "failed"))
        return "a status other than the record's";
      const std::string &regime = f[i++];
      if (regime.find('"') != std::string::npos || (!ok && !regime.empty()))
        return "an unexpected regime";
      for (const std::size_t end = i + 2; i < end; ++i) // work of adhesion, fracture strain: > 0 or empty
        if (!f[i].empty() && !(is_number(f[i]) && std::strtod(f[i].c_str(), nullptr) > 0))
          return "a work of adhesion or fracture strain that is not a positive number";
      for (const std::size_t end = i + n_values; i < end; ++i)
        if (ok ? !is_number(f[i]) : !f[i].empty())
          return ok ? "a value that is not a finite number" : "values of a failed point";
      for (const std::size_t end = i + (spec.thresholds ? 3 : 0); i < end; ++i)
        if (!f[i].empty() && !is_number(f[i]))
          return "a threshold that is not a finite number";
      const std::string &message = f[i];
      if (message.size() < 2 || message.front() != '"' || message.find('"', 1) != message.size() - 1)
        return "a message that is not one quoted field";
      return "";
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
    if (lines[0] != record_magic || lines[1].rfind("fingerprint ", 0) != 0 ||
        (lines[2] != "status ok" && lines[2] != "status failed") || lines[4].rfind("row ", 0) != 0 ||
        lines[5] != "end")
      {
        why = "its record is truncated or malformed";
        return std::nullopt;
      }
    const std::string row = lines[4].substr(4);
    if (lines[3] != header || fields_of(row).size() != fields_of(header.substr(7)).size())
      {
        why = "its record belongs to a table with other columns";
        return std::nullopt;
      }
    const bool        ok     = lines[2] == "status ok";
    const std::string defect = row_defect(spec, value_columns.size(), point, ok, row);
    if (!defect.empty())
      {
        why = "its record is damaged (its row has " + defect + ")";
        return std::nullopt;
      }
    return StoredRecord{lines[1].substr(12), ok, row};
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

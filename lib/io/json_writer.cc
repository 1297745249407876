#include <deal.II/base/exceptions.h>

#include <nappe/io/json_writer.h>

#include <cmath>
#include <iomanip>
#include <sstream>

namespace nappe
{
  JsonWriter::JsonWriter(std::ostream &out) : out_(out) {}

  void JsonWriter::key_prefix(const std::string &key)
  {
    if (first_.empty())
      return;
    if (!first_.back())
      out_ << ",";
    out_ << "\n" << std::string(2 * first_.size(), ' ');
    first_.back() = false;
    if (!is_array_.back())
      out_ << quoted(key) << ": ";
  }

  std::string JsonWriter::quoted(const std::string &s) const
  {
    std::string q = "\"";
    for (const char c : s)
      {
        if (c == '"' || c == '\\')
          q += '\\';
        if (c == '\n')
          {
            q += "\\n";
            continue;
          }
        q += c;
      }
    return q + "\"";
  }

  void JsonWriter::begin_object(const std::string &key)
  {
    key_prefix(key);
    out_ << "{";
    first_.push_back(true);
    is_array_.push_back(false);
  }

  void JsonWriter::end_object()
  {
    first_.pop_back();
    is_array_.pop_back();
    out_ << "\n" << std::string(2 * first_.size(), ' ') << "}";
    if (first_.empty())
      out_ << "\n";
  }

  void JsonWriter::begin_array(const std::string &key)
  {
    key_prefix(key);
    out_ << "[";
    first_.push_back(true);
    is_array_.push_back(true);
  }

  void JsonWriter::end_array()
  {
    first_.pop_back();
    is_array_.pop_back();
    out_ << "\n" << std::string(2 * first_.size(), ' ') << "]";
  }

  void JsonWriter::value(const std::string &key, double v)
  {
    AssertThrow(std::isfinite(v), dealii::ExcMessage("Report entry '" + key + "' is not a finite number."));
    key_prefix(key);
    std::ostringstream s;
    s << std::setprecision(10) << v;
    out_ << s.str();
  }

  void JsonWriter::value(const std::string &key, const std::string &v)
  {
    key_prefix(key);
    out_ << quoted(v);
  }

  void JsonWriter::value(const std::string &key, bool v)
  {
    key_prefix(key);
    out_ << (v ? "true" : "false");
  }

  void JsonWriter::null(const std::string &key)
  {
    key_prefix(key);
    out_ << "null";
  }

  void JsonWriter::value(const std::string &key, long long v)
  {
    key_prefix(key);
    out_ << v;
  }

  void JsonWriter::quantity(const std::string &key, double v, const std::string &unit)
  {
    begin_object(key);
    value("value", v);
    value("unit", unit);
    end_object();
  }
} // namespace nappe

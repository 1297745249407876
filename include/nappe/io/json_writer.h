#pragma once

#include <ostream>
#include <string>
#include <vector>

namespace nappe
{
  /**
   * A small streaming JSON writer for reports. Numbers are written with 10 significant digits;
   * a non-finite number is refused with an exception naming its key, so no report carries NaN.
   * Keys are ignored inside arrays.
   */
  class JsonWriter
  {
  public:
    explicit JsonWriter(std::ostream &out);

    void begin_object(const std::string &key = "");
    void end_object();
    void begin_array(const std::string &key);
    void end_array();

    void value(const std::string &key, double v);
    void value(const std::string &key, const std::string &v);
    void value(const std::string &key, const char *v) { value(key, std::string(v)); }
    void value(const std::string &key, bool v);
    void value(const std::string &key, long long v);
    void value(const std::string &key, unsigned int v) { value(key, static_cast<long long>(v)); }
    void value(const std::string &key, int v) { value(key, static_cast<long long>(v)); }
    /// null: a value that does not exist (e.g. an unknown material constant)
    void null(const std::string &key);
    /// {"value": v, "unit": unit}
    void quantity(const std::string &key, double v, const std::string &unit);

  private:
    void        key_prefix(const std::string &key);
    std::string quoted(const std::string &s) const;

    std::ostream     &out_;
    std::vector<bool> first_;    ///< per open scope: nothing written yet
    std::vector<bool> is_array_; ///< per open scope
  };
} // namespace nappe

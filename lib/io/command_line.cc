#include <nappe/io/command_line.h>

#include <cctype>
#include <sstream>

namespace nappe
{
  void apply_override(dealii::ParameterHandler &prm, const std::string &assignment)
  {
    const auto eq = assignment.find('=');
    AssertThrow(eq != std::string::npos,
                dealii::ExcMessage("--set '" + assignment + "': expected Section/Entry=value."));
    auto path = dealii::Utilities::split_string_list(assignment.substr(0, eq), '/');
    AssertThrow(path.size() >= 2, dealii::ExcMessage("--set '" + assignment + "': expected Section/Entry=value."));
    const std::string entry = path.back();
    path.pop_back();
    std::size_t entered = 0;
    try
      {
        for (const auto &section : path)
          {
            prm.enter_subsection(section);
            ++entered;
          }
        prm.set(entry, assignment.substr(eq + 1));
      }
    catch (const std::exception &)
      {
        for (; entered > 0; --entered)
          prm.leave_subsection();
        AssertThrow(false, dealii::ExcMessage("--set '" + assignment + "': no such entry, or the value does not "
                                              "match its pattern (see --print-defaults)."));
      }
    for (; entered > 0; --entered)
      prm.leave_subsection();
  }

  void read_case_arguments(dealii::ParameterHandler &prm, const std::vector<std::string> &args,
                           const std::string &demo_case, const std::string &usage)
  {
    AssertThrow(!args.empty(), dealii::ExcMessage("missing case file\n" + usage));
    if (args[0] == "--demo")
      prm.parse_input_from_string(demo_case, "built-in demo case");
    else
      prm.parse_input(args[0]);
    for (std::size_t i = 1; i < args.size(); ++i)
      {
        AssertThrow(args[i] == "--set" && i + 1 < args.size(),
                    dealii::ExcMessage("unexpected argument '" + args[i] + "'\n" + usage));
        apply_override(prm, args[++i]);
      }
  }

  namespace
  {
    /// Control characters (echoed input, e.g. a binary file given as a case file) shown as \xNN, so that
    /// a message cannot garble the terminal; line breaks are kept.
    std::string escape_control_characters(const std::string &text)
    {
      static const char *hex = "0123456789abcdef";
      std::string        out;
      for (const char c : text)
        {
          const auto byte = static_cast<unsigned char>(c);
          if ((byte < 0x20 && c != '\n') || byte == 0x7f)
            out += std::string("\\x") + hex[byte >> 4] + hex[byte & 15];
          else
            out += c;
        }
      return out;
    }
  } // namespace

  std::string user_message(const std::exception &e)
  {
    if (const auto *deal = dynamic_cast<const dealii::ExceptionBase *>(&e))
      {
        std::ostringstream s;
        deal->print_info(s);
        std::string text = s.str();
        while (!text.empty() && std::isspace(static_cast<unsigned char>(text.front())))
          text.erase(text.begin());
        return escape_control_characters(text);
      }
    return escape_control_characters(e.what());
  }
} // namespace nappe

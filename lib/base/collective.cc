#include <deal.II/base/exceptions.h>
#include <deal.II/base/mpi.h>

#include <nappe/base/collective.h>

#include <cctype>
#include <sstream>
#include <vector>

namespace nappe
{
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
        while (!text.empty() && std::isspace(static_cast<unsigned char>(text.back())))
          text.pop_back();
        return escape_control_characters(text);
      }
    return escape_control_characters(e.what());
  }

  void run_collectively(MPI_Comm comm, const std::function<void()> &work)
  {
    std::string message;
    bool        failed = false;
    try
      {
        work();
      }
    catch (const std::exception &e)
      {
        failed  = true;
        message = user_message(e);
      }
    catch (...)
      {
        failed  = true;
        message = "unknown error";
      }
    const unsigned int rank    = dealii::Utilities::MPI::this_mpi_process(comm);
    const unsigned int n_ranks = dealii::Utilities::MPI::n_mpi_processes(comm);
    const unsigned int first   = dealii::Utilities::MPI::min(failed ? rank : n_ranks, comm);
    if (first == n_ranks)
      return;
    message = dealii::Utilities::MPI::broadcast(comm, message, first);
    throw CollectiveError(message);
  }
} // namespace nappe

#include <deal.II/base/exceptions.h>
#include <deal.II/base/mpi.h>

#include <nappe/base/collective.h>

#include <cctype>
#include <sstream>
#include <vector>

namespace nappe
{
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
        return text;
      }
    return e.what();
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

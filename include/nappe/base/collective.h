#pragma once

#include <mpi.h>

#include <functional>
#include <stdexcept>
#include <string>

namespace nappe
{
  /// An error that every rank of a communicator raised together, with the same message.
  class CollectiveError : public std::runtime_error
  {
  public:
    using std::runtime_error::runtime_error;
  };

  /**
   * Runs @p work on every rank of @p comm and agrees on its outcome: if it throws on any rank, every
   * rank throws a CollectiveError carrying the message of the lowest failing rank, so that no rank
   * is left waiting in a later collective call. Collective; use it around a stage whose errors may
   * arise on some ranks only (sampling a topography on the locally owned cells, writing a file).
   */
  void run_collectively(MPI_Comm comm, const std::function<void()> &work);

  /// The text of an exception for a user: deal.II's message without source location and stack trace.
  std::string user_message(const std::exception &e);
} // namespace nappe

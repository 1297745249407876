#include <deal.II/base/mpi.h>

#include <nappe/base/collective.h>
#include <nappe/io/atomic_file.h>
#include <nappe/io/case_checks.h>
#include <nappe/io/case_file.h>
#include <nappe/io/parameter_override.h>
#include <nappe/runs/app_driver.h>
#include <nappe/runs/plotter.h>

#include <algorithm>
#include <chrono>
#include <csignal>
#include <filesystem>
#include <iostream>
#include <regex>
#include <sstream>
#include <thread>

namespace nappe
{
  namespace fs = std::filesystem;

  namespace
  {
    /**
     * After an exception on this rank: if every rank reaches this point within a few seconds (the
     * same error everywhere), rank 0 prints it; otherwise this rank prints it and aborts the job.
     * @p errors is a communicator used for nothing else, so the agreement cannot be confused with a
     * collective call another rank is waiting in.
     */
    int agree_or_abort(MPI_Comm errors, const std::string &app, const std::string &message)
    {
      MPI_Request request;
      MPI_Ibarrier(errors, &request);
      int        done     = 0;
      const auto deadline = std::chrono::steady_clock::now() + std::chrono::seconds(5);
      while (!done && std::chrono::steady_clock::now() < deadline)
        {
          MPI_Test(&request, &done, MPI_STATUS_IGNORE);
          if (!done)
            std::this_thread::sleep_for(std::chrono::milliseconds(10));
        }
      if (done)
        {
          if (dealii::Utilities::MPI::this_mpi_process(errors) == 0)
            std::cerr << app << ": error: " << message << std::endl;
          return 1;
        }
      std::cerr << app << ": error: " << message << std::endl;
      MPI_Abort(MPI_COMM_WORLD, 1);
      return 1;
    }

    std::string usage(const CaseApp &app)
    {
      std::string text = "usage: " + app.name + " CASE.prm [--set Section/Entry=value]... [--no-plots] [--quiet]\n       " +
                         app.name + " --demo [--set …] | --print-defaults | --validate CASE.prm [--set …] | --help";
      for (const auto &[command, f] : app.commands)
        text += " | " + command;
      return text + "\n";
    }

    /// Removes the files an earlier run of the same stem wrote (the numbered VTU pieces included).
    void remove_previous_results(const OutputSettings &output, std::vector<std::string> suffixes)
    {
      suffixes.push_back(".used.prm");
      std::error_code ignored;
      if (!fs::is_directory(output.directory, ignored))
        return;
      for (const auto &file : fs::directory_iterator(output.directory, ignored))
        {
          const std::string name = file.path().filename().string();
          if (name.rfind(output.base_name, 0) != 0)
            continue;
          const std::string rest = name.substr(output.base_name.size());
          for (const auto &suffix : suffixes)
            if (rest == suffix || (suffix == "_NNNN.vtu" && std::regex_match(rest, std::regex("_[0-9]{4}\\.vtu"))))
              fs::remove(file.path(), ignored); // a file that cannot be removed is named by the next write
        }
    }

    /// Reads "CASE.prm | --demo" and the --set pairs that follow.
    void read_case_arguments(dealii::ParameterHandler &prm, const std::vector<std::string> &args, const CaseApp &app)
    {
      AssertThrow(!args.empty(), dealii::ExcMessage("missing case file\n" + usage(app)));
      AssertThrow(args[0] == "--demo" || args[0].rfind("--", 0) != 0,
                  dealii::ExcMessage("unknown option '" + args[0] + "'\n" + usage(app)));
      if (args[0] == "--demo")
        read_parameter_text(prm, app.demo_case, "built-in demo case");
      else
        {
          read_parameter_file(prm, args[0]);
          if (entry_text(prm, "Output/Base name").empty())
            apply_override(prm, "Output/Base name=" + fs::path(args[0]).stem().string());
        }
      for (std::size_t i = 1; i < args.size(); ++i)
        {
          AssertThrow(args[i] == "--set" && i + 1 < args.size(),
                      dealii::ExcMessage("unexpected argument '" + args[i] + "'\n" + usage(app)));
          apply_override(prm, args[++i]);
        }
    }
  } // namespace

  int run_guarded(int argc, char **argv, const std::string &app_name,
                  const std::function<int(const std::vector<std::string> &, MPI_Comm)> &body)
  {
    dealii::Utilities::MPI::MPI_InitFinalize mpi(argc, argv, 1);
    dealii::deal_II_exceptions::suppress_stacktrace_in_exceptions();
    std::signal(SIGXFSZ, SIG_IGN); // a file-size limit makes the write fail with a message, not kill the run
    MPI_Comm errors;
    MPI_Comm_dup(MPI_COMM_WORLD, &errors);
    int code = 1;
    try
      {
        code = body(std::vector<std::string>(argv + 1, argv + argc), MPI_COMM_WORLD);
      }
    catch (const std::exception &e)
      {
        code = agree_or_abort(errors, app_name, user_message(e));
      }
    MPI_Comm_free(&errors);
    return code;
  }

  namespace
  {
    /// Prints the resolution report and the plausibility warnings, and checks every input. Collective.
    void preflight(const SheetCase &c, std::ostream &out, MPI_Comm comm)
    {
      run_collectively(comm, [&] {
        const ResolutionReport r = resolution_report(c);
        for (const auto &line : r.lines)
          out << "  " << line << "\n";
        for (const auto &w : plausibility_warnings(c))
          out << "WARNING: " << w << "\n";
        for (const auto &w : r.warnings)
          out << "WARNING: " << w << "\n";
        check_case_inputs(c, r);
      });
    }

    /// Takes the option @p flag (e.g. "--no-plots") out of the arguments; true if it was there.
    bool take_flag(std::vector<std::string> &args, const std::string &flag)
    {
      const auto it = std::find(args.begin(), args.end(), flag);
      if (it == args.end())
        return false;
      args.erase(it);
      return true;
    }
  } // namespace

  int run_case_app(int argc, char **argv, const CaseApp &app)
  {
    return run_guarded(argc, argv, app.name, [&](const std::vector<std::string> &given, MPI_Comm comm) {
      const bool         root = dealii::Utilities::MPI::this_mpi_process(comm) == 0;
      std::ostringstream silent;
      std::ostream      &out = root ? std::cout : silent;
      dealii::ParameterHandler prm;
      declare_sheet_case_parameters(prm);
      std::vector<std::string> args     = given;
      const bool               no_plots = take_flag(args, "--no-plots");
      const bool               quiet    = take_flag(args, "--quiet");
      if (args.empty() || args[0] == "--help" || args[0] == "-h")
        {
          out << app.name << ": " << app.description << "\n\n" << usage(app);
          return args.empty() ? 1 : 0;
        }
      if (args[0] == "--print-defaults")
        {
          prm.print_parameters(out, dealii::ParameterHandler::PRM);
          return 0;
        }
      if (const auto command = app.commands.find(args[0]); command != app.commands.end())
        {
          command->second(out);
          return 0;
        }
      const bool validate_only = args[0] == "--validate";
      if (validate_only)
        args.erase(args.begin());
      read_case_arguments(prm, args, app);
      const SheetCase sheet_case = parse_sheet_case(prm);
      out << "Case '" << sheet_case.title << "'\n";
      preflight(sheet_case, out, comm);
      if (validate_only)
        {
          out << "case file is valid: " << sheet_case.title << "\n";
          return 0;
        }
      run_collectively(comm, [&] {
        if (root)
          remove_previous_results(sheet_case.output, app.result_suffixes);
      });
      const CaseOutcome outcome = [&] {
        try
          {
            return app.run(prm, sheet_case, comm, quiet);
          }
        catch (...)
          {
            if (root) // a failed run leaves no partial result set behind
              remove_previous_results(sheet_case.output, app.result_suffixes);
            throw;
          }
      }();
      if (!outcome.results_written)
        return outcome.exit_code;
      run_collectively(comm, [&] {
        if (root)
          write_atomically(sheet_case.output.stem() + ".used.prm",
                           [&](std::ostream &s) { prm.print_parameters(s, dealii::ParameterHandler::PRM); });
      });
      if (root && !no_plots && !app.plot_script.empty())
        run_plot_script(app.plot_script, {sheet_case.output.stem()}, out);
      return outcome.exit_code;
    });
  }
} // namespace nappe

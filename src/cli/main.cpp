// The bandstack command line: parses arguments and dispatches to the library. Nothing else.
#include <chrono>
#include <cstdio>
#include <cstdlib>
#include <iostream>
#include <exception>
#include <filesystem>
#include <optional>
#include <string>

#include <unistd.h>

#include <CLI/CLI.hpp>
#include <fmt/format.h>

#include "bandstack/batch/run.hpp"
#include "bandstack/batch/run_mpi.hpp"
#include "bandstack/core/error.hpp"
#include "bandstack/core/version.hpp"
#include "bandstack/io/band_catalog.hpp"
#include "bandstack/io/band_set_file.hpp"
#include "bandstack/io/demo_study.hpp"
#include "bandstack/io/study.hpp"
#include "bandstack/report/report.hpp"
#include "bandstack/spectral/band_set_summary.hpp"

namespace {

struct Options {
  std::string study_path;
  std::string recipe;
  std::string band_set_path;
  std::string out_dir;
  std::string result_path;
  std::string report_path;
  std::size_t threads = 0;
  std::size_t chunk_columns = 256;
  int deflate = 0;
  bool restart = false;
  bool quiet = false;
  bool no_report = false;
  bool stop_on_column_error = false;
};

void add_run_options(CLI::App* command, Options& o) {
  command->add_option("--out", o.out_dir, "Folder for the result file (default: as the study says)");
  command->add_option("--threads", o.threads, "Worker threads (default: all cores)")->check(CLI::Range(1, 4096));
  command->add_option("--deflate", o.deflate, "netCDF deflate level of the result file, 0 (none, default) to 9")->check(CLI::Range(0, 9));
  command->add_option("--chunk-columns", o.chunk_columns, "Columns computed and written per block (default 256)")
      ->check(CLI::Range(1, 1000000));
  command->add_flag("--restart", o.restart, "Start afresh even if an interrupted run of the same study can be resumed");
  command->add_flag("--no-report", o.no_report, "Do not write the HTML quick-look report next to the result file");
  command->add_flag("--stop-on-column-error", o.stop_on_column_error,
                    "Stop at the first column that fails (default: record it in the file and go on)");
}

// The quick-look report of a result file; prints "wrote FILE.html".
void write_report(const std::filesystem::path& result, const std::filesystem::path& html, std::optional<double> seconds,
                  const Options& o) {
  bandstack::report::ReportOptions options;
  options.run_seconds = seconds;
  bandstack::report::write_report(result, html, options);
  if (!o.quiet) std::printf("wrote %s\n", html.string().c_str());
}

// The MPI job this process is part of (one rank without an MPI launcher); set in main.
const bandstack::batch::MpiSession* mpi = nullptr;

int run(const bandstack::io::Study& study, const Options& o) {
  const bool other_rank = mpi != nullptr && mpi->rank() != 0; // rank 0 reports for the job
  bandstack::batch::RunOptions options;
  options.threads = o.threads;
  options.output_directory = o.out_dir;
  options.chunk_columns = o.chunk_columns;
  options.deflate_level = o.deflate;
  options.resume = !o.restart;
  options.stop_on_column_error = o.stop_on_column_error;
  options.progress = !o.quiet && !other_rank && ::isatty(STDERR_FILENO) == 1;
  if (!o.quiet && !other_rank) options.note = [](std::string_view text) { std::fprintf(stderr, "bandstack: %.*s\n", static_cast<int>(text.size()), text.data()); };
  const auto start = std::chrono::steady_clock::now();
  bandstack::batch::RunOutcome outcome = mpi != nullptr ? bandstack::batch::run_study_mpi(study, options, *mpi)
                                                          : bandstack::batch::run_study(study, options);
  if (other_rank) return 0;
  outcome.seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
  if (outcome.interrupted_by != 0) {
    std::fprintf(stderr, "bandstack: interrupted after %zu of %zu columns; run the same command again to resume\n",
                 outcome.columns_written, outcome.column_count);
    return 128 + outcome.interrupted_by; // the shell's convention: 130 for SIGINT, 143 for SIGTERM
  }
  if (!o.quiet) std::fputs(bandstack::batch::format_summary(outcome).c_str(), stdout);
  else if (outcome.failed_columns > 0)
    std::fprintf(stderr, "bandstack: %zu of %zu columns failed (column_status and column_error in %s)\n",
                 outcome.failed_columns, outcome.column_count, outcome.output_file.string().c_str());
  if (!o.no_report)
    write_report(outcome.output_file, bandstack::report::default_report_path(outcome.output_file), outcome.seconds, o);
  return 0;
}

int dispatch(int argc, char** argv) {
  CLI::App app{"bandstack: spectral-band radiative transfer through many atmospheric columns.\n" +
               std::string(bandstack::caution_text())};
  app.set_version_flag("--version", std::string("bandstack ") + std::string(bandstack::version()));
  app.require_subcommand(1);
  app.fallthrough(); // global flags such as --quiet may also follow the command
  Options o;
  app.add_flag("-q,--quiet", o.quiet, "Print nothing but errors");

  CLI::App* demo = app.add_subcommand("demo", "Run the built-in demo studies (examples/tarrow_sound_demo.toml, examples/equilibrium_demo.toml)");
  add_run_options(demo, o);
  CLI::App* run_cmd = app.add_subcommand("run", "Run a study file");
  run_cmd->add_option("study", o.study_path, "Study file (TOML)")->required();
  add_run_options(run_cmd, o);
  CLI::App* check = app.add_subcommand("check", "Validate a study file without running it");
  check->add_option("study", o.study_path, "Study file (TOML)")->required();

  CLI::App* report = app.add_subcommand("report", "Write the quick-look HTML report of a result file");
  report->add_option("result", o.result_path, "Result file (netCDF) written by bandstack")->required();
  report->add_option("-o,--out", o.report_path, "HTML file to write (default: the result file with .html)");

  CLI::App* bands = app.add_subcommand("bands", "Build or inspect band sets (k-distributions)");
  bands->require_subcommand(1);
  CLI::App* bands_build = bands->add_subcommand("build", "Build a band set from a recipe");
  bands_build->add_option("recipe", o.recipe, "Build recipe (TOML file) or built-in name (default_lw, fine_lw, default_sw)")->required();
  bands_build->add_option("-o,--output", o.band_set_path, "Band-set file to write (netCDF)")->required();
  CLI::App* bands_info = bands->add_subcommand("info", "Summarise a band set");
  bands_info->add_option("band_set", o.band_set_path, "Band-set file or built-in name")->required();

  // CLI11 answers an unknown command only with "A subcommand is required": name the word instead.
  for (int i = 1; i < argc; ++i) {
    const std::string word = argv[i];
    if (word.empty() || word.front() == '-') continue;
    bool known = false;
    std::string names;
    for (const CLI::App* command : app.get_subcommands({})) {
      known = known || command->get_name() == word;
      names += (names.empty() ? "" : ", ") + command->get_name();
    }
    if (known) break;
    std::fprintf(stderr, "bandstack: error: unknown command '%s' (commands: %s; see --help)\n", word.c_str(), names.c_str());
    return static_cast<int>(bandstack::ExitCode::bad_input);
  }
  try {
    app.parse(argc, argv);
  } catch (const CLI::ParseError& e) {
    const int code = app.exit(e);
    return code == 0 ? 0 : static_cast<int>(bandstack::ExitCode::bad_input);
  }

  if (*demo) {
    if (o.out_dir.empty()) o.out_dir = "bandstack-demo";
    std::filesystem::create_directories(o.out_dir);
    for (const std::string_view text : {bandstack::io::demo_study_text(), bandstack::io::equilibrium_demo_study_text()}) {
      bandstack::io::Study study = bandstack::io::parse_study(text, "built-in demo study");
      study.source_file.clear();
      if (const int code = run(study, o); code != 0) return code;
    }
    return 0;
  }
  if (*bands_build) {
    bandstack::io::write_band_set(o.band_set_path, bandstack::io::build_band_set_from_recipe(o.recipe));
    if (!o.quiet) std::printf("wrote %s\n", o.band_set_path.c_str());
    return 0;
  }
  if (*bands_info) {
    std::fputs(bandstack::spectral::describe_band_set(bandstack::io::load_band_set(o.band_set_path)).c_str(), stdout);
    return 0;
  }
  if (*report) {
    const std::filesystem::path html =
        o.report_path.empty() ? bandstack::report::default_report_path(o.result_path) : std::filesystem::path(o.report_path);
    write_report(o.result_path, html, std::nullopt, o);
    return 0;
  }
  if (*run_cmd) return run(bandstack::io::load_study(o.study_path), o);
  if (*check) {
    const bandstack::io::Study study = bandstack::io::load_study(o.study_path);
    const bandstack::batch::StudyCheck checked = bandstack::batch::check_study(study);
    if (!o.quiet)
      std::printf("%s: ok (%zu columns, %zu layers each)\n", o.study_path.c_str(), checked.column_count, checked.layer_count);
    return 0;
  }
  return static_cast<int>(bandstack::ExitCode::bad_input);
}

} // namespace

static int main_with_errors(int argc, char** argv) {
  try {
    return dispatch(argc, argv);
  } catch (const bandstack::Error& e) {
    std::fprintf(stderr, "bandstack: error: %s\n", e.what());
    return static_cast<int>(e.exit_code());
  } catch (const std::filesystem::filesystem_error& e) {
    std::fprintf(stderr, "bandstack: error: %s\n", e.what());
    return static_cast<int>(bandstack::ExitCode::bad_input);
  } catch (const std::exception& e) {
    std::fprintf(stderr, "bandstack: internal error: %s\n", e.what());
    return static_cast<int>(bandstack::ExitCode::internal_error);
  }
}

int main(int argc, char** argv) {
  const bandstack::batch::MpiSession session(argc, argv); // MPI only when started by mpirun/srun
  mpi = &session;
  const int code = main_with_errors(argc, argv);
  if (code == 0) return 0;
  if (session.size() > 1) session.abort(code); // the other ranks may be waiting for this one
  // After a failed write (e.g. a full disk) the HDF5 library may still hold the abandoned file open, and
  // its exit handler then crashes while flushing it: leave without exit handlers once the output is out.
  std::cout.flush();
  std::fflush(nullptr);
  std::_Exit(code);
}

#pragma once
// The quick-look report: one self-contained HTML file (inline SVG and CSS, no scripts, no network)
// with the plots a researcher draws first from a result file (docs/report.md).
#include <cstddef>
#include <filesystem>
#include <optional>
#include <string>

namespace bandstack::report {

struct ReportOptions {
  // Wall-clock time of the run that wrote the result (s); shown with the run metadata when given.
  std::optional<double> run_seconds;
  // At most this many columns are drawn as profiles; a larger run shows representative ones (the
  // columns of lowest, median and highest OLR) and distributions of the per-column results.
  std::size_t max_profiles = 6;
  // At most about this many columns are read for the per-column results (distributions, sweep
  // plots); larger runs are sampled evenly along each leading dimension (statistics of 16,384
  // columns are as good as of all for a quick look). Bounds memory (about 1 MB per scalar) and time.
  std::size_t max_sampled_columns = 16384;
  // Heat maps of two-axis sweeps show at most this many cells along each axis (evenly spaced
  // values); keeps the report small for large sweeps.
  std::size_t max_heat_map_cells = 32;
};

// The report of a result file as HTML text (UTF-8). Throws FileError for a file that cannot be
// opened as netCDF and InputError (naming the file and the variable) for a netCDF file that is not a
// bandstack result.
[[nodiscard]] std::string render_report(const std::filesystem::path& result_nc, const ReportOptions& options = {});

// Renders the report and writes it to html_out atomically (io::AtomicOutput): the final name
// appears only when complete. FileError if the folder is missing or unwritable.
void write_report(const std::filesystem::path& result_nc, const std::filesystem::path& html_out,
                  const ReportOptions& options = {});

// Where the report of a result file goes by default: the same path with the extension ".html"
// (run.nc -> run.html).
[[nodiscard]] std::filesystem::path default_report_path(const std::filesystem::path& result_nc);

} // namespace bandstack::report

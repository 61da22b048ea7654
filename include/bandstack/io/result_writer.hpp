#pragma once
// Writes the results of a run to a CF-1.8 netCDF-4 file (variable names: docs/output-file.md).
#include <cstddef>
#include <filesystem>
#include <memory>
#include <span>
#include <string>
#include <vector>

#include "bandstack/batch/column_result.hpp"
#include "bandstack/io/sweep.hpp"

namespace bandstack::io {

struct PackedBlock;

// Provenance stored in the global attributes.
struct RunInfo {
  std::string title;            // the study's title
  std::string study_file;       // path of the study file, "" for the built-in demo
  std::string study_text;       // the full study text
  std::string command_line;     // what was run, for the history attribute
  std::string longwave_method;  // human-readable description of optics and angular quadrature
  std::string shortwave_method; // the same for the shortwave ("none" when not computed)
  std::vector<std::string> experiment_names; // one per experiment result of every column
  std::string equilibrium_method; // description of the equilibrium settings ("" without equilibrium)
};

// Writes all columns (they must share one level count) to `path` atomically: the file appears only
// when complete. `axes` are the leading dimensions of every per-column variable, the results in
// row-major order over them (the product of their sizes is results.size()); empty: one "column"
// axis labelled with the columns' names. An axis with labels gets a `<name>_name` text coordinate
// ("column_name" for the columns), one with values a numeric coordinate variable of its own name.
// Throws FileError for I/O failures and InputError for inconsistent columns.
void write_result_file(const std::filesystem::path& path, std::span<const batch::ColumnResult> results,
                       const RunInfo& info, std::span<const OutputAxis> axes = {});

// How the per-column variables are stored: netCDF-4 chunks of about `chunk_columns` columns along
// the leading dimensions, compressed with deflate `deflate_level` (0 = none, 1..9; with shuffle).
struct StorageSettings {
  int deflate_level = 0;
  std::size_t chunk_columns = 256;
};

// A result file written block of columns by block of columns, so that a run never holds more than
// one block of results. The file (every dimension, coordinate, variable and attribute) is defined
// when it is created; write_block fills the per-column variables of consecutive columns (flat
// indices in row-major order over `axes`). The file is written in place: use it on a temporary
// (io::AtomicOutput or a resumable run's working file) and move it into place when complete.
class ResultFileWriter {
public:
  // Creates `path` (replacing any file there) for the columns of `axes` (not empty; the product of
  // their sizes is the number of columns). `sample` is any one result of the run: it tells which
  // variables exist, the level count and the bands. FileError on I/O failure.
  ResultFileWriter(const std::filesystem::path& path, const batch::ColumnResult& sample, const RunInfo& info,
                   std::span<const OutputAxis> axes, const StorageSettings& storage = {});
  // Opens a file created before with the same sample shape and axes, to continue filling it.
  // FileError if it cannot be opened or does not have the variables and dimensions expected.
  [[nodiscard]] static ResultFileWriter reopen(const std::filesystem::path& path, const batch::ColumnResult& sample,
                                               const RunInfo& info, std::span<const OutputAxis> axes);
  ResultFileWriter(ResultFileWriter&&) noexcept;
  ResultFileWriter& operator=(ResultFileWriter&&) noexcept;
  ~ResultFileWriter();

  // Writes the results of the columns first, first + 1, ... (flat indices). InputError if a column
  // has another level count than the sample; InternalError if its bands or variables differ.
  void write_block(std::size_t first, std::span<const batch::ColumnResult> results);
  // Writes a block packed by a ResultPacker of the same shape, info and axes (result_packing.hpp):
  // the same file contents as write_block of the results it was packed from. A block of failed
  // columns only may come without values (packed where no shape was known yet).
  void write_packed(const PackedBlock& block);
  // Flushes everything written so far to disk (nc_sync, then fsync).
  void sync();
  // Closes the file (also done by the destructor, which ignores errors).
  void close();

  struct Impl; // the open file and its variable table (result_stream.cpp)

private:
  explicit ResultFileWriter(std::unique_ptr<Impl> impl);
  std::unique_ptr<Impl> impl_;
};

} // namespace bandstack::io

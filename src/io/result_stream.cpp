// io::ResultFileWriter: defines a result file once, then fills it block of columns by block.
#include <algorithm>
#include <cerrno>
#include <cstdint>
#include <cstring>
#include <limits>

#include <fcntl.h>
#include <sys/statvfs.h>
#include <unistd.h>

#include <fmt/format.h>

#include "bandstack/core/error.hpp"
#include "bandstack/io/result_packing.hpp"
#include "bandstack/io/result_writer.hpp"
#include "io/flat_range.hpp"
#include "io/result_define.hpp"

namespace bandstack::io {

using detail::R;
using detail::Storage;
using detail::Table;
using detail::Variable;

struct ResultFileWriter::Impl {
  std::filesystem::path path;
  netCDF::NcFile file;
  Table table;
  std::vector<netCDF::NcVar> vars;          // the per-column variables, in table order
  std::vector<const Variable*> described;   // their descriptions
  std::vector<std::size_t> lead_shape;
  ResultShape shape;                         // what every computed result written must look like
  netCDF::NcVar error_var;                   // column_error: written only for failed columns
};

namespace detail {

void column_values(const Variable& v, std::span<const R> results, std::vector<double>& data) {
  data.resize(results.size() * v.values_per_column);
  for (std::size_t i = 0; i < results.size(); ++i) {
    double* out = data.data() + i * v.values_per_column;
    if (!results[i].failed() || v.of_failed_columns) v.get(results[i], out);
    else // missing: NaN, or netCDF's default fill value of a byte variable (NC_FILL_BYTE)
      std::fill(out, out + v.values_per_column, v.storage == Storage::i8 ? -127.0 : std::numeric_limits<double>::quiet_NaN());
  }
}

} // namespace detail

namespace {

// Leading chunk sizes: about `columns` columns, but at least ~64 KiB per chunk (narrow variables
// would otherwise make many tiny chunks whose index HDF5 keeps in memory) and at most ~4 MiB;
// whole inner axes first.
std::vector<std::size_t> chunk_shape(const std::vector<std::size_t>& lead, std::size_t values_per_column,
                                     std::size_t columns, const Table& table, const Variable& v) {
  const std::size_t max_columns = std::max<std::size_t>(1, (std::size_t{4} << 20) / (8 * values_per_column));
  const std::size_t min_columns = std::max<std::size_t>(1, (std::size_t{64} << 10) / (8 * values_per_column));
  std::size_t remaining = std::clamp<std::size_t>(std::max(columns, min_columns), 1, max_columns);
  std::vector<std::size_t> chunk(lead.size());
  for (std::size_t d = lead.size(); d-- > 0;) {
    chunk[d] = std::max<std::size_t>(1, std::min(lead[d], remaining));
    remaining = std::max<std::size_t>(1, remaining / chunk[d]);
  }
  for (const std::string& d : v.dims) chunk.push_back(table.dim_size(d));
  return chunk;
}

// Characters of column_error per column (longer messages are cut).
constexpr std::size_t error_length = 256;

// column_error(<leading dims>, error_length): the message of each failed column; never written for
// the others, so that its chunks are not even stored when no column fails.
netCDF::NcVar define_error_variable(netCDF::NcFile& file, const std::vector<netCDF::NcDim>& lead, const Table& table,
                                    const std::vector<std::size_t>& lead_shape) {
  std::vector<netCDF::NcDim> dims = lead;
  dims.push_back(file.addDim("error_length", error_length));
  netCDF::NcVar var = file.addVar("column_error", netCDF::ncChar, dims);
  std::vector<std::size_t> chunk(lead_shape.size(), 1);
  chunk.push_back(error_length);
  var.setChunking(netCDF::NcVar::nc_CHUNKED, chunk);
  var.putAtt("long_name", "why the column failed (empty for computed columns)");
  if (!table.coordinates.empty()) var.putAtt("coordinates", table.coordinates);
  return var;
}

// The leading indices of flat column `flat` (row-major).
std::vector<std::size_t> unflatten(std::size_t flat, const std::vector<std::size_t>& shape) {
  std::vector<std::size_t> index(shape.size());
  for (std::size_t d = shape.size(); d-- > 0;) {
    index[d] = flat % shape[d];
    flat /= shape[d];
  }
  return index;
}

// The file a working file ".<name>.partial" stands for (the path itself for any other name).
std::filesystem::path final_name(const std::filesystem::path& path) {
  const std::string name = path.filename().string();
  const std::string suffix = ".partial";
  if (name.size() > suffix.size() + 1 && name.front() == '.' && name.ends_with(suffix))
    return path.parent_path() / name.substr(1, name.size() - 1 - suffix.size());
  return path;
}

// A write error: HDF5 reports a full disk only as "HDF error"; say what happened when the folder
// has no room left (or errno says so), naming the result file.
FileError netcdf_error(const std::filesystem::path& path, const netCDF::exceptions::NcException& e) {
  const int error = errno;
  struct statvfs fs {};
  const std::filesystem::path folder = path.has_parent_path() ? path.parent_path() : std::filesystem::path(".");
  const bool full = error == ENOSPC || error == EDQUOT ||
                    (::statvfs(folder.c_str(), &fs) == 0 && fs.f_bavail * fs.f_frsize < (std::uint64_t{1} << 20));
  if (full)
    return FileError(final_name(path).string(),
                     fmt::format("the disk is full: no space left in '{}' for the result (its working file {} is "
                                 "removed)",
                                 folder.string(), path.filename().string()));
  return FileError(final_name(path).string(), fmt::format("netCDF error while writing {}: {}", path.filename().string(),
                                                          first_line(e.what())));
}

} // namespace

ResultFileWriter::ResultFileWriter(std::unique_ptr<Impl> impl) : impl_(std::move(impl)) {}
ResultFileWriter::ResultFileWriter(ResultFileWriter&&) noexcept = default;
ResultFileWriter& ResultFileWriter::operator=(ResultFileWriter&&) noexcept = default;
ResultFileWriter::~ResultFileWriter() {
  try {
    if (impl_) impl_->file.close();
  } catch (...) { // NOLINT(bugprone-empty-catch): closing after an error; the error is reported already
  }
}

ResultFileWriter::ResultFileWriter(const std::filesystem::path& path, const R& sample, const RunInfo& info,
                                   std::span<const OutputAxis> axes, const StorageSettings& storage)
    : impl_(std::make_unique<Impl>()) {
  if (axes.empty()) throw InternalError("a result file needs at least one leading axis");
  Impl& m = *impl_;
  m.path = path;
  m.shape = ResultShape::of(sample);
  m.table = detail::describe_result(m.shape.sample(), info, axes);
  for (const OutputAxis& a : axes) m.lead_shape.push_back(a.size);
  try {
    m.file.open(path.string(), netCDF::NcFile::replace, netCDF::NcFile::nc4);
    const std::vector<netCDF::NcDim> lead = detail::define_axes(m.file, axes);
    for (const auto& [name, size] : m.table.dims) m.file.addDim(name, size);
    for (const Variable& v : m.table.variables) {
      std::vector<netCDF::NcDim> dims = v.per_column ? lead : std::vector<netCDF::NcDim>{};
      for (const std::string& d : v.dims) dims.push_back(m.file.getDim(d));
      const netCDF::NcType type = v.storage == Storage::f64  ? netCDF::NcType(netCDF::ncDouble)
                                 : v.storage == Storage::i8 ? netCDF::NcType(netCDF::ncByte)
                                                            : netCDF::NcType(netCDF::ncChar);
      netCDF::NcVar var = m.file.addVar(v.name, type, dims);
      if (v.per_column) {
        std::vector<std::size_t> chunk = chunk_shape(m.lead_shape, v.values_per_column, storage.chunk_columns, m.table, v);
        var.setChunking(netCDF::NcVar::nc_CHUNKED, chunk);
        // Blocks are written once, in order: a cache of two chunks per variable is enough, and keeps
        // the library's memory independent of the number of columns (HDF5's default per-variable
        // cache otherwise keeps written chunks, growing with the file up to its size limit).
        std::size_t chunk_bytes = v.storage == Storage::f64 ? sizeof(double) : 1;
        for (std::size_t n : chunk) chunk_bytes *= n;
        var.setChunkCache(2 * chunk_bytes, 7, 1.0f);
        if (storage.deflate_level > 0) var.setCompression(true, true, std::clamp(storage.deflate_level, 1, 9));
      }
      if (v.fill_nan) var.setFill(true, std::numeric_limits<double>::quiet_NaN());
      if (!v.flag_values.empty()) var.putAtt("flag_values", netCDF::ncByte, v.flag_values.size(), v.flag_values.data());
      for (const auto& [key, value] : v.attributes) var.putAtt(key, value);
      if (!v.per_column) {
        if (v.storage == Storage::text) var.putVar(v.text.data());
        else var.putVar(v.values.data());
      } else {
        m.vars.push_back(var);
        m.described.push_back(&v);
      }
    }
    m.error_var = define_error_variable(m.file, lead, m.table, m.lead_shape);
    detail::put_global_attributes(m.file, info);
  } catch (const netCDF::exceptions::NcException& e) {
    throw netcdf_error(path, e);
  }
}

ResultFileWriter ResultFileWriter::reopen(const std::filesystem::path& path, const R& sample, const RunInfo& info,
                                          std::span<const OutputAxis> axes) {
  auto m = std::make_unique<Impl>();
  m->path = path;
  m->shape = ResultShape::of(sample);
  m->table = detail::describe_result(m->shape.sample(), info, axes);
  for (const OutputAxis& a : axes) m->lead_shape.push_back(a.size);
  try {
    m->file.open(path.string(), netCDF::NcFile::write);
    for (const Variable& v : m->table.variables) {
      if (!v.per_column) continue;
      netCDF::NcVar var = m->file.getVar(v.name);
      if (var.isNull() || var.getDimCount() != static_cast<int>(m->lead_shape.size() + v.dims.size()))
        throw FileError(path.string(), "the unfinished result file does not have the variable " + v.name + " as expected");
      for (std::size_t d = 0; d < m->lead_shape.size(); ++d)
        if (var.getDim(static_cast<int>(d)).getSize() != m->lead_shape[d])
          throw FileError(path.string(), "the unfinished result file has other dimensions than this run");
      m->vars.push_back(var);
      m->described.push_back(&v);
    }
    m->error_var = m->file.getVar("column_error");
    if (m->error_var.isNull())
      throw FileError(path.string(), "the unfinished result file does not have the variable column_error as expected");
  } catch (const netCDF::exceptions::NcException& e) {
    throw FileError(path.string(), std::string("cannot reopen the unfinished result file: ") + first_line(e.what()));
  }
  return ResultFileWriter(std::move(m));
}

namespace {

// Writes the values of per-column variable k for the columns [first, first + count) (data: column
// after column) as the hyperslabs of the flat range.
void write_variable(ResultFileWriter::Impl& m, std::size_t k, const std::vector<detail::Hyperslab>& slabs,
                    const double* data, std::vector<signed char>& bytes) {
  const Variable& v = *m.described[k];
  std::size_t total = 0;
  for (const detail::Hyperslab& slab : slabs) {
    std::size_t columns = 1;
    for (std::size_t c : slab.count) columns *= c;
    total += columns * v.values_per_column;
  }
  if (v.storage == Storage::i8) bytes.assign(data, data + total);
  std::size_t offset = 0;
  for (const detail::Hyperslab& slab : slabs) {
    std::vector<std::size_t> start = slab.start, count = slab.count;
    std::size_t columns = 1;
    for (std::size_t c : slab.count) columns *= c;
    for (const std::string& d : v.dims) {
      start.push_back(0);
      count.push_back(m.table.dim_size(d));
    }
    if (v.storage == Storage::i8) m.vars[k].putVar(start, count, bytes.data() + offset);
    else m.vars[k].putVar(start, count, data + offset);
    offset += columns * v.values_per_column;
  }
}

// column_error of flat column `flat`.
void write_error(ResultFileWriter::Impl& m, std::size_t flat, const std::string& error) {
  std::string text = error.substr(0, error_length);
  text.resize(error_length, '\0');
  std::vector<std::size_t> start = unflatten(flat, m.lead_shape), count(m.lead_shape.size(), 1);
  start.push_back(0);
  count.push_back(error_length);
  m.error_var.putVar(start, count, text.data());
}

} // namespace

void ResultFileWriter::write_block(std::size_t first, std::span<const R> results) {
  Impl& m = *impl_;
  for (std::size_t i = 0; i < results.size(); ++i)
    if (!results[i].failed()) m.shape.check(results[i], first + i, m.path.string());
  const std::vector<detail::Hyperslab> slabs = detail::flat_range_slabs(m.lead_shape, first, results.size());
  std::vector<double> data;
  std::vector<signed char> bytes;
  try {
    for (std::size_t k = 0; k < m.vars.size(); ++k) {
      detail::column_values(*m.described[k], results, data);
      write_variable(m, k, slabs, data.data(), bytes);
    }
    for (std::size_t i = 0; i < results.size(); ++i)
      if (results[i].failed()) write_error(m, first + i, results[i].error);
  } catch (const netCDF::exceptions::NcException& e) {
    throw netcdf_error(m.path, e);
  }
}

void ResultFileWriter::write_packed(const PackedBlock& block) {
  Impl& m = *impl_;
  std::size_t expected = 0;
  for (const Variable* v : m.described) expected += block.count * v->values_per_column;
  if (block.values.empty() && expected > 0 && block.status.size() == block.count &&
      std::none_of(block.status.begin(), block.status.end(), [](signed char s) { return s == 0; })) {
    // A block whose every column failed, packed without a shape: its values are all missing.
    PackedBlock full = block;
    std::vector<double> data;
    std::vector<R> failed(block.count);
    for (std::size_t i = 0; i < block.count; ++i) {
      failed[i].status = static_cast<batch::ColumnStatus>(block.status[i]);
      failed[i].error = block.errors[i];
    }
    for (const Variable* v : m.described) {
      detail::column_values(*v, failed, data);
      full.values.insert(full.values.end(), data.begin(), data.end());
    }
    write_packed(full);
    return;
  }
  if (block.values.size() != expected || block.status.size() != block.count || block.errors.size() != block.count)
    throw InternalError(fmt::format("a packed block of {} columns has {} values, expected {}", block.count,
                                    block.values.size(), expected));
  const std::vector<detail::Hyperslab> slabs = detail::flat_range_slabs(m.lead_shape, block.first, block.count);
  std::vector<signed char> bytes;
  try {
    std::size_t offset = 0;
    for (std::size_t k = 0; k < m.vars.size(); ++k) {
      write_variable(m, k, slabs, block.values.data() + offset, bytes);
      offset += block.count * m.described[k]->values_per_column;
    }
    for (std::size_t i = 0; i < block.count; ++i)
      if (block.status[i] != 0) write_error(m, block.first + i, block.errors[i]);
  } catch (const netCDF::exceptions::NcException& e) {
    throw netcdf_error(m.path, e);
  }
}

void ResultFileWriter::sync() {
  Impl& m = *impl_;
  try {
    m.file.sync();
  } catch (const netCDF::exceptions::NcException& e) {
    throw netcdf_error(m.path, e);
  }
  const int fd = ::open(m.path.c_str(), O_RDONLY);
  if (fd < 0 || ::fsync(fd) != 0) {
    if (fd >= 0) ::close(fd);
    throw FileError(m.path.string(), std::string("cannot flush the output to disk: ") + std::strerror(errno));
  }
  ::close(fd);
}

void ResultFileWriter::close() {
  try {
    impl_->file.close();
  } catch (const netCDF::exceptions::NcException& e) {
    throw netcdf_error(impl_->path, e);
  }
}

} // namespace bandstack::io

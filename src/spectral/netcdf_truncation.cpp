// The classic netCDF header (CDF-1, CDF-2 and CDF-5; format in the netCDF Users Guide, "File Format
// Specification"), parsed only as far as needed for the data length of every variable.
#include "spectral/netcdf_truncation.hpp"

#include <algorithm>
#include <array>
#include <cmath>
#include <fstream>
#include <vector>

#include <fmt/format.h>

#include "bandstack/core/error.hpp"

namespace bandstack::spectral::detail {

namespace {

constexpr std::uint64_t max_header_bytes = std::uint64_t{64} << 20; // read at most this much of the header

// Reads big-endian fields from the header bytes; every read past the end sets `ok` to false.
struct Cursor {
  const std::vector<unsigned char>& bytes;
  std::size_t at = 0;
  bool ok = true;

  std::uint64_t read(std::size_t width) {
    if (!ok || bytes.size() - at < width) {
      ok = false;
      return 0;
    }
    std::uint64_t value = 0;
    for (std::size_t i = 0; i < width; ++i) value = (value << 8) | bytes[at + i];
    at += width;
    return value;
  }
  void skip(std::uint64_t n) {
    if (!ok || bytes.size() - at < n) ok = false;
    else at += static_cast<std::size_t>(n);
  }
};

std::uint64_t padded(std::uint64_t n) { return n > ~std::uint64_t{0} - 3 ? ~std::uint64_t{0} : (n + 3) / 4 * 4; }

// Bytes per value of a classic nc_type (NC_BYTE = 1 ... NC_UINT64 = 11); 0 for an unknown type.
std::uint64_t type_size(std::uint64_t type) {
  constexpr std::array<std::uint64_t, 12> sizes{0, 1, 1, 2, 4, 4, 8, 1, 2, 4, 8, 8};
  return type < sizes.size() ? sizes[type] : 0;
}

struct Variable {
  std::vector<std::uint64_t> dimids;
  std::uint64_t type = 0;
  std::uint64_t begin = 0;
};

} // namespace

std::optional<ClassicHeader> read_classic_header(const std::filesystem::path& path) {
  std::ifstream in(path, std::ios::binary);
  std::vector<unsigned char> bytes(4);
  if (!in.read(reinterpret_cast<char*>(bytes.data()), 4)) return std::nullopt;
  if (bytes[0] != 'C' || bytes[1] != 'D' || bytes[2] != 'F' || (bytes[3] != 1 && bytes[3] != 2 && bytes[3] != 5))
    return std::nullopt;
  const int version = bytes[3];
  std::error_code ec;
  const std::uintmax_t size = std::filesystem::file_size(path, ec);
  if (ec) return std::nullopt;
  bytes.resize(static_cast<std::size_t>(std::min<std::uint64_t>(size, max_header_bytes)));
  in.read(reinterpret_cast<char*>(bytes.data()) + 4, static_cast<std::streamsize>(bytes.size() - 4));

  Cursor c{bytes, 4};
  const std::size_t count_width = version == 5 ? 8 : 4;
  const std::uint64_t numrecs = c.read(count_width);
  // Names longer than netCDF's NC_MAX_NAME (256) are damage: the C++ interface copies names into
  // buffers of that size (a fuzzed header overflowed one).
  const auto name = [&] {
    const std::uint64_t n = c.read(count_width);
    if (n > 256) c.ok = false;
    c.skip(padded(n));
  };
  const auto list_length = [&](std::uint64_t tag) {
    const std::uint64_t found = c.read(4), n = c.read(count_width);
    if (found != tag && !(found == 0 && n == 0)) c.ok = false;
    return c.ok ? n : 0;
  };
  const auto attributes = [&] {
    for (std::uint64_t n = list_length(0x0C), i = 0; c.ok && i < n; ++i) {
      name();
      const std::uint64_t bytes_per_value = type_size(c.read(4));
      const std::uint64_t values = c.read(count_width);
      if (bytes_per_value == 0 || values > max_header_bytes) c.ok = false;
      c.skip(padded(values * bytes_per_value));
    }
  };

  std::vector<std::uint64_t> dims;
  for (std::uint64_t n = list_length(0x0A), i = 0; c.ok && i < n; ++i) {
    name();
    dims.push_back(c.read(count_width));
  }
  attributes();
  std::vector<Variable> vars;
  for (std::uint64_t n = list_length(0x0B), i = 0; c.ok && i < n; ++i) {
    name();
    Variable v;
    for (std::uint64_t d = c.read(count_width), k = 0; c.ok && k < d; ++k) v.dimids.push_back(c.read(count_width));
    attributes();
    v.type = c.read(4);
    c.read(count_width); // vsize: not trusted (it saturates for large variables); computed below
    v.begin = c.read(version == 1 ? 4 : 8);
    vars.push_back(std::move(v));
  }
  const ClassicHeader damaged{true, 0};
  if (!c.ok) {
    if (bytes.size() < size) return std::nullopt; // the header goes on past the part read
    return damaged;
  }

  // Data bytes of one variable (one record of a record variable), in floating point: no overflow.
  const auto data_bytes = [&](const Variable& v, bool& record) -> std::optional<double> {
    double n = static_cast<double>(type_size(v.type));
    record = false;
    for (std::size_t k = 0; k < v.dimids.size(); ++k) {
      if (v.dimids[k] >= dims.size()) return std::nullopt;
      const std::uint64_t length = dims[v.dimids[k]];
      if (length == 0 && k == 0) record = true; // the unlimited dimension, first
      else n *= static_cast<double>(length);
    }
    return n;
  };
  double record_size = 0.0, end = static_cast<double>(c.at);
  std::size_t record_vars = 0;
  for (const Variable& v : vars) {
    bool record = false;
    const auto n = data_bytes(v, record);
    if (!n || type_size(v.type) == 0) return damaged;
    if (record) {
      record_size += std::ceil(*n / 4.0) * 4.0; // in double: a damaged header's sizes overflow integers
      ++record_vars;
    } else {
      end = std::max(end, static_cast<double>(v.begin) + *n);
    }
  }
  const bool streaming = numrecs == (version == 5 ? ~std::uint64_t{0} : 0xFFFFFFFFu);
  if (record_vars > 0 && numrecs > 0 && !streaming)
    for (const Variable& v : vars) {
      bool record = false;
      const double n = *data_bytes(v, record);
      if (!record) continue;
      // One record variable alone is stored without padding between records.
      const double stride = record_vars == 1 ? n : record_size;
      end = std::max(end, static_cast<double>(v.begin) + static_cast<double>(numrecs - 1) * stride + n);
    }
  return ClassicHeader{false, end >= 1.8e19 ? ~std::uint64_t{0} : static_cast<std::uint64_t>(end)};
}

void check_classic_file(const std::filesystem::path& path, const std::string& file) {
  const auto header = read_classic_header(path);
  if (!header) return;
  InputPlace place;
  place.file = file;
  if (header->damaged)
    throw InputError(place, "damaged netCDF file: its header describes more than the whole file holds, or an unknown "
                            "type");
  std::error_code ec;
  const std::uintmax_t size = std::filesystem::file_size(path, ec);
  if (!ec && size < header->data_end)
    throw InputError(place, fmt::format("the file is {} bytes long, but its header describes {} bytes of data: truncated "
                                        "(e.g. an interrupted copy) or never completely written",
                                        size, header->data_end));
}

} // namespace bandstack::spectral::detail

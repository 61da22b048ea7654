// Results as plain numbers for moving them between processes (io/result_packing.hpp).
#include "bandstack/io/result_packing.hpp"

#include <cstring>

#include <fmt/format.h>

#include "bandstack/core/error.hpp"
#include "io/result_define.hpp"

namespace bandstack::io {

using batch::ColumnResult;

ResultShape ResultShape::of(const ColumnResult& r) {
  ResultShape s;
  s.layers = r.column.layer_count();
  s.lw_band_lower_cm1 = r.longwave.band_lower_cm1;
  s.lw_band_upper_cm1 = r.longwave.band_upper_cm1;
  s.shortwave = r.has_shortwave();
  s.sw_band_lower_cm1 = r.shortwave.band_lower_cm1;
  s.sw_band_upper_cm1 = r.shortwave.band_upper_cm1;
  s.equilibrium = r.equilibrium.has_value();
  s.experiments = r.experiments.size();
  s.attribution = r.attribution.has_value();
  s.attribution_bands = r.attribution ? r.attribution->band_removal_w_m2.size() : 0;
  return s;
}

ColumnResult ResultShape::sample() const {
  ColumnResult r;
  r.column.pressure_level_pa.assign(layers + 1, 0.0);
  r.column.pressure_layer_pa.assign(layers, 0.0);
  r.longwave.band_lower_cm1 = lw_band_lower_cm1;
  r.longwave.band_upper_cm1 = lw_band_upper_cm1;
  if (shortwave) r.shortwave.flux_up.assign(layers + 1, 0.0);
  r.shortwave.band_lower_cm1 = sw_band_lower_cm1;
  r.shortwave.band_upper_cm1 = sw_band_upper_cm1;
  if (equilibrium) r.equilibrium.emplace();
  r.experiments.resize(experiments);
  if (attribution) {
    r.attribution.emplace();
    r.attribution->band_removal_w_m2.assign(attribution_bands, 0.0);
    r.attribution->band_addition_w_m2.assign(attribution_bands, 0.0);
  }
  return r;
}

void ResultShape::check(const ColumnResult& r, std::size_t flat_index, const std::string& file) const {
  const ResultShape s = of(r);
  if (s.layers != layers)
    throw InputError(InputPlace{file, "level", {}, {}, static_cast<long>(flat_index), {}},
                     fmt::format("all columns of one file need the same number of levels ({} here, {} in the others)",
                                 s.layers + 1, layers + 1));
  if (s.encode() != encode())
    throw InternalError(fmt::format("column {} has other bands or results than the first column of the file", flat_index));
}

namespace {

void put_list(std::vector<double>& out, const std::vector<double>& values) {
  out.push_back(static_cast<double>(values.size()));
  out.insert(out.end(), values.begin(), values.end());
}

// Reads numbers in order; InputError when they run out or a count is not a count.
struct NumberReader {
  std::span<const double> numbers;
  std::size_t at = 0;
  double next() {
    if (at >= numbers.size()) throw InputError("a packed result shape ends early");
    return numbers[at++];
  }
  std::size_t count() {
    const double v = next();
    if (!(v >= 0.0 && v <= 1e9 && v == static_cast<double>(static_cast<std::size_t>(v))))
      throw InputError(fmt::format("a packed result shape holds {} where a count belongs", v));
    return static_cast<std::size_t>(v);
  }
  std::vector<double> list() {
    const std::size_t n = count();
    if (n > numbers.size() - at) throw InputError("a packed result shape ends early");
    std::vector<double> v(numbers.begin() + static_cast<long>(at), numbers.begin() + static_cast<long>(at + n));
    at += n;
    return v;
  }
};

} // namespace

std::vector<double> ResultShape::encode() const {
  std::vector<double> out{static_cast<double>(layers)};
  put_list(out, lw_band_lower_cm1);
  put_list(out, lw_band_upper_cm1);
  out.push_back(shortwave ? 1.0 : 0.0);
  put_list(out, sw_band_lower_cm1);
  put_list(out, sw_band_upper_cm1);
  out.push_back(equilibrium ? 1.0 : 0.0);
  out.push_back(static_cast<double>(experiments));
  out.push_back(attribution ? 1.0 : 0.0);
  out.push_back(static_cast<double>(attribution_bands));
  return out;
}

ResultShape ResultShape::decode(std::span<const double> numbers) {
  NumberReader r{numbers};
  ResultShape s;
  s.layers = r.count();
  s.lw_band_lower_cm1 = r.list();
  s.lw_band_upper_cm1 = r.list();
  s.shortwave = r.count() != 0;
  s.sw_band_lower_cm1 = r.list();
  s.sw_band_upper_cm1 = r.list();
  s.equilibrium = r.count() != 0;
  s.experiments = r.count();
  s.attribution = r.count() != 0;
  s.attribution_bands = r.count();
  if (r.at != numbers.size()) throw InputError("a packed result shape has numbers left over");
  return s;
}

namespace {

template <class T> void put_raw(std::vector<char>& out, const T* data, std::size_t n) {
  if (n == 0) return;
  const std::size_t at = out.size();
  out.resize(at + n * sizeof(T));
  std::memcpy(out.data() + at, data, n * sizeof(T));
}

struct ByteReader {
  std::span<const char> bytes;
  std::size_t at = 0;
  template <class T> void get(T* data, std::size_t n) {
    if (n > (bytes.size() - at) / sizeof(T)) throw InputError("a packed block ends early");
    std::memcpy(data, bytes.data() + at, n * sizeof(T));
    at += n * sizeof(T);
  }
  std::uint64_t size() {
    std::uint64_t v = 0;
    get(&v, 1);
    return v;
  }
};

} // namespace

std::vector<char> PackedBlock::to_bytes() const {
  std::vector<char> out;
  const std::uint64_t head[4] = {first, count, values.size(), errors.size()};
  put_raw(out, head, 4);
  put_raw(out, values.data(), values.size());
  put_raw(out, status.data(), status.size());
  for (const std::string& e : errors) {
    const std::uint64_t n = e.size();
    put_raw(out, &n, 1);
    put_raw(out, e.data(), e.size());
  }
  return out;
}

PackedBlock PackedBlock::from_bytes(std::span<const char> bytes) {
  ByteReader r{bytes};
  PackedBlock b;
  b.first = r.size();
  b.count = r.size();
  const std::uint64_t n_values = r.size(), n_errors = r.size();
  if (n_values > bytes.size() / sizeof(double) || n_errors != b.count) throw InputError("a packed block is malformed");
  b.values.resize(n_values);
  r.get(b.values.data(), b.values.size());
  b.status.resize(b.count);
  r.get(b.status.data(), b.status.size());
  b.errors.resize(b.count);
  for (std::string& e : b.errors) {
    const std::uint64_t n = r.size();
    if (n > bytes.size()) throw InputError("a packed block is malformed");
    e.resize(n);
    r.get(e.data(), n);
  }
  if (r.at != bytes.size()) throw InputError("a packed block has bytes left over");
  return b;
}

struct ResultPacker::Impl {
  ResultShape shape;
  detail::Table table;
  std::vector<const detail::Variable*> variables; // the per-column ones, in table order
};

ResultPacker::ResultPacker(const ResultShape& shape, const RunInfo& info, std::span<const OutputAxis> axes)
    : impl_(std::make_unique<Impl>()) {
  impl_->shape = shape;
  impl_->table = detail::describe_result(shape.sample(), info, axes);
  for (const detail::Variable& v : impl_->table.variables)
    if (v.per_column) impl_->variables.push_back(&v);
}
ResultPacker::~ResultPacker() = default;
ResultPacker::ResultPacker(ResultPacker&&) noexcept = default;
ResultPacker& ResultPacker::operator=(ResultPacker&&) noexcept = default;

PackedBlock ResultPacker::pack(std::size_t first, std::span<const ColumnResult> results) const {
  const Impl& m = *impl_;
  for (std::size_t i = 0; i < results.size(); ++i)
    if (!results[i].failed()) m.shape.check(results[i], first + i, "");
  PackedBlock block;
  block.first = first;
  block.count = results.size();
  std::vector<double> data;
  for (const detail::Variable* v : m.variables) {
    detail::column_values(*v, results, data);
    block.values.insert(block.values.end(), data.begin(), data.end());
  }
  for (const ColumnResult& r : results) {
    block.status.push_back(static_cast<signed char>(r.status));
    block.errors.push_back(r.failed() ? r.error : std::string());
  }
  return block;
}

} // namespace bandstack::io

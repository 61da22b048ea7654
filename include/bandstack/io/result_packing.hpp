#pragma once
// Results of a block of columns as plain numbers, to move them between processes (MPI runs): the
// shape that defines a result file's variables, and a block's per-column values in the order the
// file's variables take them. ResultFileWriter writes a packed block exactly as it writes the
// results themselves (it packs them the same way).
#include <cstddef>
#include <memory>
#include <span>
#include <string>
#include <vector>

#include "bandstack/batch/column_result.hpp"
#include "bandstack/io/result_writer.hpp"

namespace bandstack::io {

// What a run's results look like: everything the file's variables depend on, and no values.
struct ResultShape {
  std::size_t layers = 0;
  std::vector<double> lw_band_lower_cm1, lw_band_upper_cm1; // empty: no longwave bands
  bool shortwave = false;
  std::vector<double> sw_band_lower_cm1, sw_band_upper_cm1;
  bool equilibrium = false;
  std::size_t experiments = 0;
  bool attribution = false;
  std::size_t attribution_bands = 0;

  // The shape of a computed (not failed) result.
  [[nodiscard]] static ResultShape of(const batch::ColumnResult& result);
  // That a computed result has this shape: InputError (naming `file` and the flat column index)
  // for another level count, InternalError for other bands or results.
  void check(const batch::ColumnResult& result, std::size_t flat_index, const std::string& file) const;
  // A result of this shape with every value zero (what the file's variables are defined from).
  [[nodiscard]] batch::ColumnResult sample() const;
  // As numbers, and back (InputError if the numbers are not a shape).
  [[nodiscard]] std::vector<double> encode() const;
  [[nodiscard]] static ResultShape decode(std::span<const double> numbers);
};

// A block of columns: per variable of the file (in the file's order), the columns' values one after
// the other; each column's status, and the errors of the failed ones.
struct PackedBlock {
  std::size_t first = 0; // flat index of the block's first column
  std::size_t count = 0;
  std::vector<double> values;
  std::vector<signed char> status;        // batch::ColumnStatus per column
  std::vector<std::string> errors;        // per column, empty for computed ones

  // As bytes, and back (InputError if the bytes are not a packed block).
  [[nodiscard]] std::vector<char> to_bytes() const;
  [[nodiscard]] static PackedBlock from_bytes(std::span<const char> bytes);
};

// Packs blocks for a file of `shape` and these axes (the same variables ResultFileWriter defines).
class ResultPacker {
public:
  ResultPacker(const ResultShape& shape, const RunInfo& info, std::span<const OutputAxis> axes);
  ~ResultPacker();
  ResultPacker(ResultPacker&&) noexcept;
  ResultPacker& operator=(ResultPacker&&) noexcept;
  // The block of `results` starting at flat column `first`. InputError if a computed result has
  // another level count than the shape; InternalError if its bands or variables differ.
  [[nodiscard]] PackedBlock pack(std::size_t first, std::span<const batch::ColumnResult> results) const;

private:
  struct Impl;
  std::unique_ptr<Impl> impl_;
};

} // namespace bandstack::io

#pragma once
// Private to io: a run of consecutive flat indices over row-major dimensions, as a few hyperslabs.
#include <cstddef>
#include <span>
#include <vector>

namespace bandstack::io::detail {

// A box of an n-dimensional array: start index and count along each dimension.
struct Hyperslab {
  std::vector<std::size_t> start;
  std::vector<std::size_t> count;
};

// The boxes that together hold the flat (row-major) indices [first, first + count) of an array of
// `shape`, in increasing flat order, so that the values of consecutive flat indices fill them one
// after the other. At most 2 * shape.size() - 1 boxes. Throws InternalError if the range does not
// fit in the array. An empty shape is one point (first = 0, count = 1).
[[nodiscard]] std::vector<Hyperslab> flat_range_slabs(std::span<const std::size_t> shape, std::size_t first,
                                                      std::size_t count);

} // namespace bandstack::io::detail

#include "io/flat_range.hpp"

#include <string>

#include "bandstack/core/error.hpp"

namespace bandstack::io::detail {

std::vector<Hyperslab> flat_range_slabs(std::span<const std::size_t> shape, std::size_t first, std::size_t count) {
  const std::size_t n = shape.size();
  std::size_t total = 1;
  for (std::size_t s : shape) total *= s;
  if (first > total || count > total - first)
    throw InternalError("flat index range [" + std::to_string(first) + ", " + std::to_string(first + count) +
                        ") outside an array of " + std::to_string(total) + " points");
  std::vector<Hyperslab> slabs;
  if (n == 0) {
    if (count == 1) slabs.push_back({});
    return slabs;
  }
  // stride[d] = number of points in one step along dimension d.
  std::vector<std::size_t> stride(n, 1);
  for (std::size_t d = n - 1; d > 0; --d) stride[d - 1] = stride[d] * shape[d];
  while (count > 0) {
    std::vector<std::size_t> index(n);
    for (std::size_t d = 0, rest = first; d < n; ++d) {
      index[d] = rest / stride[d];
      rest %= stride[d];
    }
    // The outermost dimension d such that `first` starts a whole block along the inner dimensions
    // and at least one such block still fits in the range.
    std::size_t d = n - 1;
    while (d > 0 && index[d] == 0 && stride[d - 1] <= count) --d;
    const std::size_t blocks = std::min(shape[d] - index[d], count / stride[d]);
    Hyperslab slab{index, std::vector<std::size_t>(n, 1)};
    slab.count[d] = blocks;
    for (std::size_t j = d + 1; j < n; ++j) slab.count[j] = shape[j];
    slabs.push_back(std::move(slab));
    first += blocks * stride[d];
    count -= blocks * stride[d];
  }
  return slabs;
}

} // namespace bandstack::io::detail

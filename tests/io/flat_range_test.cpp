#include "io/flat_range.hpp"

#include <gtest/gtest.h>

#include "bandstack/core/error.hpp"

namespace bandstack::io::detail {
namespace {

// Row-major flat index of a point (analytic definition of C order).
std::size_t flat(const std::vector<std::size_t>& shape, const std::vector<std::size_t>& index) {
  std::size_t f = 0;
  for (std::size_t d = 0; d < shape.size(); ++d) f = f * shape[d] + index[d];
  return f;
}

// Every point of the slabs, in slab order and row-major order inside each slab.
std::vector<std::size_t> points(const std::vector<std::size_t>& shape, const std::vector<Hyperslab>& slabs) {
  std::vector<std::size_t> out;
  for (const Hyperslab& s : slabs) {
    std::vector<std::size_t> i(shape.size(), 0);
    std::size_t size = 1;
    for (std::size_t c : s.count) size *= c;
    for (std::size_t k = 0; k < size; ++k) {
      std::vector<std::size_t> at(shape.size());
      for (std::size_t d = 0; d < shape.size(); ++d) at[d] = s.start[d] + i[d];
      out.push_back(flat(shape, at));
      for (std::size_t d = shape.size(); d-- > 0;) {
        if (++i[d] < s.count[d]) break;
        i[d] = 0;
      }
    }
  }
  return out;
}

TEST(FlatRange, EveryRangeOfSmallArraysIsCoveredInOrder) {
  for (const std::vector<std::size_t>& shape :
       {std::vector<std::size_t>{7}, {3, 4}, {2, 3, 4}, {4, 1, 3}, {2, 2, 2, 3}}) {
    std::size_t total = 1;
    for (std::size_t s : shape) total *= s;
    for (std::size_t first = 0; first < total; ++first)
      for (std::size_t count = 1; first + count <= total; ++count) {
        const std::vector<Hyperslab> slabs = flat_range_slabs(shape, first, count);
        EXPECT_LE(slabs.size(), 2 * shape.size() - 1);
        const std::vector<std::size_t> got = points(shape, slabs);
        ASSERT_EQ(got.size(), count);
        for (std::size_t k = 0; k < count; ++k) ASSERT_EQ(got[k], first + k) << "first " << first << " count " << count;
      }
  }
}

TEST(FlatRange, WholeArrayIsOneSlab) {
  const std::vector<std::size_t> shape{3, 5};
  const auto slabs = flat_range_slabs(shape, 0, 15);
  ASSERT_EQ(slabs.size(), 1u);
  EXPECT_EQ(slabs[0].count, shape);
}

TEST(FlatRange, RangeOutsideTheArrayIsABug) {
  const std::vector<std::size_t> shape{3, 5};
  EXPECT_THROW((void)flat_range_slabs(shape, 10, 6), InternalError);
  EXPECT_TRUE(flat_range_slabs(shape, 15, 0).empty());
}

} // namespace
} // namespace bandstack::io::detail

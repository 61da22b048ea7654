// Vectorised helpers shared by the kernels.
#if defined(__GNUC__) && !defined(__clang__)
#pragma GCC optimize("no-trapping-math") // lets GCC vectorise the select below (see longwave_many.cpp)
#endif
#include "solvers/vector_math.hpp"

namespace bandstack::solvers::detail {

BANDSTACK_VECTOR_CLONES
double count_outside(const double* values, std::size_t size, double lo, double hi) {
  // A double count vectorises with SSE2 (a bool or integer one does not); eight partial counts
  // break the chain of dependent additions.
  double bad[8] = {};
  std::size_t m = 0;
  for (; m + 8 <= size; m += 8)
    for (std::size_t k = 0; k < 8; ++k)
      bad[k] += (values[m + k] >= lo && values[m + k] <= hi) ? 0.0 : 1.0;
  for (; m < size; ++m)
    bad[0] += (values[m] >= lo && values[m] <= hi) ? 0.0 : 1.0;
  return ((bad[0] + bad[1]) + (bad[2] + bad[3])) + ((bad[4] + bad[5]) + (bad[6] + bad[7]));
}

} // namespace bandstack::solvers::detail

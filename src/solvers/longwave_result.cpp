#include "bandstack/solvers/longwave_result.hpp"

#include "bandstack/core/error.hpp"

namespace bandstack::solvers {

double LongwaveResult::olr() const {
  BANDSTACK_ASSERT(!flux_up.empty());
  return flux_up.front();
}

double LongwaveResult::surface_down() const {
  BANDSTACK_ASSERT(!flux_down.empty());
  return flux_down.back();
}

} // namespace bandstack::solvers

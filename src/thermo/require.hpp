#pragma once
// Argument checks shared by the thermo sources: each throws InputError naming the argument and
// the function it was passed to.
#include "bandstack/core/error.hpp"

#include <cmath>
#include <string>

namespace bandstack::thermo::detail {

inline InputPlace place_of(const char* item) {
  InputPlace place;
  place.item = item;
  return place;
}

[[noreturn]] inline void reject(const char* function, const char* item, double value, const char* expected) {
  throw InputError(place_of(item), std::string(function) + ": got " + std::to_string(value) + ", expected " + expected);
}

inline void require_positive(const char* function, const char* item, double value) {
  if (!(std::isfinite(value) && value > 0.0)) reject(function, item, value, "a finite value > 0");
}

inline void require_non_negative(const char* function, const char* item, double value) {
  if (!(std::isfinite(value) && value >= 0.0)) reject(function, item, value, "a finite value >= 0");
}

// A fraction in [0, 1): water mole fraction or specific humidity.
inline void require_unit_fraction(const char* function, const char* item, double value) {
  if (!(value >= 0.0 && value < 1.0)) reject(function, item, value, "a value in [0, 1)");
}

} // namespace bandstack::thermo::detail

#pragma once
// Private to src/solvers: elementary functions written so that loops calling them vectorise (no
// libm call, no branch), for the longwave kernels that sweep many spectral points at once.
#include <bit>
#include <cstdint>

// Loops that vectorise are compiled twice, for baseline x86-64 (SSE2) and for x86-64-v3 (AVX2 and
// FMA), and the copy to run is picked once per process from the CPU (GCC function multi-versioning
// through an ifunc). Other compilers and targets get the baseline only. Results of the two copies
// differ in the last bits (FMA rounding), never between threads or runs on one machine.
#if defined(__GNUC__) && !defined(__clang__) && defined(__x86_64__) && defined(__linux__)
#define BANDSTACK_VECTOR_CLONES __attribute__((target_clones("arch=x86-64-v4", "arch=x86-64-v3", "default")))
#else
#define BANDSTACK_VECTOR_CLONES
#endif

namespace bandstack::solvers::detail {

// The pieces of e^y - 1 = scale * (r + r^2 s) + (scale - 1), scale = 2^n, for y clamped to
// [-708, 708] (below, the result is -1 to the last bit; above, it would overflow anyway).
//
// Cody & Waite (1980, Software Manual for the Elementary Functions) argument reduction
// y = n ln2 + r, |r| <= ln2 / 2, with ln2 split in a 32-bit head (n * ln2_hi is exact for
// |n| < 2^11) and a tail; then e^y - 1 = 2^n (e^r - 1) + (2^n - 1), exact for n = 0, so small |y|
// keeps full relative accuracy (no cancellation as in exp(y) - 1). e^r - 1 = r + r^2 s(r) with
// s(r) = 1/2! + r/3! + ... + r^11/13!, the Taylor series: the first omitted term is below 4e-17 of s
// at |r| = ln2 / 2. For n = 0, r equals y exactly.
struct Expm1Parts {
  double n;     // the integer n, as a double
  double r;     // the reduced argument
  double s;     // s(r)
  double scale; // 2^n
};

inline Expm1Parts expm1_parts(double y) noexcept {
  constexpr double log2e = 1.4426950408889634074;
  constexpr double ln2_hi = 6.93147180369123816490e-01; // fdlibm's split of ln 2
  constexpr double ln2_lo = 1.90821492927058770002e-10;
  // Adding 1.5 * 2^52 rounds to an integer held in the low mantissa bits (the usual trick).
  constexpr double shifter = 6755399441055744.0;
  y = y < -708.0 ? -708.0 : y;
  y = y > 708.0 ? 708.0 : y;
  const double kd = y * log2e + shifter;
  const double n = kd - shifter;
  const double r = (y - n * ln2_hi) - n * ln2_lo;
  double s = 1.6059043836821614599e-10; // 1/13!
  s = 2.0876756987868098979e-09 + r * s; // 1/12!
  s = 2.5052108385441718775e-08 + r * s; // 1/11!
  s = 2.7557319223985890653e-07 + r * s; // 1/10!
  s = 2.7557319223985890653e-06 + r * s; // 1/9!
  s = 2.4801587301587301587e-05 + r * s; // 1/8!
  s = 1.9841269841269841270e-04 + r * s; // 1/7!
  s = 1.3888888888888888889e-03 + r * s; // 1/6!
  s = 8.3333333333333333333e-03 + r * s; // 1/5!
  s = 4.1666666666666666667e-02 + r * s; // 1/4!
  s = 1.6666666666666666667e-01 + r * s; // 1/3!
  s = 0.5 + r * s;
  // 2^n from the low bits of kd: they hold n (two's complement) plus 2^51; adding the exponent
  // bias and shifting leaves the biased exponent n + 1023 in [1, 2046] for |y| <= 708.
  const std::uint64_t bits = std::bit_cast<std::uint64_t>(kd);
  const double scale = std::bit_cast<double>((bits + 1023u) << 52);
  return {n, r, s, scale};
}

// e^y - 1 for finite y, relative error a few 1e-16 (checked against std::expm1 in
// tests/solvers/longwave_many_test.cpp). NaN is not propagated reliably: check inputs first.
inline double vector_expm1(double y) noexcept {
  const Expm1Parts e = expm1_parts(y);
  return e.scale * (e.r + e.r * (e.r * e.s)) + (e.scale - 1.0);
}

// How many of values[0..size) lie outside [lo, hi] (NaN counts as outside). One pass without early
// exit, so that it vectorises; callers search for the culprit only when the count is not zero.
// (The definition carries the instruction-set clones; the declaration must not, or every caller
// emits its own resolver.)
double count_outside(const double* values, std::size_t size, double lo, double hi);

} // namespace bandstack::solvers::detail

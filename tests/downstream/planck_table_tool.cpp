// Prints band radiances for downstream checks: one line "nu1 nu2 T band_radiance" per band, with
// nu in cm-1, T in K and the band radiance in W m-2 sr-1 (17 significant digits, "inf" allowed
// for nu2). With --stdin the bands are read as whitespace-separated triples "nu1 nu2 T";
// otherwise a fixed set is printed. Numbers are read and written independent of the locale.
// Exit code 0 ok, 2 bad input.
#include "bandstack/core/error.hpp"
#include "bandstack/spectral/planck.hpp"

#include <charconv>
#include <cstdio>
#include <fmt/format.h>
#include <iostream>
#include <limits>
#include <string>
#include <string_view>
#include <vector>

namespace {

struct Band {
  double nu1_cm1, nu2_cm1, t_k;
};

std::vector<Band> fixed_bands() {
  const double inf = std::numeric_limits<double>::infinity();
  std::vector<Band> bands;
  for (const double t : {150.0, 250.0, 288.0, 1000.0, 5772.0}) {
    for (const auto& [a, b] : {std::pair{0.0, 10.0},
                               {10.0, 350.0},
                               {500.0, 600.0},
                               {630.0, 700.0},
                               {667.0, 667.01},
                               {980.0, 1100.0},
                               {1250.0, 1500.0},
                               {2500.0, 2500.5},
                               {2000.0, inf},
                               {0.0, inf}}) {
      bands.push_back({a, b, t});
    }
  }
  return bands;
}

bool parse_number(const std::string& token, double& value) {
  const char* end = token.data() + token.size();
  const auto [ptr, ec] = std::from_chars(token.data(), end, value);
  return ec == std::errc() && ptr == end;
}

} // namespace

int main(int argc, char** argv) {
  std::vector<Band> bands;
  if (argc > 1 && std::string_view(argv[1]) == "--stdin") {
    std::string t1, t2, t3;
    long line = 0;
    while (std::cin >> t1 >> t2 >> t3) {
      ++line;
      Band b{};
      if (!parse_number(t1, b.nu1_cm1) || !parse_number(t2, b.nu2_cm1) || !parse_number(t3, b.t_k)) {
        std::fprintf(stderr, "planck_table_tool: band %ld: expected three numbers 'nu1 nu2 T', got '%s %s %s'\n", line,
                     t1.c_str(), t2.c_str(), t3.c_str());
        return 2;
      }
      bands.push_back(b);
    }
  } else if (argc > 1) {
    std::fprintf(stderr, "usage: planck_table_tool [--stdin]\n");
    return 2;
  } else {
    bands = fixed_bands();
  }
  try {
    std::fputs("nu1_cm1 nu2_cm1 temperature_k band_radiance_w_m2_sr\n", stdout);
    for (const Band& b : bands) {
      const double radiance = bandstack::spectral::planck_band_radiance(b.nu1_cm1, b.nu2_cm1, b.t_k);
      fmt::print("{:.17g} {:.17g} {:.17g} {:.17g}\n", b.nu1_cm1, b.nu2_cm1, b.t_k, radiance);
    }
  } catch (const bandstack::InputError& e) {
    std::fprintf(stderr, "planck_table_tool: %s\n", e.what());
    return 2;
  }
  return 0;
}

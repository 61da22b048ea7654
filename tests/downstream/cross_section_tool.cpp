// Loads a cross-section file and prints kappa at the states read from standard input, for
// downstream checks. Usage: cross_section_tool FILE.nc < queries, one query per line:
// "absorber nu_cm1 pressure_pa temperature_k". Output: a first line "description: ...", a header,
// then "absorber nu_cm1 pressure_pa temperature_k kappa" per query (17 significant digits; nu is
// the wavenumber actually evaluated, a one-point grid's midpoint; kappa in m2 kg-1, or m2 kg-1 Pa-1
// for h2o_self_continuum). Numbers are read and written independent of the locale.
// Exit code 0 ok, 2 bad input (message on standard error).
#include "bandstack/core/error.hpp"
#include "bandstack/spectral/cross_section_file.hpp"

#include <charconv>
#include <cstdio>
#include <fmt/format.h>
#include <iostream>
#include <string>

namespace {

bool parse_number(const std::string& token, double& value) {
  const char* end = token.data() + token.size();
  const auto [ptr, ec] = std::from_chars(token.data(), end, value);
  return ec == std::errc() && ptr == end;
}

} // namespace

int main(int argc, char** argv) {
  if (argc != 2) {
    std::fprintf(stderr, "usage: cross_section_tool FILE.nc < queries\n");
    return 2;
  }
  namespace bs = bandstack::spectral;
  try {
    const bs::CrossSectionAbsorber source(argv[1]);
    fmt::print("description: {}\n", source.description());
    fmt::print("absorber nu_cm1 pressure_pa temperature_k kappa\n");
    std::string name, nu_text, p_text, t_text;
    long line = 0;
    while (std::cin >> name >> nu_text >> p_text >> t_text) {
      ++line;
      double nu = 0.0, p = 0.0, t = 0.0;
      const auto absorber = bs::absorber_from_name(name);
      if (!absorber || !parse_number(nu_text, nu) || !parse_number(p_text, p) || !parse_number(t_text, t)) {
        std::fprintf(stderr, "cross_section_tool: query %ld: expected 'absorber nu p T', got '%s %s %s %s'\n", line,
                     name.c_str(), nu_text.c_str(), p_text.c_str(), t_text.c_str());
        return 2;
      }
      const double step = 1e-6;
      const bs::WavenumberGrid grid{nu - 0.5 * step, step, 1};
      double kappa = 0.0;
      source.absorption(*absorber, bs::AbsorberState{p, t}, grid, std::span<double>(&kappa, 1));
      fmt::print("{} {:.17g} {:.17g} {:.17g} {:.17g}\n", name, grid.at(0), p, t, kappa);
    }
  } catch (const bandstack::Error& e) {
    std::fflush(stdout);
    std::fprintf(stderr, "cross_section_tool: %s\n", e.what());
    return 2;
  }
  return 0;
}

// Uses the installed library: build a built-in column and solve its grey longwave fluxes.
#include <cstdio>

#include <bandstack/bandstack.hpp>

int main() {
  bandstack::atmosphere::GridSpec grid;
  grid.layers = 20;
  const bandstack::atmosphere::Column column = bandstack::atmosphere::make_column({}, grid, "consumer");
  bandstack::solvers::GreyOptics optics;
  optics.mass_absorption_m2_kg[bandstack::index(bandstack::Gas::h2o)] = 0.05;
  const auto result = bandstack::solvers::solve_grey_longwave(column, optics, bandstack::solvers::gauss_quadrature(2));
  std::printf("bandstack %s olr %.3f\n", std::string(bandstack::version()).c_str(), result.olr());
  return result.olr() > 0.0 ? 0 : 1;
}

// Reads a profile file and prints what bandstack made of it, for downstream checks.
// Usage: profile_file_tool FILE.nc [quantity=variable ...] (quantity: a ProfileVariables member,
// e.g. o3=ozone or vertical_dimension=level). Output lines (numbers with 17 significant digits,
// independent of the locale):
//   axis NAME SIZE v0 v1 ...          one per leading dimension (coordinate values, if any)
//   attribute AXIS KEY=VALUE          the coordinate's text attributes
//   used LINE                         ProfileFile::used_variables
//   layer C I p_pa t_k x_h2o x_co2 x_o3 x_ch4 x_n2o     column C, layer I (0 = top)
//   level C K p_pa t_k                                   column C, level K
//   surface C t_k
// Exit code 0 ok, 2 bad input (message on standard error).
#include "bandstack/core/error.hpp"
#include "bandstack/io/profile_file.hpp"

#include <cstdio>
#include <fmt/format.h>
#include <map>
#include <string>

int main(int argc, char** argv) {
  if (argc < 2) {
    std::fprintf(stderr, "usage: profile_file_tool FILE.nc [quantity=variable ...]\n");
    return 2;
  }
  using bandstack::io::ProfileVariables;
  const std::map<std::string, std::string ProfileVariables::*> members{
      {"pressure", &ProfileVariables::pressure},
      {"temperature", &ProfileVariables::temperature},
      {"surface_temperature", &ProfileVariables::surface_temperature},
      {"surface_pressure", &ProfileVariables::surface_pressure},
      {"h2o", &ProfileVariables::h2o},
      {"co2", &ProfileVariables::co2},
      {"o3", &ProfileVariables::o3},
      {"ch4", &ProfileVariables::ch4},
      {"n2o", &ProfileVariables::n2o},
      {"vertical_dimension", &ProfileVariables::vertical_dimension}};
  ProfileVariables variables;
  for (int i = 2; i < argc; ++i) {
    const std::string argument = argv[i];
    const auto equals = argument.find('=');
    const auto member = members.find(argument.substr(0, equals));
    if (equals == std::string::npos || member == members.end()) {
      std::fprintf(stderr, "profile_file_tool: expected quantity=variable, got '%s'\n", argv[i]);
      return 2;
    }
    variables.*(member->second) = argument.substr(equals + 1);
  }
  try {
    const auto file = bandstack::io::read_profile_file(argv[1], variables, {});
    for (const auto& axis : file.axes) {
      fmt::print("axis {} {}", axis.name, axis.size);
      for (double v : axis.values)
        fmt::print(" {:.17g}", v);
      fmt::print("\n");
      for (const auto& [key, value] : axis.attributes)
        fmt::print("attribute {} {}={}\n", axis.name, key, value);
    }
    for (const auto& line : file.used_variables)
      fmt::print("used {}\n", line);
    for (std::size_t c = 0; c < file.columns.size(); ++c) {
      const auto& col = file.columns[c];
      for (std::size_t i = 0; i < col.layer_count(); ++i) {
        fmt::print("layer {} {} {:.17g} {:.17g}", c, i, col.pressure_layer_pa[i], col.temperature_layer_k[i]);
        for (bandstack::Gas g : bandstack::all_gases)
          fmt::print(" {:.17g}", col.gas(g)[i]);
        fmt::print("\n");
      }
      for (std::size_t k = 0; k < col.level_count(); ++k)
        fmt::print("level {} {} {:.17g} {:.17g}\n", c, k, col.pressure_level_pa[k], col.temperature_level_k[k]);
      fmt::print("surface {} {:.17g}\n", c, col.surface_temperature_k);
    }
  } catch (const bandstack::Error& e) {
    std::fflush(stdout);
    std::fprintf(stderr, "profile_file_tool: %s\n", e.what());
    return 2;
  }
  return 0;
}

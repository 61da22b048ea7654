#pragma once
#include <string_view>

namespace bandstack::io {

// The built-in demo studies, invented scenarios compiled into the library; `bandstack demo` runs both.
// Fluxes through the columns of a fictional station: the text of examples/tarrow_sound_demo.toml.
[[nodiscard]] std::string_view demo_study_text();
// Radiative-convective equilibrium of global-mean columns with experiments and attribution: the
// text of examples/equilibrium_demo.toml.
[[nodiscard]] std::string_view equilibrium_demo_study_text();

} // namespace bandstack::io

#pragma once
#include <string_view>

namespace bandstack::io {

// The built-in demo study, an invented scenario: the text of examples/tarrow_sound_demo.toml,
// compiled into the library.
[[nodiscard]] std::string_view demo_study_text();

} // namespace bandstack::io

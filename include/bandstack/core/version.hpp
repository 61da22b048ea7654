#pragma once
#include <string_view>

namespace bandstack {

// The library version, "MAJOR.MINOR.PATCH".
[[nodiscard]] std::string_view version() noexcept;

// The caution every report and result file carries.
[[nodiscard]] std::string_view caution_text() noexcept;

} // namespace bandstack

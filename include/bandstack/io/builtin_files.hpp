#pragma once
// The text files of the repository's bands/ folder (absorber recipes and band-set build recipes),
// compiled into the library so that the built-in band sets can be rebuilt anywhere.
#include <optional>
#include <string_view>
#include <vector>

namespace bandstack::io {

// Text of bands/<name> (e.g. "default_lw.toml"), or nullopt if there is no such built-in file.
[[nodiscard]] std::optional<std::string_view> builtin_file(std::string_view name) noexcept;
// All built-in file names, sorted.
[[nodiscard]] std::vector<std::string_view> builtin_file_names();

} // namespace bandstack::io

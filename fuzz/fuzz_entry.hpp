#pragma once
// The fuzzed entry points, shared by the libFuzzer programs (fuzz/*_fuzz.cpp) and the replay test of
// kept crash inputs (fuzz/regressions_test.cpp), so the gcc build replays exactly what was fuzzed.
//
// Each function feeds one input to one reader. Expected rejections (bandstack::Error: InputError,
// FileError) are swallowed; anything else escapes: another exception type, a crash, a sanitizer report.
#include <cstddef>
#include <cstdint>
#include <filesystem>
#include <string>
#include <string_view>

namespace bandstack::fuzz {

// The reader a target feeds.
enum class Target { study, profile_file, band_set_file, cross_section_file };

// Folder name of a target under fuzz/corpus and fuzz/regressions ("study", "profile_file", ...).
[[nodiscard]] std::string_view target_name(Target target);

// Feeds `size` bytes to the target's reader: the study parser takes them as TOML text; the netCDF
// readers get them as a file written to a private scratch folder (removed when the process exits).
// Returns the message of the expected error, or "" when the input was accepted.
std::string feed(Target target, const std::uint8_t* data, std::size_t size);

} // namespace bandstack::fuzz

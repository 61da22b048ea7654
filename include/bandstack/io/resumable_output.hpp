#pragma once
// A resumable output file: the result is built in a working file with a stable name next to the final
// path, and a small checkpoint record says how much of it is complete. A run that is interrupted
// (signal, kill -9, power loss after the last checkpoint) can continue where the record says; the
// final path appears only when the file is complete (fsync, then rename), as with io::AtomicOutput.
//   <folder>/.<name>.partial      the working netCDF file
//   <folder>/.<name>.checkpoint   the record (text, see Checkpoint)
#include <cstddef>
#include <cstdint>
#include <filesystem>
#include <optional>
#include <string>
#include <string_view>

namespace bandstack::io {

// What a checkpoint record holds.
struct Checkpoint {
  std::string run_hash;             // hash of everything that affects the file's contents (hex)
  std::size_t chunk_columns = 0;    // columns computed per block
  std::size_t columns_total = 0;    // columns of the whole run
  std::size_t columns_written = 0;  // columns 0 .. columns_written-1 are in the working file, synced
};

// The working file and the checkpoint record of the output `final_path`.
[[nodiscard]] std::filesystem::path working_path(const std::filesystem::path& final_path);
[[nodiscard]] std::filesystem::path checkpoint_path(const std::filesystem::path& final_path);

// The record at `path`, or nothing if it is missing or malformed.
[[nodiscard]] std::optional<Checkpoint> read_checkpoint(const std::filesystem::path& path);
// Replaces the record at `path` atomically (temporary, fsync, rename). FileError on failure.
void write_checkpoint(const std::filesystem::path& path, const Checkpoint& checkpoint);

// Moves the complete working file of `final_path` into place (fsync, permissions as the umask
// allows, rename) and removes the checkpoint record. FileError on failure.
void finish_resumable(const std::filesystem::path& final_path);
// Removes the working file and the checkpoint record of `final_path`, if any (never throws).
void discard_resumable(const std::filesystem::path& final_path) noexcept;
// Whether the working file of `final_path` opens for writing as netCDF (a process killed while
// writing can leave it damaged; then the run has to start afresh).
[[nodiscard]] bool working_file_opens(const std::filesystem::path& final_path) noexcept;

// 64-bit FNV-1a hash (Fowler, Noll and Vo; IETF draft-eastlake-fnv) of `text`, continuing from `seed`.
[[nodiscard]] std::uint64_t fnv1a(std::string_view text, std::uint64_t seed = 0xcbf29ce484222325ULL) noexcept;

} // namespace bandstack::io

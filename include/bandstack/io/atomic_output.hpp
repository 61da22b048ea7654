#pragma once
// Atomic creation of an output file: write to a temporary file in the same folder, then rename it
// over the final name. A run that fails (exception) or is killed leaves the final path untouched:
// either the old complete file, or nothing. A temporary left by a killed process is named
// ".<final name>.part-<random>" and is never mistaken for a result.
#include <filesystem>

namespace bandstack::io {

class AtomicOutput {
public:
  // Checks that the folder exists and is writable (FileError otherwise) and reserves a temporary name.
  explicit AtomicOutput(std::filesystem::path final_path);
  ~AtomicOutput();                 // removes the temporary unless commit() succeeded
  AtomicOutput(const AtomicOutput&) = delete;
  AtomicOutput& operator=(const AtomicOutput&) = delete;

  [[nodiscard]] const std::filesystem::path& temporary_path() const noexcept { return temporary_; }
  [[nodiscard]] const std::filesystem::path& final_path() const noexcept { return final_; }
  // Flushes the temporary to disk and renames it to the final path.
  void commit();

private:
  std::filesystem::path final_;
  std::filesystem::path temporary_;
  bool committed_ = false;
};

// Throws FileError if files cannot be created in the folder of `path` (missing or unwritable).
void check_output_folder(const std::filesystem::path& path);

} // namespace bandstack::io

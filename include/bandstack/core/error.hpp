#pragma once
// One exception tree for the whole library, rooted at std::runtime_error. Each kind carries the
// process exit code the command line returns for it: 2 for bad input, 1 for internal errors.
// Errors are caught only in main().
#include <cstddef>
#include <optional>
#include <stdexcept>
#include <string>
#include <utility>

namespace bandstack {

enum class ExitCode : int { success = 0, internal_error = 1, bad_input = 2 };

class Error : public std::runtime_error {
public:
  explicit Error(const std::string& what, ExitCode code = ExitCode::internal_error)
      : std::runtime_error(what), code_(code) {}
  [[nodiscard]] ExitCode exit_code() const noexcept { return code_; }

private:
  ExitCode code_;
};

// Where bad input was found. Every field is optional; what is known is printed, in this order:
// "file.nc: variable 'temperature' (column 3, level 17): message".
struct InputPlace {
  std::string file;      // path as the user gave it
  std::string item;      // variable, key or option name
  std::optional<long> line;
  std::optional<long> column_in_line; // character column in a text file
  std::optional<long> column_index;   // atmospheric column (profile index)
  std::optional<long> level;          // level or layer index (0 = top of atmosphere)

  [[nodiscard]] std::string describe() const;

  // Shorthands for the most common places: an item, optionally at a level (or layer) index.
  [[nodiscard]] static InputPlace of(std::string item) {
    InputPlace place;
    place.item = std::move(item);
    return place;
  }
  [[nodiscard]] static InputPlace of(std::string item, std::size_t level) {
    InputPlace place = of(std::move(item));
    place.level = static_cast<long>(level);
    return place;
  }
};

// Bad input from the user: a malformed or inconsistent file, a value out of range, a wrong unit.
class InputError : public Error {
public:
  InputError(InputPlace place, const std::string& message)
      : Error(compose(place, message), ExitCode::bad_input), place_(std::move(place)), message_(message) {}
  explicit InputError(const std::string& message) : InputError(InputPlace{}, message) {}

  [[nodiscard]] const InputPlace& place() const noexcept { return place_; }
  [[nodiscard]] const std::string& message() const noexcept { return message_; }

private:
  static std::string compose(const InputPlace& place, const std::string& message);
  InputPlace place_;
  std::string message_;
};

// A file that cannot be read or written (missing, unwritable directory, disk full).
class FileError : public Error {
public:
  FileError(const std::string& path, const std::string& message)
      : Error(path + ": " + message, ExitCode::bad_input) {}
};

// A numerical method that did not reach its goal (e.g. an iteration that did not converge).
class ConvergenceError : public Error {
public:
  explicit ConvergenceError(const std::string& message) : Error(message, ExitCode::bad_input) {}
};

// A broken invariant: a bug in bandstack, never the user's fault.
class InternalError : public Error {
public:
  explicit InternalError(const std::string& message) : Error(message, ExitCode::internal_error) {}
};

// The first line of a message from a third-party library (netCDF adds its own source file and
// line on a second line, which means nothing to a user).
[[nodiscard]] std::string first_line(const std::string& text);

[[noreturn]] void assertion_failed(const char* expression, const char* file, int line);

} // namespace bandstack

// Invariant check that stays on in release builds (cheap conditions only).
#define BANDSTACK_ASSERT(condition) \
  ((condition) ? static_cast<void>(0) : ::bandstack::assertion_failed(#condition, __FILE__, __LINE__))

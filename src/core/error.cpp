#include "bandstack/core/error.hpp"

#include <sstream>

namespace bandstack {

std::string InputPlace::describe() const {
  std::ostringstream out;
  const char* sep = ""; // a char pointer, not a std::string: avoids a GCC 12 -Wrestrict false positive
  if (!file.empty()) {
    out << file;
    if (line) {
      out << ':' << *line;
      if (column_in_line) out << ':' << *column_in_line;
    }
    sep = ": ";
  }
  if (!item.empty()) {
    out << sep << '\'' << item << '\'';
    sep = " ";
  }
  if (column_index || level) {
    out << sep << '(';
    if (column_index) out << "column " << *column_index;
    if (column_index && level) out << ", ";
    if (level) out << "level " << *level;
    out << ')';
  }
  return out.str();
}

std::string InputError::compose(const InputPlace& place, const std::string& message) {
  const std::string where = place.describe();
  return where.empty() ? message : where + ": " + message;
}

std::string first_line(const std::string& text) { return text.substr(0, text.find('\n')); }

void assertion_failed(const char* expression, const char* file, int line) {
  throw InternalError(std::string("internal error: assertion '") + expression + "' failed at " + file + ':' +
                      std::to_string(line) + " (please report this as a bug)");
}

} // namespace bandstack

// CF time coordinates to calendar dates (CF conventions 1.8 §4.4.1, calendars).
#include "io/cf_time.hpp"

#include <cmath>
#include <cctype>
#include <regex>

namespace bandstack::io::detail {

namespace {

using Calendar = TimeUnits::Calendar;

bool leap(Calendar c, long y) {
  if (c == Calendar::noleap || c == Calendar::day360) return false;
  if (c == Calendar::all_leap) return true;
  return (y % 4 == 0 && y % 100 != 0) || y % 400 == 0;
}

long days_in_month(Calendar c, long y, long m) {
  if (c == Calendar::day360) return 30;
  static constexpr long days[] = {31, 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31};
  return m == 2 && leap(c, y) ? 29 : days[m - 1];
}

// Days from 1 January of year 0 to 1 January of year y, in the calendar (y may be negative).
long days_before_year(Calendar c, long y) {
  if (c == Calendar::day360) return 360 * y;
  if (c == Calendar::noleap) return 365 * y;
  if (c == Calendar::all_leap) return 366 * y;
  // Proleptic Gregorian: 365 y plus the leap years in [0, y - 1], which is L(y - 1) - L(-1) with
  // L(n) = floor(n/4) - floor(n/100) + floor(n/400) and L(-1) = -1 (year 0 is a leap year).
  const auto floor_div = [](long a, long b) { return a >= 0 ? a / b : -((-a + b - 1) / b); };
  const long n = y - 1;
  return 365 * y + floor_div(n, 4) - floor_div(n, 100) + floor_div(n, 400) + 1;
}

long day_of_year_index(Calendar c, long y, long m, long d) { // 0-based
  long n = d - 1;
  for (long k = 1; k < m; ++k) n += days_in_month(c, y, k);
  return n;
}

} // namespace

std::optional<TimeUnits> parse_time_units(const std::string& units, const std::string& calendar) {
  static const std::regex pattern(
      R"(^\s*(seconds?|secs?|s|minutes?|mins?|hours?|hrs?|h|days?|d)\s+since\s+(-?\d{1,4})-(\d{1,2})-(\d{1,2})(?:[ T](\d{1,2}):(\d{1,2})(?::(\d{1,2}(?:\.\d*)?))?)?\s*(?:Z|UTC|[+-]00:?00)?\s*$)",
      std::regex::icase);
  std::smatch m;
  if (!std::regex_match(units, m, pattern)) return std::nullopt;
  TimeUnits t;
  const char u = static_cast<char>(std::tolower(static_cast<unsigned char>(m[1].str()[0])));
  t.seconds_per_unit = u == 'd' ? 86400.0 : u == 'h' ? 3600.0 : (u == 'm' ? 60.0 : 1.0);
  t.year = std::stol(m[2].str());
  t.month = std::stol(m[3].str());
  t.day = std::stol(m[4].str());
  if (m[5].matched) t.seconds_of_day = 3600.0 * std::stod(m[5].str()) + 60.0 * std::stod(m[6].str());
  if (m[7].matched) t.seconds_of_day += std::stod(m[7].str());
  if (calendar.empty() || calendar == "standard" || calendar == "gregorian" || calendar == "proleptic_gregorian")
    t.calendar = Calendar::gregorian;
  else if (calendar == "noleap" || calendar == "365_day") t.calendar = Calendar::noleap;
  else if (calendar == "all_leap" || calendar == "366_day") t.calendar = Calendar::all_leap;
  else if (calendar == "360_day") t.calendar = Calendar::day360;
  else return std::nullopt;
  if (t.month < 1 || t.month > 12 || t.day < 1 || t.day > days_in_month(t.calendar, t.year, t.month) ||
      t.seconds_of_day >= 86400.0)
    return std::nullopt;
  return t;
}

CalendarTime calendar_time(const TimeUnits& units, double value) {
  const Calendar c = units.calendar;
  // Whole days and seconds since the reference day's midnight, then since 1 January of year 0.
  const double seconds = value * units.seconds_per_unit + units.seconds_of_day;
  const double days = std::floor(seconds / 86400.0);
  const double second_of_day = seconds - 86400.0 * days;
  long day_number = days_before_year(c, units.year) + day_of_year_index(c, units.year, units.month, units.day) +
                    static_cast<long>(days);
  // The year holding day_number: estimate, then step.
  long year = static_cast<long>(std::floor(static_cast<double>(day_number) / (c == Calendar::day360 ? 360.0 : 365.2425)));
  while (days_before_year(c, year) > day_number) --year;
  while (days_before_year(c, year + 1) <= day_number) ++year;
  CalendarTime t;
  t.year = year;
  t.hour = second_of_day / 3600.0;
  t.day_of_year = 1.0 + static_cast<double>(day_number - days_before_year(c, year)) + second_of_day / 86400.0;
  return t;
}

} // namespace bandstack::io::detail

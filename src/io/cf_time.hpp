#pragma once
// Private to io: CF time coordinates ("<unit> since <date>" with a calendar, CF conventions 1.8 §4.4)
// as the calendar date a value stands for.
#include <optional>
#include <string>

namespace bandstack::io::detail {

// A time as the Sun's position needs it.
struct CalendarTime {
  long year = 0;
  double day_of_year = 1.0; // 1.0 = 1 January 00:00, fractional (the time of day included)
  double hour = 0.0;        // hours since 00:00 of that day, [0, 24)
};

// A parsed time unit: seconds per unit, the reference date and the calendar.
struct TimeUnits {
  double seconds_per_unit = 1.0;
  long year = 1970, month = 1, day = 1;
  double seconds_of_day = 0.0; // reference time of day
  enum class Calendar { gregorian, noleap, all_leap, day360 } calendar = Calendar::gregorian;
};

// Parses units such as "days since 2001-01-01", "hours since 1979-1-1 06:00:00", "seconds since
// 2000-01-01T00:00:00Z", "minutes since ...", and a calendar: standard, gregorian, proleptic_gregorian
// (all taken as proleptic Gregorian), noleap / 365_day, all_leap / 366_day, 360_day; an empty
// calendar is standard. nullopt when either is not understood (the caller names the file).
[[nodiscard]] std::optional<TimeUnits> parse_time_units(const std::string& units, const std::string& calendar);

// The date of `value` units after the reference date.
[[nodiscard]] CalendarTime calendar_time(const TimeUnits& units, double value);

} // namespace bandstack::io::detail

#pragma once
// The Sun's position for each column of a profile file, from the file's leading coordinates
// (docs/profile-file.md, "The Sun from the file"): latitude, longitude and a CF time coordinate.
#include <cstddef>
#include <filesystem>
#include <vector>

#include "bandstack/io/profile_file.hpp"

namespace bandstack::io {

// How the Sun is taken from the file: at the moment of the time coordinate (latitude, longitude,
// time: local mean solar time = UTC hour + longitude / 15 degrees per hour; the equation of time,
// at most about 16 minutes, is ignored), or as the daily mean of that day (latitude, time).
enum class SunFromFile { instantaneous, daily_mean };

// Where the Sun is for one column.
struct ColumnSunPosition {
  double latitude_deg = 0.0;
  double day_of_year = 1.0;        // 1.0 = 1 January 00:00 UTC, fractional; 360_day years are
                                   // stretched to the tropical year (365.2422 days)
  double local_solar_time_h = 0.0; // [0, 24); meaningful for SunFromFile::instantaneous only
};

// The coordinates found among the leading axes: latitude (standard_name "latitude" or units
// degrees_north and its spellings), longitude (standard_name "longitude" or degrees_east; needed
// for instantaneous), time (units "<unit> since <date>", CF calendars standard, gregorian,
// proleptic_gregorian — all proleptic Gregorian — noleap/365_day, all_leap/366_day, 360_day).
// InputError naming the file when one that is needed is missing, its units or calendar are not
// understood, or a latitude lies outside [-90, 90].
class ProfileSun {
public:
  ProfileSun(const std::filesystem::path& file, const std::vector<LeadingAxis>& axes, SunFromFile mode);
  // The Sun's position for file column c (row-major over the leading axes).
  [[nodiscard]] ColumnSunPosition position(std::size_t c) const;
  [[nodiscard]] SunFromFile mode() const noexcept { return mode_; }

private:
  struct Axis {
    std::size_t dimension = 0; // position among the leading axes
    std::vector<double> values;
  };
  std::vector<std::size_t> sizes_; // of the leading axes
  Axis latitude_, longitude_, time_;
  std::vector<double> day_of_year_, utc_hour_; // per time value
  SunFromFile mode_;
};

} // namespace bandstack::io

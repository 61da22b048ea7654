// The Sun's position per profile-file column from its leading coordinates.
#include "bandstack/io/profile_sun.hpp"

#include <cmath>
#include <string>

#include <fmt/format.h>

#include "bandstack/core/error.hpp"
#include "io/cf_time.hpp"

namespace bandstack::io {

namespace {

// Length of the tropical year in days (common practice).
constexpr double tropical_year_days = 365.2422;

std::string attribute(const LeadingAxis& axis, const std::string& key) {
  for (const auto& [k, v] : axis.attributes)
    if (k == key) return v;
  return {};
}

bool one_of(const std::string& text, std::initializer_list<const char*> spellings) {
  for (const char* s : spellings)
    if (text == s) return true;
  return false;
}

// Latitude and longitude units spellings accepted by CF 1.8 §4.1 and §4.2.
bool is_latitude(const LeadingAxis& a) {
  return attribute(a, "standard_name") == "latitude" ||
         one_of(attribute(a, "units"), {"degrees_north", "degree_north", "degree_N", "degrees_N", "degreeN", "degreesN"});
}
bool is_longitude(const LeadingAxis& a) {
  return attribute(a, "standard_name") == "longitude" ||
         one_of(attribute(a, "units"), {"degrees_east", "degree_east", "degree_E", "degrees_E", "degreeE", "degreesE"});
}
bool is_time(const LeadingAxis& a) {
  return attribute(a, "standard_name") == "time" || attribute(a, "axis") == "T" ||
         attribute(a, "units").find(" since ") != std::string::npos;
}

[[noreturn]] void fail(const std::filesystem::path& file, const std::string& item, const std::string& message) {
  InputPlace place;
  place.file = file.string();
  place.item = item;
  throw InputError(place, message);
}

} // namespace

ProfileSun::ProfileSun(const std::filesystem::path& file, const std::vector<LeadingAxis>& axes, SunFromFile mode)
    : mode_(mode) {
  const char* wanted = mode == SunFromFile::instantaneous ? "latitude, longitude and time" : "latitude and time";
  const auto find = [&](bool (*test)(const LeadingAxis&), const char* what) {
    for (std::size_t j = 0; j < axes.size(); ++j)
      if (!axes[j].values.empty() && test(axes[j])) return Axis{j, axes[j].values};
    fail(file, what,
         fmt::format("sun_from_file needs the {} coordinates among the leading dimensions; no {} coordinate found "
                     "(a 1-D variable named after its dimension with standard_name \"{}\" or CF units)",
                     wanted, what, what));
  };
  for (const LeadingAxis& a : axes) sizes_.push_back(a.size);
  latitude_ = find(is_latitude, "latitude");
  for (std::size_t k = 0; k < latitude_.values.size(); ++k)
    if (!(std::abs(latitude_.values[k]) <= 90.0))
      fail(file, axes[latitude_.dimension].name, fmt::format("latitude {} at index {} is outside [-90, 90]",
                                                             latitude_.values[k], k));
  if (mode == SunFromFile::instantaneous) longitude_ = find(is_longitude, "longitude");
  time_ = find(is_time, "time");
  const LeadingAxis& t = axes[time_.dimension];
  const auto units = detail::parse_time_units(attribute(t, "units"), attribute(t, "calendar"));
  if (!units)
    fail(file, t.name, fmt::format("time units \"{}\" with calendar \"{}\" not understood (expected \"<days|hours|minutes|"
                                   "seconds> since YYYY-MM-DD[ hh:mm:ss]\" and a CF calendar)",
                                   attribute(t, "units"), attribute(t, "calendar")));
  for (double value : time_.values) {
    const detail::CalendarTime when = detail::calendar_time(*units, value);
    double day = when.day_of_year;
    if (units->calendar == detail::TimeUnits::Calendar::day360) day = 1.0 + (day - 1.0) * tropical_year_days / 360.0;
    day_of_year_.push_back(std::min(day, 366.999999));
    utc_hour_.push_back(when.hour);
  }
}

ColumnSunPosition ProfileSun::position(std::size_t c) const {
  std::vector<std::size_t> index(sizes_.size());
  for (std::size_t j = sizes_.size(); j-- > 0;) {
    index[j] = c % sizes_[j];
    c /= sizes_[j];
  }
  ColumnSunPosition p;
  p.latitude_deg = latitude_.values[index[latitude_.dimension]];
  p.day_of_year = day_of_year_[index[time_.dimension]];
  if (mode_ == SunFromFile::instantaneous) {
    const double hour = utc_hour_[index[time_.dimension]] + longitude_.values[index[longitude_.dimension]] / 15.0;
    p.local_solar_time_h = hour - 24.0 * std::floor(hour / 24.0);
  }
  return p;
}

} // namespace bandstack::io

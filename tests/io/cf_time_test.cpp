// CF time coordinates to calendar dates (CF conventions 1.8 §4.4). Reference dates from Python's
// datetime (proleptic Gregorian) and the cftime library (noleap, all_leap, 360_day), computed once by
// hand with those libraries and typed in here.
#include "io/cf_time.hpp"

#include <gtest/gtest.h>

namespace bandstack::io::detail {
namespace {

CalendarTime at(const std::string& units, const std::string& calendar, double value) {
  const auto u = parse_time_units(units, calendar);
  EXPECT_TRUE(u.has_value()) << units << " / " << calendar;
  return u ? calendar_time(*u, value) : CalendarTime{};
}

TEST(CfTime, GregorianDatesAgreeWithPythonDatetime) {
  // datetime(2000, 2, 29, tzinfo=utc).timestamp() == 951782400 (Python datetime): day 60 of a leap year.
  CalendarTime t = at("seconds since 1970-01-01T00:00:00Z", "standard", 951782400.0);
  EXPECT_EQ(t.year, 2000);
  EXPECT_DOUBLE_EQ(t.day_of_year, 60.0);
  EXPECT_DOUBLE_EQ(t.hour, 0.0);
  // datetime(1979, 1, 1, 6) + timedelta(hours=123456.5) == 1993-01-31 06:30 (Python datetime).
  t = at("hours since 1979-01-01 06:00:00", "gregorian", 123456.5);
  EXPECT_EQ(t.year, 1993);
  EXPECT_NEAR(t.day_of_year, 31.0 + 6.5 / 24.0, 1e-12);
  EXPECT_NEAR(t.hour, 6.5, 1e-9);
  // 1900 is not a leap year (Gregorian rule): 1900-03-01 is 59 days after 1900-01-01 (Python datetime).
  t = at("days since 1900-01-01", "proleptic_gregorian", 59.0);
  EXPECT_EQ(t.year, 1900);
  EXPECT_DOUBLE_EQ(t.day_of_year, 60.0);
  // datetime(1, 1, 1) + timedelta(days=730119) == 2000-01-01 (Python datetime): across 2000 years.
  t = at("days since 0001-01-01", "", 730119.0);
  EXPECT_EQ(t.year, 2000);
  EXPECT_DOUBLE_EQ(t.day_of_year, 1.0);
  // Before the reference: one day before 2001-01-01 is 2000-12-31, day 366 of a leap year.
  t = at("days since 2001-1-1", "standard", -1.0);
  EXPECT_EQ(t.year, 2000);
  EXPECT_DOUBLE_EQ(t.day_of_year, 366.0);
  t = at("minutes since 2001-01-01 00:00", "standard", -90.0); // 2000-12-31 22:30
  EXPECT_EQ(t.year, 2000);
  EXPECT_NEAR(t.hour, 22.5, 1e-12);
}

TEST(CfTime, OtherCalendarsAgreeWithCftime) {
  // cftime.num2date(400.25, "days since 2001-01-01", cal): noleap 2002-02-05 06:00, 360_day
  // 2002-02-11 06:00, all_leap 2002-02-04 06:00 (cftime library).
  CalendarTime t = at("days since 2001-01-01", "noleap", 400.25);
  EXPECT_EQ(t.year, 2002);
  EXPECT_NEAR(t.day_of_year, 36.25, 1e-12);
  t = at("days since 2001-01-01", "365_day", 400.25);
  EXPECT_NEAR(t.day_of_year, 36.25, 1e-12);
  t = at("days since 2001-01-01", "360_day", 400.25);
  EXPECT_EQ(t.year, 2002);
  EXPECT_NEAR(t.day_of_year, 30.0 + 11.25, 1e-12);
  t = at("days since 2001-01-01", "all_leap", 400.25);
  EXPECT_EQ(t.year, 2002);
  EXPECT_NEAR(t.day_of_year, 35.25, 1e-12);
  EXPECT_NEAR(t.hour, 6.0, 1e-9);
}

TEST(CfTime, RejectsWhatItDoesNotUnderstand) {
  EXPECT_FALSE(parse_time_units("days", ""));
  EXPECT_FALSE(parse_time_units("months since 2001-01-01", "")); // not a fixed length (CF 1.8 §4.4)
  EXPECT_FALSE(parse_time_units("days since 2001-13-01", ""));
  EXPECT_FALSE(parse_time_units("days since 2001-02-30", "standard"));
  EXPECT_TRUE(parse_time_units("days since 2001-02-30", "360_day"));
  EXPECT_FALSE(parse_time_units("days since 2001-01-01", "julian"));
  EXPECT_FALSE(parse_time_units("hours since 2001-01-01 25:00:00", ""));
}

} // namespace
} // namespace bandstack::io::detail

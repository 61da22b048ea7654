// Text escaping, number formatting and the colours of the report's plots.
#include <algorithm>
#include <array>
#include <cmath>

#include <fmt/format.h>

#include "bandstack/report/svg.hpp"

namespace bandstack::report {

std::string escape_xml(std::string_view text) {
  std::string out;
  out.reserve(text.size());
  for (const char c : text) {
    switch (c) {
    case '&': out += "&amp;"; break;
    case '<': out += "&lt;"; break;
    case '>': out += "&gt;"; break;
    case '"': out += "&quot;"; break;
    case '\'': out += "&#39;"; break;
    default:
      // Control characters other than tab and newline are not allowed in XML 1.0.
      if (static_cast<unsigned char>(c) < 0x20 && c != '\t' && c != '\n') out += ' ';
      else out += c;
    }
  }
  return out;
}

std::string format_number(double value, int significant) {
  if (std::isnan(value)) return "NaN";
  if (std::isinf(value)) return value > 0 ? "inf" : "-inf";
  if (value == 0.0) return "0"; // also -0
  // fmt is locale-independent unless asked otherwise ('L').
  return fmt::format("{:.{}g}", value, std::max(1, significant));
}

std::string to_hex(const Rgb& c) {
  const auto byte = [](double v) { return static_cast<int>(std::lround(std::clamp(v, 0.0, 1.0) * 255.0)); };
  return fmt::format("#{:02x}{:02x}{:02x}", byte(c.r), byte(c.g), byte(c.b));
}

double relative_luminance(const Rgb& c) {
  // WCAG 2.1, "relative luminance": sRGB linearisation, then Rec. 709 weights (from memory).
  const auto linear = [](double v) { return v <= 0.04045 ? v / 12.92 : std::pow((v + 0.055) / 1.055, 2.4); };
  return 0.2126 * linear(c.r) + 0.7152 * linear(c.g) + 0.0722 * linear(c.b);
}

namespace {

constexpr Rgb from_bytes(int r, int g, int b) { return {r / 255.0, g / 255.0, b / 255.0}; }

} // namespace

Rgb category_colour(std::size_t i) {
  // Okabe & Ito (2008) "Color Universal Design" palette (hex values from memory), ordered so the
  // first series print dark and yellow, weakest on white paper, comes last.
  static constexpr std::array<Rgb, 8> palette = {
      from_bytes(0x00, 0x00, 0x00), // black
      from_bytes(0x00, 0x72, 0xB2), // blue
      from_bytes(0xD5, 0x5E, 0x00), // vermillion
      from_bytes(0x00, 0x9E, 0x73), // bluish green
      from_bytes(0xCC, 0x79, 0xA7), // reddish purple
      from_bytes(0xE6, 0x9F, 0x00), // orange
      from_bytes(0x56, 0xB4, 0xE9), // sky blue
      from_bytes(0xF0, 0xE4, 0x42), // yellow
  };
  return palette[i % palette.size()];
}

std::string_view dash_pattern(std::size_t i) {
  static constexpr std::array<std::string_view, 5> patterns = {"", "7 3", "2 2.5", "9 3 2 3", "4 4"};
  return patterns[i % patterns.size()];
}

Rgb sequential_colour(double t) {
  if (std::isnan(t)) return from_bytes(0xDD, 0xDD, 0xDD);
  // Anchors of the cividis map at t = 0, 1/4, 1/2, 3/4, 1 (Nuñez, Anderton & Renslow 2018; values
  // from memory), joined linearly in sRGB: a cividis-like sequence, not the published table.
  static constexpr std::array<Rgb, 5> anchors = {
      from_bytes(0x00, 0x20, 0x4D), from_bytes(0x41, 0x4D, 0x6B), from_bytes(0x7C, 0x7B, 0x78),
      from_bytes(0xBC, 0xAF, 0x6F), from_bytes(0xFF, 0xEA, 0x46)};
  const double x = std::clamp(t, 0.0, 1.0) * static_cast<double>(anchors.size() - 1);
  const auto k = std::min<std::size_t>(static_cast<std::size_t>(x), anchors.size() - 2);
  const double f = x - static_cast<double>(k);
  const Rgb& a = anchors[k];
  const Rgb& b = anchors[k + 1];
  return {a.r + f * (b.r - a.r), a.g + f * (b.g - a.g), a.b + f * (b.b - a.b)};
}

} // namespace bandstack::report

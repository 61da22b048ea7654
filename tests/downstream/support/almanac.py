"""The low-precision Sun of The Astronomical Almanac (U.S. Naval Observatory, "Approximate solar
coordinates", about 1 arcminute within two centuries of 2000), written independently of bandstack for
the downstream checks. Day 1.0 of the year = 2001 January 1, 0h UT (n = 365.5 days from J2000.0)."""
import math


def solar_position(day):
    """Declination (rad) and (1 AU / distance)^2 on day `day` (fractional) of the year."""
    n = 365.5 + (day - 1.0)
    mean_longitude = 280.460 + 0.9856474 * n
    g = math.radians(357.528 + 0.9856003 * n)
    longitude = math.radians(mean_longitude + 1.915 * math.sin(g) + 0.020 * math.sin(2.0 * g))
    obliquity = math.radians(23.439 - 0.0000004 * n)
    r = 1.00014 - 0.01671 * math.cos(g) - 0.00014 * math.cos(2.0 * g)
    return math.asin(math.sin(obliquity) * math.sin(longitude)), 1.0 / (r * r)

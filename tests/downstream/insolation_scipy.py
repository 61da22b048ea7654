#!/usr/bin/python3
"""Daily- and annual-mean insolation from bandstack (insolation_tool) against an independent
numpy/scipy computation.

- Solar position: the low-precision formulas for the Sun of The Astronomical Almanac, written here
  again (n days from J2000.0; day 1.0 of the year = 2001 January 1, 0h UT, n = 365.5), to 1e-12.
- Daily mean: scipy.integrate.quad over the hour angle of S0 (d0/d)^2 max(0, cos z) / (2 pi), with
  cos z = sin(phi) sin(delta) + cos(phi) cos(delta) cos(h) and the sunset found by scipy.optimize.brentq
  (no closed form); the insolation-weighted cos z = integral(mu^2) / integral(mu) over the sunlit
  hours; the effective daylight fraction = Q / (S0 (d0/d)^2 mu_bar). Tolerance 1e-10 relative.
- Annual mean: scipy.integrate.quad over one tropical year (365.2422 days from day 1.0) of the
  textbook closed form (S0/pi)(d0/d)^2 (h0 sin(phi) sin(delta) + cos(phi) cos(delta) sin(h0)), and
  the insolation-weighted annual cos z; tolerance 2e-6 relative (bandstack uses a 1461-node
  midpoint rule).
Prints 'insolation_scipy: N passed, M failed (max relative difference ...)'."""
import argparse
import math
import os
import subprocess
import sys

import numpy as np
from scipy import integrate, optimize

sys.path.insert(0, os.path.join(os.path.dirname(os.path.abspath(__file__)), "support"))
from almanac import solar_position  # noqa: E402

DAILY_TOLERANCE = 1e-10
ANNUAL_TOLERANCE = 2e-6
POSITION_TOLERANCE = 1e-12
TROPICAL_YEAR = 365.2422


def trig_latitude(lat):
    if abs(lat) == 90.0:
        return math.copysign(1.0, lat), 0.0
    return math.sin(math.radians(lat)), math.cos(math.radians(lat))


def daily_by_quadrature(lat, dec, factor, s0):
    """(Q, mu_bar) from the definition, integrating over the hour angle."""
    sin_lat, cos_lat = trig_latitude(lat)
    a, b = sin_lat * math.sin(dec), cos_lat * math.cos(dec)
    mu = lambda h: a + b * math.cos(h)
    if mu(math.pi) >= 0.0:
        sunset = math.pi
    elif mu(0.0) <= 0.0:
        return 0.0, 0.0
    else:
        sunset = optimize.brentq(mu, 0.0, math.pi, xtol=1e-15, rtol=4 * np.finfo(float).eps, maxiter=200)
    options = dict(epsabs=0.0, epsrel=1e-13, limit=200)
    # (1/2pi) integral_{-pi}^{pi} max(0, mu) dh = (1/pi) integral_0^sunset mu dh
    i1 = integrate.quad(mu, 0.0, sunset, **options)[0]
    i2 = integrate.quad(lambda h: mu(h) ** 2, 0.0, sunset, **options)[0]
    if i1 <= 0.0:
        return 0.0, 0.0
    return s0 * factor * i1 / math.pi, i2 / i1


def closed_form_integrals(lat, dec):
    """Textbook closed forms of integral_0^h0 mu dh and integral_0^h0 mu^2 dh."""
    sin_lat, cos_lat = trig_latitude(lat)
    a, b = sin_lat * math.sin(dec), cos_lat * math.cos(dec)
    if a >= b:
        h0 = math.pi
    elif a <= -b:
        return 0.0, 0.0
    else:
        h0 = math.acos(-a / b)
    i1 = a * h0 + b * math.sin(h0)
    i2 = a * a * h0 + 2.0 * a * b * math.sin(h0) + b * b * (0.5 * h0 + 0.25 * math.sin(2.0 * h0))
    return i1, i2


def annual_by_quadrature(lat, s0):
    """(Q_annual, mu_bar, mean distance factor) by quad over one tropical year."""
    def weighted(day, which):
        dec, factor = solar_position(day)
        if which == 0:
            return factor
        return factor * closed_form_integrals(lat, dec)[which - 1]
    options = dict(epsabs=1e-14, epsrel=1e-11, limit=400)
    end = 1.0 + TROPICAL_YEAR
    factor_mean = integrate.quad(weighted, 1.0, end, args=(0,), **options)[0] / TROPICAL_YEAR
    i1 = integrate.quad(weighted, 1.0, end, args=(1,), **options)[0] / TROPICAL_YEAR
    i2 = integrate.quad(weighted, 1.0, end, args=(2,), **options)[0] / TROPICAL_YEAR
    return s0 * i1 / math.pi, (i2 / i1 if i1 > 0 else 0.0), factor_mean


def relative(ours, theirs, floor):
    return abs(ours - theirs) / max(abs(theirs), floor)


def main():
    parser = argparse.ArgumentParser(description=__doc__)
    parser.add_argument("--exe", required=True)
    parser.add_argument("--tools", required=True)
    parser.add_argument("--workdir", required=True)
    args = parser.parse_args()
    os.makedirs(args.workdir, exist_ok=True)

    out = subprocess.run([os.path.join(args.tools, "insolation_tool")], capture_output=True, text=True,
                         check=True).stdout.strip().splitlines()
    if len(out) < 3 or not out[0].startswith("solar_constant_w_m2") or not out[1].startswith("kind latitude_deg"):
        print("insolation_scipy: unexpected tool output header %r" % out[:2])
        return 1
    s0 = float(out[0].split()[1])

    passed = failed = 0
    worst = {"position": 0.0, "daily": 0.0, "annual": 0.0}
    log_lines = []

    def check(kind, label, ours, theirs, tolerance, floor=1.0):
        nonlocal passed, failed
        rel = relative(ours, theirs, floor)
        worst[kind] = max(worst[kind], rel)
        if rel <= tolerance and math.isfinite(ours):
            passed += 1
        else:
            failed += 1
            print("MISMATCH %s: bandstack %.17g scipy %.17g (rel %.3g)" % (label, ours, theirs, rel))

    for line in out[2:]:
        fields = line.split()
        if fields[0] == "daily":
            lat, day, dec, factor, q, mu_bar, fraction = map(float, fields[1:])
            my_dec, my_factor = solar_position(day)
            check("position", "declination %g" % day, dec, my_dec, POSITION_TOLERANCE)
            check("position", "distance factor %g" % day, factor, my_factor, POSITION_TOLERANCE)
            ref_q, ref_mu = daily_by_quadrature(lat, my_dec, my_factor, s0)
            where = "lat %g day %g" % (lat, day)
            check("daily", "insolation " + where, q, ref_q, DAILY_TOLERANCE, floor=1e-3 * s0)
            check("daily", "cos zenith " + where, mu_bar, ref_mu, DAILY_TOLERANCE, floor=1e-3)
            ref_fraction = ref_q / (s0 * my_factor * ref_mu) if ref_mu > 0 else 0.0
            check("daily", "daylight fraction " + where, fraction, ref_fraction, DAILY_TOLERANCE, floor=1e-3)
        elif fields[0] == "annual":
            lat = float(fields[1])
            factor, q, mu_bar, fraction = map(float, fields[4:])
            ref_q, ref_mu, ref_factor = annual_by_quadrature(lat, s0)
            where = "annual lat %g" % lat
            check("annual", "insolation " + where, q, ref_q, ANNUAL_TOLERANCE)
            check("annual", "cos zenith " + where, mu_bar, ref_mu, ANNUAL_TOLERANCE)
            check("annual", "distance factor " + where, factor, ref_factor, ANNUAL_TOLERANCE)
            check("annual", "daylight fraction " + where, fraction, ref_q / (s0 * ref_factor * ref_mu),
                  ANNUAL_TOLERANCE)
            log_lines.append("%s: bandstack %.6f scipy %.6f W m-2" % (where, q, ref_q))
        else:
            print("insolation_scipy: unexpected row %r" % line)
            return 1

    with open(os.path.join(args.workdir, "insolation_scipy.txt"), "w") as log:
        log.write("\n".join(log_lines) + "\n")
        log.write("max relative differences: %r\n" % worst)
    print("insolation_scipy: %d passed, %d failed (max relative difference: position %.2g, daily %.2g, annual %.2g)"
          % (passed, failed, worst["position"], worst["daily"], worst["annual"]))
    return 0 if failed == 0 and passed > 0 else 1


if __name__ == "__main__":
    sys.exit(main())

#!/usr/bin/python3
"""Band radiances from bandstack (planck_table_tool) against an independent evaluation:
scipy.integrate.quad of the Planck function written here from scipy.constants (CODATA 2018
in scipy >= 1.4). Tolerance 1e-9 relative. Prints 'planck_scipy: N passed, M failed'."""
import argparse
import math
import os
import random
import subprocess
import sys

import numpy as np
from scipy import constants, integrate

TOLERANCE = 1e-9


def planck_per_cm1(nu_cm1, t_k):
    """B_nu(T) in W m-2 sr-1 (cm-1)-1 with nu in cm-1: 2 h c^2 nu^3 / (exp(h c nu / k T) - 1)."""
    h, c, k = constants.h, constants.c, constants.k
    nu_m = 100.0 * nu_cm1
    x = h * c * nu_m / (k * t_k)
    if x == 0.0 or x > 700.0:
        return 0.0
    return 2.0 * h * c * c * nu_m ** 3 / np.expm1(x) * 100.0


def band_radiance(nu1, nu2, t_k):
    h, c, k = constants.h, constants.c, constants.k
    nu_of_x = lambda x: x * k * t_k / (h * c * 100.0)
    options = dict(epsabs=0.0, epsrel=1e-12, limit=500)
    f = lambda nu: planck_per_cm1(nu, t_k)
    if math.isinf(nu2):
        split = max(nu1, nu_of_x(60.0))  # beyond x = 60 the tail is below 1e-20 of the total
        head = integrate.quad(f, nu1, split, **options)[0] if split > nu1 else 0.0
        return head + integrate.quad(f, split, math.inf, **options)[0]
    peak = nu_of_x(2.821439372)  # B_nu peak (Wien), a hint for the adaptive rule
    points = [peak] if nu1 < peak < nu2 else None
    return integrate.quad(f, nu1, nu2, points=points, **options)[0]


def extra_bands():
    rng = random.Random(20240501)
    bands = []
    for _ in range(40):
        t = 100.0 * 60.0 ** rng.random()
        nu1 = 10.0 ** (rng.random() * 3.7)
        width = 10.0 ** (-2.0 + rng.random() * 5.0)
        bands.append((nu1, nu1 + width, t))
    bands += [(0.0, 0.01, 288.0), (4999.99, 5000.0, 100.0), (1.0, 5000.0, 6000.0), (1.0, math.inf, 100.0)]
    return bands


def run_tool(tool, stdin_text=None):
    args = [tool] + (["--stdin"] if stdin_text is not None else [])
    out = subprocess.run(args, input=stdin_text, capture_output=True, text=True, check=True).stdout
    lines = out.strip().splitlines()
    if not lines or not lines[0].startswith("nu1_cm1"):
        raise RuntimeError("unexpected tool output header: %r" % (lines[:1],))
    return [tuple(float(v) for v in line.split()) for line in lines[1:]]


def main():
    parser = argparse.ArgumentParser(description=__doc__)
    parser.add_argument("--exe", required=True)
    parser.add_argument("--tools", required=True)
    parser.add_argument("--workdir", required=True)
    args = parser.parse_args()
    os.makedirs(args.workdir, exist_ok=True)

    # The independent side must really use CODATA 2018 (exact h and k of the 2019 SI).
    if constants.h != 6.62607015e-34 or constants.k != 1.380649e-23:
        print("planck_scipy: scipy.constants is not CODATA 2018; need scipy >= 1.4")
        return 1

    tool = os.path.join(args.tools, "planck_table_tool")
    rows = run_tool(tool)
    stdin_text = "".join("%r %r %r\n" % b for b in extra_bands())
    rows += run_tool(tool, stdin_text)

    passed = failed = 0
    worst = 0.0
    for nu1, nu2, t_k, ours in rows:
        theirs = band_radiance(nu1, nu2, t_k)
        rel = abs(ours - theirs) / abs(theirs)
        worst = max(worst, rel)
        if rel <= TOLERANCE:
            passed += 1
        else:
            failed += 1
            print("MISMATCH %g..%g cm-1 at %g K: bandstack %.17g scipy %.17g (rel %.3g)" % (nu1, nu2, t_k, ours, theirs, rel))
    with open(os.path.join(args.workdir, "planck_scipy.txt"), "w") as log:
        log.write("max relative difference %.3g over %d bands\n" % (worst, len(rows)))
    print("planck_scipy: %d passed, %d failed (max relative difference %.2g)" % (passed, failed, worst))
    return 0 if failed == 0 and passed > 0 else 1


if __name__ == "__main__":
    sys.exit(main())

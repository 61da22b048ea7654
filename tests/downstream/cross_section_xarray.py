#!/usr/bin/python3
"""A researcher's cross-section file, written with xarray as docs/cross-section-file.md describes,
loaded by bandstack (cross_section_tool) and compared with an independent numpy evaluation of the
documented interpolation: linear in temperature, in ln(pressure) and in wavenumber. Also checks that
per-molecule units are converted (N_A from scipy.constants, CODATA 2018 in scipy >= 1.4; molar mass
of water 18.01528 g/mol, IUPAC atomic weights) and that a bad value and an out-of-range state give
clear errors. Prints 'cross_section_xarray: N passed, M failed'."""
import argparse
import os
import subprocess
import sys

import numpy as np
import xarray as xr
from scipy import constants

TOLERANCE = 1e-10
MOLAR_MASS_H2O = 18.01528e-3  # kg/mol


def make_dataset(rng):
    nu = np.cumsum(rng.uniform(0.05, 0.4, size=400)) + 600.0  # non-uniform, strictly increasing
    p = np.array([1000.0, 5000.0, 20000.0, 60000.0, 101325.0])
    t = np.array([190.0, 230.0, 270.0, 310.0])
    shape = (t.size, p.size, nu.size)
    co2 = np.exp(rng.normal(0.0, 3.0, size=shape))                 # m2 kg-1
    h2o = 1e-21 * np.exp(rng.normal(0.0, 2.0, size=shape))         # cm2 molecule-1
    cont = 1e-6 * rng.uniform(0.5, 2.0, size=shape)                # m2 kg-1 Pa-1
    dims = ("temperature", "pressure", "wavenumber")
    ds = xr.Dataset(
        {
            "co2_mass_absorption_coefficient": (dims, co2, {"units": "m2 kg-1"}),
            "h2o_mass_absorption_coefficient": (dims, h2o, {"units": "cm2 molecule-1"}),
            "h2o_self_continuum_mass_absorption_coefficient": (dims, cont, {"units": "m2 kg-1 Pa-1"}),
        },
        coords={
            "wavenumber": ("wavenumber", nu, {"units": "cm-1"}),
            "pressure": ("pressure", p, {"units": "Pa"}),
            "temperature": ("temperature", t, {"units": "K"}),
        },
        attrs={"title": "downstream test table", "source": "random numbers from numpy, written by xarray"},
    )
    return ds


def bracket(x, v):
    k = int(np.clip(np.searchsorted(x, v, side="right") - 1, 0, x.size - 2))
    return k, (v - x[k]) / (x[k + 1] - x[k])


def expected_kappa(ds, name, nu, p, t):
    """Trilinear interpolation written independently: T linear, ln p linear, nu linear."""
    var = ds[name + "_mass_absorption_coefficient"]
    table = var.values
    it, wt = bracket(ds["temperature"].values, t)
    ip, wp = bracket(np.log(ds["pressure"].values), np.log(p))
    inu, wnu = bracket(ds["wavenumber"].values, nu)
    total = 0.0
    for dt, ft in ((0, 1.0 - wt), (1, wt)):
        for dp, fp in ((0, 1.0 - wp), (1, wp)):
            for dn, fn in ((0, 1.0 - wnu), (1, wnu)):
                total += ft * fp * fn * table[it + dt, ip + dp, inu + dn]
    if var.attrs["units"] == "cm2 molecule-1":
        total *= 1e-4 * constants.N_A / MOLAR_MASS_H2O
    return total


def run_tool(tool, path, queries):
    text = "".join("%s %.17g %.17g %.17g\n" % q for q in queries)
    return subprocess.run([tool, path], input=text, capture_output=True, text=True)


def main():
    parser = argparse.ArgumentParser(description=__doc__)
    parser.add_argument("--exe", required=True)
    parser.add_argument("--tools", required=True)
    parser.add_argument("--workdir", required=True)
    args = parser.parse_args()
    os.makedirs(args.workdir, exist_ok=True)
    tool = os.path.join(args.tools, "cross_section_tool")
    rng = np.random.default_rng(20240611)
    passed = failed = 0

    def check(ok, what):
        nonlocal passed, failed
        if ok:
            passed += 1
        else:
            failed += 1
            print("FAILED:", what)

    ds = make_dataset(rng)
    path = os.path.join(args.workdir, "researcher_table.nc")
    ds.to_netcdf(path)

    nu, p, t = ds["wavenumber"].values, ds["pressure"].values, ds["temperature"].values
    queries = []
    for name in ("co2", "h2o", "h2o_self_continuum"):
        for _ in range(40):
            queries.append((name, rng.uniform(nu[0] + 1e-3, nu[-1] - 1e-3),
                            float(np.exp(rng.uniform(np.log(p[0]), np.log(p[-1])))), rng.uniform(t[0], t[-1])))
        queries.append((name, nu[17], p[2], t[1]))   # a table node
        queries.append((name, nu[-1] - 1e-7, p[-1], t[-1]))  # the far corner
    result = run_tool(tool, path, queries)
    check(result.returncode == 0, "tool exit code %d: %s" % (result.returncode, result.stderr.strip()))
    lines = result.stdout.strip().splitlines()
    check(len(lines) == len(queries) + 2, "expected %d output lines, got %d" % (len(queries) + 2, len(lines)))
    check(lines[:1] and "downstream test table" in lines[0], "description line: %r" % lines[:1])
    worst = 0.0
    for line in lines[2:]:
        name, nu_used, p_used, t_used, kappa = line.split()
        expected = expected_kappa(ds, name, float(nu_used), float(p_used), float(t_used))
        error = abs(float(kappa) - expected) / expected
        worst = max(worst, error)
        check(error < TOLERANCE, "%s: bandstack %s, numpy %.17g (relative %.3g)" % (line, kappa, expected, error))

    # A negative coefficient: the tool must refuse the file, naming file, variable and index.
    bad = make_dataset(rng)
    bad["co2_mass_absorption_coefficient"].values[2, 3, 44] = -1.0
    bad_path = os.path.join(args.workdir, "negative_value.nc")
    bad.to_netcdf(bad_path)
    result = run_tool(tool, bad_path, [("co2", 610.0, 5e4, 250.0)])
    check(result.returncode == 2, "negative value: exit code %d" % result.returncode)
    for words in (bad_path, "co2_mass_absorption_coefficient", "temperature 2, pressure 3, wavenumber 44"):
        check(words in result.stderr, "negative value: %r not in %r" % (words, result.stderr))

    # A state colder than the table: a clear error with the range.
    result = run_tool(tool, path, [("co2", 610.0, 5e4, 150.0)])
    check(result.returncode == 2 and "[190, 310] K" in result.stderr,
          "cold state: exit %d, %r" % (result.returncode, result.stderr))

    print("cross_section_xarray: worst relative difference %.3g over %d queries" % (worst, len(queries)))
    print("cross_section_xarray: %d passed, %d failed" % (passed, failed))
    return 0 if failed == 0 else 1


if __name__ == "__main__":
    sys.exit(main())

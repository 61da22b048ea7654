#!/usr/bin/python3
"""A reanalysis-like profile file written with xarray (packed int16 temperature, float32 humidity and
ozone mass fraction, pressure levels bottom first in "millibars", an encoded time axis), read by
bandstack (profile_file_tool) and compared with an independent numpy evaluation of
docs/profile-file.md: unpacking, specific humidity and mass fraction to mole fraction (molar masses:
dry air 28.9644 g/mol, U.S. Standard Atmosphere 1976; water 18.01528 g/mol and ozone 47.9982 g/mol,
IUPAC atomic weights), top-first order, levels midway in ln p. Also checks that the time axis keeps
its units and calendar, and that NaN and fill values are refused with their index.
Prints 'profile_file_xarray: N passed, M failed'."""
import argparse
import os
import subprocess
import sys

import numpy as np
import pandas as pd
import xarray as xr

TOLERANCE = 1e-12
M_DRY = 28.9644e-3
M_H2O = 18.01528e-3
M_O3 = 47.9982e-3
LEVELS_HPA = np.array([1000.0, 850.0, 500.0, 250.0, 100.0, 10.0])  # bottom first, as in the file


def make_dataset(rng):
    shape = (2, LEVELS_HPA.size, 3, 4)  # time, level, latitude, longitude
    dims = ("time", "level", "latitude", "longitude")
    top_down = np.arange(LEVELS_HPA.size)[::-1].reshape(1, -1, 1, 1)  # 0 at the top level
    t = 210.0 + 12.0 * top_down + rng.uniform(-3.0, 3.0, size=shape)
    q = (1e-6 + 2e-3 * (top_down / 5.0) ** 3 * rng.uniform(0.5, 1.5, size=shape)).astype(np.float32)
    o3 = (1.6e-5 * np.exp(-top_down) * rng.uniform(0.8, 1.2, size=shape) + 3e-8).astype(np.float32)
    ds = xr.Dataset(
        {
            "t": (dims, t, {"units": "K", "standard_name": "air_temperature", "long_name": "Temperature"}),
            "q": (dims, q, {"units": "kg kg**-1", "standard_name": "specific_humidity"}),
            "o3": (dims, o3, {"units": "kg kg**-1", "standard_name": "mass_fraction_of_ozone_in_air"}),
        },
        coords={
            "time": ("time", pd.to_datetime(["2003-07-01T00:00", "2003-07-01T06:00"])),
            "level": ("level", LEVELS_HPA.astype(np.int32), {"units": "millibars", "long_name": "pressure_level"}),
            "latitude": ("latitude", np.array([10.0, 0.0, -10.0], dtype=np.float32), {"units": "degrees_north"}),
            "longitude": ("longitude", np.array([0.0, 0.25, 0.5, 0.75], dtype=np.float32), {"units": "degrees_east"}),
        },
    )
    encoding = {
        "t": {"dtype": "int16", "scale_factor": 0.0025, "add_offset": 250.0, "_FillValue": np.int16(-32767)},
        "time": {"units": "hours since 1900-01-01 00:00:00.0", "calendar": "gregorian", "dtype": "int32"},
    }
    return ds, encoding


def run_tool(tool, path, *mapping):
    return subprocess.run([tool, path, *mapping], capture_output=True, text=True)


def main():
    parser = argparse.ArgumentParser(description=__doc__)
    parser.add_argument("--exe", required=True)
    parser.add_argument("--tools", required=True)
    parser.add_argument("--workdir", required=True)
    args = parser.parse_args()
    os.makedirs(args.workdir, exist_ok=True)
    tool = os.path.join(args.tools, "profile_file_tool")
    rng = np.random.default_rng(20240712)
    passed = failed = 0

    def check(ok, what):
        nonlocal passed, failed
        if ok:
            passed += 1
        else:
            failed += 1
            print("FAILED:", what)

    ds, encoding = make_dataset(rng)
    path = os.path.join(args.workdir, "reanalysis_like.nc")
    ds.to_netcdf(path, encoding=encoding)

    result = run_tool(tool, path, "pressure=level")
    check(result.returncode == 0, "tool exit code %d: %s" % (result.returncode, result.stderr.strip()))
    lines = result.stdout.splitlines()

    # Expected values from the raw file: unpack in float64 ourselves.
    raw = xr.open_dataset(path, mask_and_scale=False, decode_times=False)
    t_var = raw["t"]
    t = t_var.values.astype(np.float64) * float(t_var.attrs["scale_factor"]) + float(t_var.attrs["add_offset"])
    q = raw["q"].values.astype(np.float64)
    w_o3 = raw["o3"].values.astype(np.float64)
    p = raw["level"].values.astype(np.float64) * 100.0  # 1 hPa = 100 Pa
    order = np.argsort(p)  # top first
    x_h2o = (q / M_H2O) / (q / M_H2O + (1.0 - q) / M_DRY)
    x_o3 = w_o3 * (x_h2o * M_H2O + (1.0 - x_h2o) * M_DRY) / M_O3
    n_time, n_level, n_lat, n_lon = t.shape

    axes = [line.split() for line in lines if line.startswith("axis ")]
    check([a[1] for a in axes] == ["time", "latitude", "longitude"], "axes: %r" % axes)
    check(axes and [float(v) for v in axes[0][3:]] == list(raw["time"].values.astype(float)), "time values: %r" % axes[:1])
    attributes = [line for line in lines if line.startswith("attribute time ")]
    check(any(a.startswith("attribute time units=hours since 1900-01-01") for a in attributes), "time units: %r" % attributes)
    check("attribute time calendar=gregorian" in attributes, "time calendar: %r" % attributes)

    worst = 0.0
    layers = [line.split() for line in lines if line.startswith("layer ")]
    check(len(layers) == n_time * n_lat * n_lon * n_level, "layer lines: %d" % len(layers))
    for fields in layers:
        c, i = int(fields[1]), int(fields[2])
        it, rest = divmod(c, n_lat * n_lon)
        iy, ix = divmod(rest, n_lon)
        k = order[i]
        got = [float(v) for v in fields[3:]]
        want = [p[k], t[it, k, iy, ix], x_h2o[it, k, iy, ix], 400e-6, x_o3[it, k, iy, ix], 1.8e-6, 0.32e-6]
        for name, g, e in zip(("p", "T", "h2o", "co2", "o3", "ch4", "n2o"), got, want):
            error = abs(g - e) / abs(e)
            worst = max(worst, error)
            check(error < TOLERANCE, "column %d layer %d %s: bandstack %.17g, numpy %.17g" % (c, i, name, g, e))

    # Levels of one column: midway in ln p; surface temperature on the ln p line of the two lowest layers.
    c = 17
    it, rest = divmod(c, n_lat * n_lon)
    iy, ix = divmod(rest, n_lon)
    pl, tl = p[order], t[it, order, iy, ix]
    want_p = np.concatenate(([pl[0] * np.sqrt(pl[0] / pl[1])], np.sqrt(pl[:-1] * pl[1:]), [pl[-1] * np.sqrt(pl[-1] / pl[-2])]))
    t_surface = tl[-1] + (tl[-1] - tl[-2]) * np.log(want_p[-1] / pl[-1]) / np.log(pl[-1] / pl[-2])
    want_t = np.concatenate(([tl[0]], 0.5 * (tl[:-1] + tl[1:]), [t_surface]))
    levels = [line.split() for line in lines if line.startswith("level %d " % c)]
    check(len(levels) == n_level + 1, "level lines: %d" % len(levels))
    for fields in levels:
        k = int(fields[2])
        for g, e in ((float(fields[3]), want_p[k]), (float(fields[4]), want_t[k])):
            check(abs(g - e) <= TOLERANCE * abs(e), "column %d level %d: bandstack %.17g, numpy %.17g" % (c, k, g, e))
    surface = [float(line.split()[2]) for line in lines if line.startswith("surface %d " % c)]
    check(len(surface) == 1 and abs(surface[0] - t_surface) <= TOLERANCE * t_surface,
          "surface temperature of column %d: bandstack %r, numpy %.17g" % (c, surface, t_surface))

    # Bad values: a NaN humidity and a packed temperature at its fill value, named with their index.
    bad, encoding = make_dataset(rng)
    bad["q"].values[1, 2, 0, 3] = np.nan
    bad_path = os.path.join(args.workdir, "nan_humidity.nc")
    bad.to_netcdf(bad_path, encoding=encoding)
    result = run_tool(tool, bad_path, "pressure=level")
    check(result.returncode == 2, "NaN humidity: exit code %d" % result.returncode)
    for words in (bad_path, "'q'", "(time 1, level 2, latitude 0, longitude 3)"):
        check(words in result.stderr, "NaN humidity: %r not in %r" % (words, result.stderr))
    bad, encoding = make_dataset(rng)
    bad["t"].values[0, 5, 2, 1] = np.nan  # written as the _FillValue -32767
    bad_path = os.path.join(args.workdir, "missing_temperature.nc")
    bad.to_netcdf(bad_path, encoding=encoding)
    result = run_tool(tool, bad_path, "pressure=level")
    check(result.returncode == 2, "missing temperature: exit code %d" % result.returncode)
    for words in ("'t'", "_FillValue -32767", "(time 0, level 5, latitude 2, longitude 1)"):
        check(words in result.stderr, "missing temperature: %r not in %r" % (words, result.stderr))

    print("profile_file_xarray: worst relative difference %.3g over %d layers" % (worst, len(layers)))
    print("profile_file_xarray: %d passed, %d failed" % (passed, failed))
    return 0 if failed == 0 else 1


if __name__ == "__main__":
    sys.exit(main())

"""Downstream check: the Sun taken from a profile file's coordinates (sun_from_file, docs/profile-file.md).

A file of invented columns on (time, lat, lon) is written with xarray; bandstack runs it with
sun_from_file = "instantaneous" and "daily_mean", for a standard and a noleap calendar. The incoming
sunlight at the top of each column is compared with an independent computation from the times as
xarray (with cftime for noleap) decodes them:
- Solar position: the low-precision Sun of The Astronomical Almanac (U.S. Naval Observatory,
  "Approximate solar coordinates"; day 1.0 = 2001 January 1, 0h UT, n = 365.5 + day - 1), written here.
- Instantaneous: S0 (d0/d)^2 max(0, cos z) with cos z = sin(phi) sin(delta) + cos(phi) cos(delta) cos(h),
  h = (local mean solar time - 12) * 15 degrees, local mean solar time = UTC hour + longitude / 15.
- Daily mean: the textbook closed form (S0/pi)(d0/d)^2 (h0 sin(phi) sin(delta) + cos(phi) cos(delta)
  sin(h0)) with cos(h0) = -tan(phi) tan(delta), clipped to polar day and night (e.g. Hartmann 1994,
  "Global Physical Climatology", eq. 2.15, from memory).
Also: a file without a longitude coordinate is refused for instantaneous (exit 2, message names
"longitude"); sweeping cos_zenith with sun_from_file is refused (exit 2).
"""
import math
import os
import subprocess
import sys

import numpy as np
import pandas as pd
import xarray as xr

sys.path.insert(0, os.path.join(os.path.dirname(os.path.abspath(__file__)), "support"))
from checks import Checks, parse_args, run_study  # noqa: E402
from almanac import solar_position  # noqa: E402

check = Checks("profile_sun_xarray")
S0 = 1361.0  # W m-2, the study's default solar constant (docs/study-file.md)
TOLERANCE = 1e-9  # W m-2 relative to S0


def instantaneous(lat, day, lst):
    dec, factor = solar_position(day)
    phi = math.radians(lat)
    h = math.radians((lst - 12.0) * 15.0)
    mu = math.sin(phi) * math.sin(dec) + math.cos(phi) * math.cos(dec) * math.cos(h)
    return S0 * factor * max(mu, 0.0)


def daily_mean(lat, day):
    dec, factor = solar_position(day)
    phi = math.radians(lat)
    x = -math.tan(phi) * math.tan(dec)
    h0 = math.pi if x <= -1.0 else 0.0 if x >= 1.0 else math.acos(x)
    return S0 / math.pi * factor * (h0 * math.sin(phi) * math.sin(dec) + math.cos(phi) * math.cos(dec) * math.sin(h0))


def write_file(path, calendar, with_longitude=True):
    p_hpa = np.array([20.0, 100.0, 300.0, 500.0, 700.0, 850.0, 950.0])
    lat = np.array([-70.0, -20.0, 15.0, 50.0, 80.0])
    lon = np.array([-120.0, 0.0, 95.0])
    hours = np.array([0.0, 9.5, 30.0, 24.0 * 400 + 17.0])  # hours since 2032-01-15 (invented dates; 2032 is a leap year)
    temp = 288.0 - 60.0 * np.log(1000.0 / p_hpa) / np.log(50.0)
    ta = np.broadcast_to(temp, (hours.size, lat.size, lon.size, p_hpa.size)).copy()
    coords = {
        "time": ("time", hours, {"units": "hours since 2032-01-15 00:00:00", "calendar": calendar,
                                 "standard_name": "time"}),
        "lat": ("lat", lat, {"units": "degrees_north", "standard_name": "latitude"}),
        "level": ("level", p_hpa, {"units": "hPa", "standard_name": "air_pressure", "positive": "down"}),
    }
    dims = ("time", "lat", "lon", "level")
    if with_longitude:
        coords["lon"] = ("lon", lon, {"units": "degrees_east", "standard_name": "longitude"})
    ds = xr.Dataset({"ta": (dims, ta, {"units": "K", "standard_name": "air_temperature"})}, coords=coords)
    ds.to_netcdf(path)
    return lat, lon


STUDY = """title = "Sun from the file (invented scenario)"
[longwave]
method = "grey"
[[columns]]
name = "field"
profile_file = "{profile}"
sun_from_file = "{mode}"
surface_albedo = 0.2
{extra}
[output]
file = "{out}"
"""


def write_study(folder, name, profile, mode, extra=""):
    path = os.path.join(folder, name + ".toml")
    with open(path, "w") as f:
        f.write(STUDY.format(profile=profile, mode=mode, out=name + ".nc", extra=extra))
    return path


def main():
    args = parse_args()
    work = args.workdir
    for calendar in ("standard", "noleap"):
        profile = os.path.join(work, f"field_{calendar}.nc")
        lat, lon = write_file(profile, calendar)
        decoded = xr.open_dataset(profile, use_cftime=True).time
        day = (decoded.dt.dayofyear + decoded.dt.hour / 24.0 + decoded.dt.minute / 1440.0).values.astype(float)
        utc = (decoded.dt.hour + decoded.dt.minute / 60.0).values.astype(float)
        for mode in ("instantaneous", "daily_mean"):
            name = f"sun_{calendar}_{mode}"
            run_study(args.exe, write_study(work, name, profile, mode), work)
            with xr.open_dataset(os.path.join(work, name + ".nc")) as ds:
                toa = ds.toa_sw_flux_down
                check(toa.dims == ("time", "lat", "lon"), f"{name}: toa_sw_flux_down dims {toa.dims}")
                worst = 0.0
                for t in range(day.size):
                    for i, phi in enumerate(lat):
                        for j, lam in enumerate(lon):
                            if mode == "instantaneous":
                                expected = instantaneous(phi, day[t], (utc[t] + lam / 15.0) % 24.0)
                            else:
                                expected = daily_mean(phi, day[t])
                            got = float(toa.values[t, i, j])
                            worst = max(worst, abs(got - expected))
                            check(abs(got - expected) <= TOLERANCE * S0,
                                  f"{name} (t {t}, lat {phi}, lon {lam}): {got} W m-2, expected {expected}")
                print(f"{name}: {toa.size} columns, largest difference {worst:.2e} W m-2")
                if mode == "daily_mean":  # the longitude does not matter for a daily mean
                    check(bool((toa.max("lon") == toa.min("lon")).all()), f"{name}: varies with longitude")
    # Refusals.
    no_lon = os.path.join(work, "no_longitude.nc")
    write_file(no_lon, "standard", with_longitude=False)
    bad = write_study(work, "bad_no_lon", no_lon, "instantaneous")
    r = subprocess.run([args.exe, "run", bad, "--out", work], capture_output=True, text=True)
    check(r.returncode == 2 and "longitude" in r.stderr and "no_longitude.nc" in r.stderr,
          f"missing longitude: exit {r.returncode}, {r.stderr.strip()}")
    check(not os.path.exists(os.path.join(work, "bad_no_lon.nc")), "missing longitude left an output file")
    swept = write_study(work, "bad_sweep", os.path.join(work, "field_standard.nc"), "daily_mean",
                        "[[sweeps]]\nkey = \"cos_zenith\"\nvalues = [0.5]\n")
    # [[sweeps]] must come before [[columns]] keys in TOML; put it after the column table instead.
    with open(swept) as f:
        text = f.read().replace('[[sweeps]]\nkey = "cos_zenith"\nvalues = [0.5]\n', "")
    with open(swept, "w") as f:
        f.write(text + '[[sweeps]]\nkey = "cos_zenith"\nvalues = [0.5]\n')
    r = subprocess.run([args.exe, "run", swept, "--out", work], capture_output=True, text=True)
    check(r.returncode == 2 and "sun_from_file" in r.stderr, f"cos_zenith sweep: exit {r.returncode}, {r.stderr.strip()}")
    return check.report()


if __name__ == "__main__":
    sys.exit(main())

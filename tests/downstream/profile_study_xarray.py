"""Downstream check: a study whose column is a netCDF profile file written by xarray (Debian
python3-xarray), as a user's reanalysis-like subset would be: dimensions (time, level, lat), pressure in
hPa from the surface upward, temperature in degC, specific humidity in g/kg, a CF time coordinate.

Checks that the result keeps the file's leading dimensions (time, lat) with their coordinates, that
xarray decodes the time coordinate back to the same dates (CF time units and calendar survive), that
the same profiles in SI units and top-first order give the same results (unit conversion and
ordering), and that the OLR is Earth-like and falls poleward.
"""
import os
import sys

import numpy as np
import pandas as pd
import xarray as xr

sys.path.insert(0, os.path.join(os.path.dirname(os.path.abspath(__file__)), "support"))
from checks import Checks, parse_args, run_study  # noqa: E402

check = Checks("profile_study_xarray")


def profiles():
    """Invented columns over the fictional Brannoch plateau: a 6.5 K/km troposphere on a 16-level grid."""
    p_hpa = np.array([1000, 925, 850, 700, 600, 500, 400, 300, 250, 200, 150, 100, 70, 50, 30, 10], float)
    lat = np.array([10.0, 35.0, 60.0])
    time = pd.date_range("2031-03-01", periods=2, freq="12h")
    t_sfc = np.array([[300.0, 290.0, 275.0], [298.0, 288.0, 272.0]])  # (time, lat)
    z = 7.0 * np.log(1000.0 / p_hpa)  # km, scale height 7 km
    temp = np.maximum(t_sfc[:, None, :] - 6.5 * z[None, :, None], 210.0)  # (time, level, lat), K
    rh = np.clip(0.8 * (p_hpa - 100) / 900, 0.0, None)[None, :, None]
    es = 611.2 * np.exp(17.67 * (temp - 273.15) / (temp - 29.65))  # Bolton (1980), Pa
    q = np.maximum(0.622 * rh * es / (p_hpa[None, :, None] * 100), 3e-6)  # kg/kg
    return p_hpa, lat, time, t_sfc, temp, q


def write_file(path, si):
    p_hpa, lat, time, t_sfc, temp, q = profiles()
    order = slice(None, None, -1) if si else slice(None)  # SI file: top first
    plev = (p_hpa * 100 if si else p_hpa)[order]
    ds = xr.Dataset(
        {
            "ta": (("time", "level", "lat"), (temp if si else temp - 273.15)[:, order, :],
                   {"standard_name": "air_temperature", "units": "K" if si else "degC"}),
            "hus": (("time", "level", "lat"), (q if si else q * 1000)[:, order, :],
                    {"standard_name": "specific_humidity", "units": "kg kg-1" if si else "g/kg"}),
            "ts": (("time", "lat"), t_sfc, {"standard_name": "surface_temperature", "units": "K"}),
        },
        coords={
            "time": ("time", time),
            "level": ("level", plev, {"standard_name": "air_pressure", "units": "Pa" if si else "hPa", "positive": "down"}),
            "lat": ("lat", lat, {"standard_name": "latitude", "units": "degrees_north"}),
        },
    )
    ds.time.encoding.update({"units": "hours since 2031-01-01 00:00:00", "calendar": "proleptic_gregorian"})
    ds.to_netcdf(path)


STUDY = """
title = "Brannoch plateau profiles (invented)"
[longwave]
gauss_angles = 1
{sweep}
[[columns]]
name = "brannoch"
profile_file = "{file}"
co2_ppmv = 415
surface_albedo = 0.2
[output]
file = "{out}"
"""


SWEEP = """[[sweeps]]
key = "co2_ppmv"
values = [280, 560]"""


def run(exe, workdir, name, si, sweep=False):
    write_file(os.path.join(workdir, name + ".nc"), si)
    study = os.path.join(workdir, name + ".toml")
    with open(study, "w") as f:
        f.write(STUDY.format(file=name + ".nc", out=name + "_result.nc", sweep=SWEEP if sweep else ""))
    run_study(exe, study, workdir)
    return os.path.join(workdir, name + "_result.nc")


def main():
    args = parse_args()
    user = xr.open_dataset(run(args.exe, args.workdir, "user_units", si=False))
    si = xr.open_dataset(run(args.exe, args.workdir, "si_units", si=True))

    check(user.olr.dims == ("time", "lat"), f"olr dims {user.olr.dims}")
    check(user.lw_flux_up.dims == ("time", "lat", "level"), f"lw_flux_up dims {user.lw_flux_up.dims}")
    _, lat, time, _, _, _ = profiles()
    check(np.array_equal(user.lat.values, lat) and user.lat.attrs.get("units") == "degrees_north", "lat coordinate kept")
    check(np.array_equal(user.time.values, time.values), f"time decoded to {user.time.values}")
    # Same profiles in other units and order: hPa->Pa, degC->K and g/kg->kg/kg are exact or within an ulp.
    for name in ("olr", "absorbed_solar", "temperature_layer", "pressure_level", "h2o_mole_fraction"):
        check(np.allclose(user[name].values, si[name].values, rtol=1e-12, atol=0), f"{name}: units/order changed the result")
    check(bool(np.all(np.diff(user.pressure_level.values, axis=-1) > 0)), "levels top first")
    # Earth-like clear-sky OLR (satellite climatologies, e.g. Loeb et al. 2018: roughly 150-330 W m-2).
    check(bool(np.all((user.olr.values > 150) & (user.olr.values < 330))), f"OLR {user.olr.values}")
    # Warmer columns emit more (Stefan-Boltzmann sign): at each time, OLR falls from 10N to 60N.
    check(bool(np.all(np.diff(user.olr.values, axis=1) < 0)), "OLR falls poleward")
    # A sweep crosses the file's columns: a new trailing dimension; more CO2, less OLR everywhere.
    swept = xr.open_dataset(run(args.exe, args.workdir, "swept", si=False, sweep=True))
    check(swept.olr.dims == ("time", "lat", "co2_ppmv"), f"swept olr dims {swept.olr.dims}")
    check(bool(np.all(swept.olr.sel(co2_ppmv=560).values < swept.olr.sel(co2_ppmv=280).values)), "OLR falls with CO2")
    check(np.allclose(swept.co2_mole_fraction.sel(co2_ppmv=560).values, 560e-6, rtol=1e-15), "CO2 set in every layer")

    return check.report()


if __name__ == "__main__":
    raise SystemExit(main())

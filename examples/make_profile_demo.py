#!/usr/bin/python3
"""Writes examples/profile_demo.nc: invented soundings over the fictional Brannoch plateau, laid out the
way a reanalysis subset often is (dimensions time, level, lat; pressure in hPa from the surface up;
temperature in degC; specific humidity in g/kg; a CF time axis). Demo data only, not observations.

Run with Debian's python3 (numpy, xarray): /usr/bin/python3 examples/make_profile_demo.py
then: bandstack run examples/profile_demo.toml --out DIR
"""
import os

import numpy as np
import pandas as pd
import xarray as xr

p_hpa = np.array([1000, 925, 850, 700, 600, 500, 400, 300, 250, 200, 150, 100, 70, 50, 30, 20, 10, 5, 2, 1], float)
lat = np.array([12.0, 27.0, 42.0, 57.0])
time = pd.date_range("2031-06-01", periods=4, freq="6h")
# Surface temperature: warmer equatorward and in the afternoon (invented).
t_sfc = 302.0 - 0.45 * (lat[None, :] - 12.0) + 3.0 * np.sin(np.pi * np.arange(4)[:, None] / 3.0)
z_km = 7.0 * np.log(1000.0 / p_hpa)
t_trop = t_sfc[:, None, :] - 6.5 * z_km[None, :, None]
temperature = np.maximum(t_trop, 212.0) + np.clip(z_km - 20.0, 0.0, None)[None, :, None] * 1.8  # warmer aloft
rh = np.clip(0.8 * (p_hpa - 150.0) / 850.0, 0.0, None)[None, :, None]
es = 611.2 * np.exp(17.67 * (temperature - 273.15) / (temperature - 29.65))  # Bolton (1980), Pa
q = np.maximum(0.622 * rh * es / (p_hpa[None, :, None] * 100.0), 4e-6)  # kg/kg

ds = xr.Dataset(
    {
        "ta": (("time", "level", "lat"), temperature - 273.15, {"standard_name": "air_temperature", "units": "degC"}),
        "hus": (("time", "level", "lat"), q * 1000.0, {"standard_name": "specific_humidity", "units": "g/kg"}),
        "ts": (("time", "lat"), t_sfc, {"standard_name": "surface_temperature", "units": "K"}),
    },
    coords={
        "time": ("time", time),
        "level": ("level", p_hpa, {"standard_name": "air_pressure", "units": "hPa", "positive": "down"}),
        "lat": ("lat", lat, {"standard_name": "latitude", "units": "degrees_north"}),
    },
    attrs={"title": "Brannoch plateau soundings (invented demo data)"},
)
ds.time.encoding.update({"units": "hours since 2031-01-01 00:00:00", "calendar": "proleptic_gregorian"})
out = os.path.join(os.path.dirname(os.path.abspath(__file__)), "profile_demo.nc")
ds.to_netcdf(out)
print("wrote", out)

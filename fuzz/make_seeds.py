#!/usr/bin/python3
"""Writes the small netCDF seeds of fuzz/corpus/ (each a valid file, under ~20 KB), in the classic
formats: their headers are simple enough that mutations reach bandstack's own checks rather than the
HDF5 layer. Invented numbers chosen only to pass the readers' checks. Run with Debian's python3:
    /usr/bin/python3 fuzz/make_seeds.py
"""
import os

import numpy as np
from netCDF4 import Dataset

HERE = os.path.dirname(os.path.abspath(__file__))


def out(target, name):
    folder = os.path.join(HERE, "corpus", target)
    os.makedirs(folder, exist_ok=True)
    return os.path.join(folder, name)


def var(nc, name, dims, values, dtype="f8", **attrs):
    v = nc.createVariable(name, dtype, dims)
    for key, value in attrs.items():
        v.setncattr(key, value)
    v[...] = values
    return v


def profile_single(fmt, name):
    """One sounding: pressure coordinate from the surface up (hPa), temperature in K, q in kg/kg."""
    p = np.array([1000.0, 850.0, 700.0, 500.0, 300.0, 200.0, 100.0, 50.0, 10.0, 1.0])
    t = np.array([295.0, 285.0, 276.0, 262.0, 240.0, 222.0, 210.0, 215.0, 228.0, 260.0])
    with Dataset(out("profile_file", name), "w", format=fmt) as nc:
        nc.createDimension("level", p.size)
        var(nc, "level", ("level",), p, standard_name="air_pressure", units="hPa", positive="down")
        var(nc, "ta", ("level",), t, standard_name="air_temperature", units="K")
        var(nc, "hus", ("level",), 0.01 * (p / 1000.0) ** 3 + 3e-6, standard_name="specific_humidity", units="kg kg-1")


def profile_grid(fmt, name):
    """Two times x two latitudes, pressure as a full field, gases and surface values per column."""
    p = np.array([1.0, 10.0, 100.0, 300.0, 600.0, 900.0]) * 100.0  # Pa, top first
    t = np.array([255.0, 225.0, 212.0, 240.0, 270.0, 290.0])
    with Dataset(out("profile_file", name), "w", format=fmt) as nc:
        nc.createDimension("time", 2)
        nc.createDimension("lat", 2)
        nc.createDimension("lev", p.size)
        var(nc, "time", ("time",), [0.0, 6.0], units="hours since 2030-01-01 00:00:00", calendar="standard")
        var(nc, "lat", ("lat",), [10.0, 50.0], units="degrees_north", standard_name="latitude")
        var(nc, "lev", ("lev",), np.arange(p.size), axis="Z", positive="down", units="1")
        field = np.broadcast_to(p, (2, 2, p.size))
        var(nc, "pfull", ("time", "lat", "lev"), field, standard_name="air_pressure", units="Pa")
        var(nc, "ta", ("time", "lat", "lev"), np.broadcast_to(t - 273.15, (2, 2, p.size)), "f4",
            standard_name="air_temperature", units="degC")
        var(nc, "ps", ("time", "lat"), [[95000.0, 96000.0], [97000.0, 98000.0]], standard_name="surface_air_pressure",
            units="Pa")
        var(nc, "ts", ("time", "lat"), [[292.0, 280.0], [294.0, 281.0]], standard_name="surface_temperature", units="K")
        var(nc, "co2", (), 420.0, standard_name="mole_fraction_of_carbon_dioxide_in_air", units="ppmv")
        var(nc, "o3", ("lev",), [8e-6, 6e-6, 1e-6, 1e-7, 5e-8, 3e-8], standard_name="mole_fraction_of_ozone_in_air",
            units="mol mol-1")


def band_set(fmt, name, shortwave):
    """Two bands (2 + 1 g-points), one absorber, 2 x 2 reference states, 2 Planck temperatures."""
    with Dataset(out("band_set_file", name), "w", format=fmt) as nc:
        for dim, size in [("band", 2), ("gpoint", 3), ("absorber", 1), ("ref_pressure", 2), ("ref_temperature", 2),
                          ("planck_temperature", 2), ("absorber_text_length", 7)]:
            nc.createDimension(dim, size)
        var(nc, "band_lower_wavenumber", ("band",), [10.0, 600.0], units="cm-1", long_name="lower edge")
        var(nc, "band_upper_wavenumber", ("band",), [600.0, 900.0], units="cm-1", long_name="upper edge")
        var(nc, "gpoint_band", ("gpoint",), [0, 0, 1], "i4")
        var(nc, "gpoint_weight", ("gpoint",), [0.25, 0.75, 1.0], units="1")
        for var_name, units in [("absorber_name", "co2"), ("absorber_units", "m2 kg-1")]:
            v = nc.createVariable(var_name, "S1", ("absorber", "absorber_text_length"))
            v[0, :] = np.array(list(units.ljust(7, "\0")), "S1")
        var(nc, "ref_pressure", ("ref_pressure",), [100.0, 1e5], units="Pa")
        var(nc, "ref_temperature", ("ref_temperature",), [200.0, 300.0], units="K")
        var(nc, "planck_temperature", ("planck_temperature",), [200.0, 300.0], units="K")
        kappa = np.array([[[0.1, 0.2], [0.15, 0.25]], [[1.0, 2.0], [1.5, 2.5]], [[0.01, 0.02], [0.015, 0.025]]])
        var(nc, "absorption_coefficient", ("absorber", "gpoint", "ref_temperature", "ref_pressure"), kappa[None])
        var(nc, "planck_fraction", ("gpoint", "planck_temperature"), [[0.4, 0.3], [0.6, 0.7], [1.0, 1.0]], units="1")
        if shortwave:
            var(nc, "solar_weight", ("gpoint",), [0.1, 0.3, 0.6], units="1")
            var(nc, "rayleigh_cross_section", ("gpoint",), [1e-5, 2e-5, 3e-5], units="m2 kg-1")
        nc.band_set_format = np.int32(1)
        nc.setncattr("name", "fuzz_seed")
        nc.source = "invented seed"
        nc.recipe_text = ""
        nc.builder_version = "0"


def cross_section(fmt, name, per_molecule):
    """Wavenumber x pressure x temperature tables for co2 and the water vapour self-continuum."""
    nu = np.array([500.0, 500.5, 501.0, 502.0, 504.0])
    with Dataset(out("cross_section_file", name), "w", format=fmt) as nc:
        nc.title = "fuzz seed"
        nc.source = "invented"
        nc.cross_section_format_version = np.int32(1)
        nc.createDimension("wavenumber", nu.size)
        nc.createDimension("pressure", 2)
        nc.createDimension("temperature", 2)
        var(nc, "wavenumber", ("wavenumber",), nu, units="cm-1")
        var(nc, "pressure", ("pressure",), [10.0, 1000.0], units="hPa")
        var(nc, "temperature", ("temperature",), [200.0, 300.0], units="K")
        k = np.linspace(0.0, 1.0, 2 * 2 * nu.size).reshape(2, 2, nu.size)
        if per_molecule:
            var(nc, "co2_mass_absorption_coefficient", ("temperature", "pressure", "wavenumber"), k * 1e-20, "f4",
                units="cm2 molecule-1")
        else:
            var(nc, "co2_mass_absorption_coefficient", ("temperature", "pressure", "wavenumber"), k,
                units="m2 kg-1")
            var(nc, "h2o_self_continuum_mass_absorption_coefficient", ("temperature", "pressure", "wavenumber"),
                k * 1e-3, units="m2 kg-1 Pa-1")


profile_single("NETCDF3_CLASSIC", "single_sounding_cdf1.nc")
profile_grid("NETCDF3_64BIT_OFFSET", "time_lat_model_levels_cdf2.nc")
band_set("NETCDF3_CLASSIC", "longwave_cdf1.nc", False)
band_set("NETCDF3_64BIT_DATA", "shortwave_cdf5.nc", True)
cross_section("NETCDF3_CLASSIC", "co2_continuum_cdf1.nc", False)
cross_section("NETCDF3_64BIT_OFFSET", "co2_per_molecule_cdf2.nc", True)
for target in ("profile_file", "band_set_file", "cross_section_file"):
    folder = os.path.join(HERE, "corpus", target)
    for f in sorted(os.listdir(folder)):
        print(f"{target}/{f}: {os.path.getsize(os.path.join(folder, f))} bytes")

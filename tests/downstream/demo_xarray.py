"""Downstream check: the demo result opened with xarray (Debian python3-xarray) and ncdump.

Checks names, units and CF attributes of the variables (naming.md), that the upward longwave flux at
the top level equals `olr`, that the file decodes as CF, and that 1 and 2 threads give identical numbers.
"""
import os
import subprocess
import sys

import numpy as np
import xarray as xr

sys.path.insert(0, os.path.join(os.path.dirname(os.path.abspath(__file__)), "support"))
from checks import Checks, bandstack, parse_args  # noqa: E402

EXPECTED = {
    # name: (units, CF standard_name or None, dimensions)
    "pressure_level": ("Pa", "air_pressure", ("column", "level")),
    "temperature_level": ("K", "air_temperature", ("column", "level")),
    "pressure_layer": ("Pa", "air_pressure", ("column", "layer")),
    "temperature_layer": ("K", "air_temperature", ("column", "layer")),
    "lw_flux_up": ("W m-2", "upwelling_longwave_flux_in_air", ("column", "level")),
    "lw_flux_down": ("W m-2", "downwelling_longwave_flux_in_air", ("column", "level")),
    "lw_heating_rate": ("K day-1", "tendency_of_air_temperature_due_to_longwave_heating", ("column", "layer")),
    "olr": ("W m-2", "toa_outgoing_longwave_flux", ("column",)),
    "surface_lw_flux_down": ("W m-2", "surface_downwelling_longwave_flux_in_air", ("column",)),
    "surface_temperature": ("K", "surface_temperature", ("column",)),
    "co2_mole_fraction": ("mol mol-1", "mole_fraction_of_carbon_dioxide_in_air", ("column", "layer")),
    "specific_humidity": ("kg kg-1", "specific_humidity", ("column", "layer")),
    "h2o_mole_fraction": ("mol mol-1", None, ("column", "layer")),
    "sw_flux_up": ("W m-2", "upwelling_shortwave_flux_in_air", ("column", "level")),
    "sw_flux_down": ("W m-2", "downwelling_shortwave_flux_in_air", ("column", "level")),
    "sw_flux_down_direct": ("W m-2", None, ("column", "level")),
    "sw_flux_down_diffuse": ("W m-2", None, ("column", "level")),
    "sw_heating_rate": ("K day-1", "tendency_of_air_temperature_due_to_shortwave_heating", ("column", "layer")),
    "toa_sw_flux_down": ("W m-2", "toa_incoming_shortwave_flux", ("column",)),
    "toa_sw_flux_up": ("W m-2", "toa_outgoing_shortwave_flux", ("column",)),
    "absorbed_solar": ("W m-2", None, ("column",)),
    "toa_net_flux": ("W m-2", None, ("column",)),
}

check = Checks("demo_xarray")


def run_demo(exe, out, threads):
    os.makedirs(out, exist_ok=True)
    bandstack(exe, "demo", "--threads", str(threads), "--out", out)
    return os.path.join(out, "tarrow_sound_demo.nc")


def main():
    args = parse_args()

    path1 = run_demo(args.exe, os.path.join(args.workdir, "t1"), 1)
    path2 = run_demo(args.exe, os.path.join(args.workdir, "t2"), 2)

    ds = xr.open_dataset(path1)  # decode_cf=True by default
    check(ds.attrs.get("Conventions") == "CF-1.8", "Conventions attribute")
    check("research tool" in ds.attrs.get("comment", ""), "caution line in the comment attribute")
    check("[[columns]]" in ds.attrs.get("study_text", ""), "study text stored")
    for name, (units, standard_name, dims) in EXPECTED.items():
        if not check(name in ds.variables, f"variable {name} missing"):
            continue
        var = ds[name]
        check(var.attrs.get("units") == units, f"{name}: units {var.attrs.get('units')!r}, expected {units!r}")
        check(var.attrs.get("standard_name") == standard_name,
              f"{name}: standard_name {var.attrs.get('standard_name')!r}, expected {standard_name!r}")
        check(var.dims == dims, f"{name}: dims {var.dims}, expected {dims}")
        check(bool(np.all(np.isfinite(var.values))), f"{name}: non-finite values")
    # column_name is a coordinate: xarray decodes it through the `coordinates` attribute.
    check("column_name" in ds.coords, "column_name is a coordinate")
    names = [n.decode() if isinstance(n, bytes) else str(n) for n in ds["column_name"].values]
    check("warm_pool_buoy" in names, f"column names {names}")
    # The upward flux at the top level is the OLR (level 0 is the top of the atmosphere).
    check(np.array_equal(ds["lw_flux_up"].isel(level=0).values, ds["olr"].values), "lw_flux_up at level 0 == olr")
    check(bool(np.all(np.diff(ds["pressure_level"].values, axis=1) > 0)), "pressure increases with level index")
    # Sanity of a physical result with a wide, well-known bound: Earth's OLR lies roughly between
    # 150 and 330 W m-2 for any clear column (satellite climatologies, e.g. Loeb et al. 2018, J. Climate 31).
    olr = ds["olr"].values
    check(bool(np.all((olr > 150) & (olr < 330))), f"OLR out of Earth-like range: {olr}")
    # Doubled CO2 lowers OLR in the otherwise identical column (greenhouse forcing is positive).
    i1 = names.index("reference_1976")
    i2 = names.index("reference_1976_doubled_co2")
    check(olr[i2] < olr[i1], f"doubled CO2 should lower OLR: {olr[i1]} -> {olr[i2]}")

    # Longwave by band: CF coordinate band_lw (band centre) with bounds; bands add up to the totals.
    check("band_lw" in ds.coords and ds["band_lw"].attrs.get("units") == "cm-1", "band_lw coordinate in cm-1")
    check(ds["band_lw"].attrs.get("bounds") == "band_lw_bounds", "band_lw has CF bounds")
    bounds = ds["band_lw_bounds"].values
    check(bool(np.all(bounds[1:, 0] == bounds[:-1, 1])), "bands are contiguous")
    for name, total in (("lw_flux_up_by_band", "lw_flux_up"), ("lw_flux_down_by_band", "lw_flux_down"),
                        ("lw_heating_rate_by_band", "lw_heating_rate")):
        if check(name in ds.variables, f"variable {name} missing"):
            summed = ds[name].sum("band_lw").values
            check(np.allclose(summed, ds[total].values, rtol=1e-10, atol=1e-10), f"{name} sums to {total}")
    # Select the CO2 15 um band by wavenumber, as a user would.
    co2_band = ds["lw_flux_up_by_band"].sel(band_lw=667.5, method="nearest")
    check(co2_band.sizes == {"column": ds.sizes["column"], "level": ds.sizes["level"]}, "sel by band_lw")
    check("default_lw" in ds.attrs.get("longwave_method", ""), "longwave_method names the band set")

    # Shortwave: energy bookkeeping, band coordinate, the polar-night column and the global-mean column.
    check(np.allclose(ds["absorbed_solar"], ds["toa_sw_flux_down"] - ds["toa_sw_flux_up"], rtol=1e-12, atol=1e-9),
          "absorbed_solar = incoming - reflected")
    check(np.allclose(ds["sw_flux_down"], ds["sw_flux_down_direct"] + ds["sw_flux_down_diffuse"], rtol=1e-12, atol=1e-9),
          "sw_flux_down = direct + diffuse")
    check(np.allclose(ds["toa_net_flux"], ds["absorbed_solar"] - ds["olr"], rtol=1e-12, atol=1e-9), "toa_net_flux")
    check("band_sw" in ds.coords and ds["band_sw"].attrs.get("bounds") == "band_sw_bounds", "band_sw coordinate")
    check(np.allclose(ds["sw_flux_down_by_band"].sum("band_sw"), ds["sw_flux_down"], rtol=1e-10, atol=1e-9),
          "sw bands sum to the total")
    check(float(ds["toa_sw_flux_down"][names.index("ice_shelf_winter")]) == 0.0, "polar night has no sunlight")
    # Global-mean sunlight is S0/4 with S0 = 1361 W m-2 (Kopp & Lean 2011).
    check(abs(float(ds["toa_sw_flux_down"][names.index("reference_1976")]) - 1361.0 / 4) < 1e-9, "global mean S0/4")
    check("default_sw" in ds.attrs.get("shortwave_method", ""), "shortwave_method names the band set")

    # Bit-identical numbers for 1 and 2 threads.
    check.identical(ds, xr.open_dataset(path2), "between 1 and 2 threads")

    # ncdump (netcdf-bin) reads the header.
    header = subprocess.run(["ncdump", "-h", path1], check=True, capture_output=True, text=True).stdout
    check("lw_flux_up(column, level)" in header, "ncdump -h shows lw_flux_up(column, level)")

    return check.report()


if __name__ == "__main__":
    sys.exit(main())

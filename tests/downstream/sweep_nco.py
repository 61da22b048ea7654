"""Downstream check: a study with two sweep axes crossed with two columns, read back with xarray
(Debian python3-xarray) and NCO's ncks (Debian nco).

Checks that each sweep is a dimension with its values as a CF coordinate, that results are selected by
coordinate value in xarray and in ncks (hyperslab by value), that more CO2 lowers the OLR and a brighter
surface lowers the absorbed sunlight (signs of the greenhouse and albedo effects), and that 1 and 2
threads give identical numbers.
"""
import os
import subprocess
import sys

import numpy as np
import xarray as xr

sys.path.insert(0, os.path.join(os.path.dirname(os.path.abspath(__file__)), "support"))
from checks import Checks, parse_args, run_study  # noqa: E402

STUDY = """
title = "sweep check (invented scenario)"
[grid]
layers = 24
[longwave]
gauss_angles = 1
[[sweeps]]
key = "co2_ppmv"
values = [280, 560, 1120]
[[sweeps]]
key = "surface_albedo"
from = 0.1
to = 0.5
count = 3
[[columns]]
name = "north"
profile = "high_latitude_winter"
latitude_deg = 60
day_of_year = 172
[[columns]]
name = "south"
profile = "tropical"
[output]
file = "sweep.nc"
"""

check = Checks("sweep_nco")


def run(exe, study, out, threads):
    run_study(exe, study, out, threads)
    return os.path.join(out, "sweep.nc")


def main():
    args = parse_args()
    study = os.path.join(args.workdir, "sweep.toml")
    with open(study, "w") as f:
        f.write(STUDY)
    path1 = run(args.exe, study, os.path.join(args.workdir, "t1"), 1)
    path2 = run(args.exe, study, os.path.join(args.workdir, "t2"), 2)

    ds = xr.open_dataset(path1)
    check(ds.olr.dims == ("column", "co2_ppmv", "surface_albedo"), f"olr dims {ds.olr.dims}")
    check(ds.lw_flux_up.dims == ("column", "co2_ppmv", "surface_albedo", "level"), f"lw_flux_up dims {ds.lw_flux_up.dims}")
    check(list(ds.co2_ppmv.values) == [280.0, 560.0, 1120.0], f"co2 coordinate {ds.co2_ppmv.values}")
    check(np.allclose(ds.surface_albedo.values, [0.1, 0.3, 0.5], rtol=0, atol=1e-15), f"albedo coordinate {ds.surface_albedo.values}")
    check(ds.co2_ppmv.attrs.get("units") == "1e-6", "ppmv coordinate in UDUNITS form")
    # Greenhouse effect: more CO2, lower OLR at every albedo (Manabe & Wetherald 1967 sign).
    olr = ds.olr.values
    check(bool(np.all(np.diff(olr, axis=1) < 0)), "OLR falls as CO2 rises")
    # Albedo: a brighter surface reflects more, so less sunlight is absorbed.
    check(bool(np.all(np.diff(ds.absorbed_solar.values, axis=2) < 0)), "absorbed solar falls as albedo rises")
    # The longwave does not see the albedo: identical OLR along that axis.
    check(bool(np.all(olr[:, :, 0:1] == olr)), "OLR independent of the albedo")
    # Selection by coordinate value, as a user would.
    one = ds.olr.sel(co2_ppmv=560, surface_albedo=0.3)
    check(one.dims == ("column",) and np.isfinite(one.values).all(), "sel by value")

    # NCO: a hyperslab by coordinate value (a float index selects by value in ncks).
    out = subprocess.run(["ncks", "-H", "-C", "-v", "olr", "-d", "co2_ppmv,560.0", "-d", "surface_albedo,0.3", path1],
                         check=True, capture_output=True, text=True).stdout
    values = [float(line.split("=")[-1].strip().rstrip(";").split()[0]) for line in out.splitlines() if "olr[" in line]
    if not values:  # newer ncks print a CDL-like block instead of one line per value
        text = out.split("olr =")[-1].split(";")[0]
        values = [float(v) for v in text.replace("\n", " ").split(",") if v.strip()]
    check(len(values) == 2 and np.allclose(values, one.values, rtol=1e-12), f"ncks values {values} vs {one.values}")

    check.identical(ds, xr.open_dataset(path2), "between 1 and 2 threads")
    return check.report()


if __name__ == "__main__":
    raise SystemExit(main())

"""Downstream check: failures of single columns in a batch are recorded, the rest completes.

1. A profile file (invented soundings) with a NaN in one column: the run succeeds (exit 0);
   column_status is 1 (invalid_input) there and 0 elsewhere; column_error names the file, the variable
   and the index; every variable of the other columns is bit-identical to a run of the clean file;
   the failed column's floating-point variables are missing (NaN, decoded by xarray).
2. The same with --stop-on-column-error: exit 2, the message names the file and the variable, and
   no result file, working file or checkpoint is left.
3. A file whose every column is bad: exit 2 ("no column could be computed"), nothing left behind.
4. An equilibrium sweep of the solar constant in which the brighter suns leave the band tables'
   temperature range: those columns are recorded as not_converged (2), the 1361 W m-2 one computed,
   in blocks of 1 column so that the first block succeeds and later ones fail whole.
5. A run whose first block fails whole (blocks of 1 column) still writes the file once a column
   succeeds.
"""
import glob
import os
import subprocess
import sys

import numpy as np
import xarray as xr

sys.path.insert(0, os.path.join(os.path.dirname(os.path.abspath(__file__)), "support"))
from checks import Checks, parse_args  # noqa: E402

check = Checks("column_failures")


def write_profiles(path, bad=()):
    """Invented (time 2, lat 3) columns on 8 levels; `bad` holds (time, lat) points to spoil with NaN."""
    p_hpa = np.array([10.0, 50.0, 150.0, 300.0, 500.0, 700.0, 850.0, 1000.0])
    lat = np.array([-40.0, 0.0, 40.0])
    temp = np.empty((2, 3, p_hpa.size))
    for t in range(2):
        for j in range(3):
            temp[t, j] = np.maximum(295.0 - 10.0 * abs(lat[j]) / 40 + 2 * t - 45.0 * np.log(1000.0 / p_hpa) / np.log(10), 200.0)
    for t, j in bad:
        temp[t, j, 4] = np.nan
    ds = xr.Dataset(
        {"ta": (("time", "lat", "level"), temp, {"units": "K", "standard_name": "air_temperature"})},
        coords={"time": ("time", [0.0, 12.0], {"units": "hours since 2040-05-01", "calendar": "standard"}),
                "lat": ("lat", lat, {"units": "degrees_north"}),
                "level": ("level", p_hpa, {"units": "hPa", "standard_name": "air_pressure"})})
    ds.to_netcdf(path, encoding={"ta": {"_FillValue": None}})


STUDY = """title = "column failures (invented)"
[longwave]
method = "bands"
[[columns]]
name = "field"
profile_file = "{profile}"
[output]
file = "{out}"
"""


def run(exe, folder, name, profile, *options):
    study = os.path.join(folder, name + ".toml")
    with open(study, "w") as f:
        f.write(STUDY.format(profile=profile, out=name + ".nc"))
    return subprocess.run([exe, "run", study, "--out", folder, "--quiet", "--no-report", *options],
                          capture_output=True, text=True)


def leftovers(folder, name):
    return [p for p in glob.glob(os.path.join(folder, "*" + name + "*")) if not p.endswith(".toml")]


def main():
    args = parse_args()
    work = args.workdir
    clean = os.path.join(work, "clean.nc")
    spoiled = os.path.join(work, "spoiled.nc")
    write_profiles(clean)
    write_profiles(spoiled, bad=[(1, 2)])

    r = run(args.exe, work, "clean_run", clean)
    check(r.returncode == 0, f"clean run: exit {r.returncode}: {r.stderr}")
    r = run(args.exe, work, "spoiled_run", spoiled, "--chunk-columns", "2")
    check(r.returncode == 0, f"spoiled run: exit {r.returncode}: {r.stderr}")
    check("1 of 6 columns failed" in r.stderr, f"no failure warning on stderr: {r.stderr!r}")
    with xr.open_dataset(os.path.join(work, "clean_run.nc")) as a, xr.open_dataset(os.path.join(work, "spoiled_run.nc")) as b:
        status = b.column_status.values
        check(status.shape == (2, 3), f"column_status shape {status.shape}")
        expected = np.zeros((2, 3), dtype=status.dtype)
        expected[1, 2] = 1
        check(np.array_equal(status, expected), f"column_status {status.tolist()}")
        check(list(b.column_status.attrs.get("flag_meanings", "").split()) == ["ok", "invalid_input", "not_converged"],
              "flag_meanings")
        errors = b.column_error.values
        message = errors[1, 2].decode() if isinstance(errors[1, 2], bytes) else str(errors[1, 2])
        check("spoiled.nc" in message and "'ta'" in message and "(time 1, lat 2, level 4)" in message,
              f"column_error: {message!r}")
        others = [str(errors[t, j]) for t in range(2) for j in range(3) if (t, j) != (1, 2)]
        check(all(e in ("", "b''") for e in others), f"column_error of good columns: {others}")
        good = np.ones((2, 3), bool)
        good[1, 2] = False
        for name in a.data_vars:
            if name in ("column_status", "column_error") or not np.issubdtype(a[name].dtype, np.floating):
                continue
            if a[name].dims[:2] != ("time", "lat"):
                continue
            x, y = a[name].values, b[name].values
            check(np.array_equal(x[good], y[good], equal_nan=True), f"{name}: good columns differ from the clean run")
            check(bool(np.isnan(y[1, 2]).all()), f"{name}: the failed column is not missing")

    r = run(args.exe, work, "stop_run", spoiled, "--stop-on-column-error")
    check(r.returncode == 2 and "spoiled.nc" in r.stderr and "'ta'" in r.stderr,
          f"--stop-on-column-error: exit {r.returncode}: {r.stderr}")
    check(not leftovers(work, "stop_run"), f"--stop-on-column-error left {leftovers(work, 'stop_run')}")

    all_bad = os.path.join(work, "all_bad.nc")
    write_profiles(all_bad, bad=[(t, j) for t in range(2) for j in range(3)])
    r = run(args.exe, work, "all_bad_run", all_bad, "--chunk-columns", "4")
    check(r.returncode == 2 and "no column could be computed" in r.stderr and "all_bad.nc" in r.stderr,
          f"all columns bad: exit {r.returncode}: {r.stderr}")
    check(not leftovers(work, "all_bad_run"), f"all columns bad left {leftovers(work, 'all_bad_run')}")

    first_bad = os.path.join(work, "first_bad.nc")
    write_profiles(first_bad, bad=[(0, 0), (0, 1)])
    r = run(args.exe, work, "first_bad_run", first_bad, "--chunk-columns", "1")
    check(r.returncode == 0, f"first blocks bad: exit {r.returncode}: {r.stderr}")
    with xr.open_dataset(os.path.join(work, "first_bad_run.nc")) as b, \
            xr.open_dataset(os.path.join(work, "clean_run.nc")) as a:
        check(b.column_status.values.ravel().tolist() == [1, 1, 0, 0, 0, 0], f"status {b.column_status.values.tolist()}")
        check(np.array_equal(a.olr.values.ravel()[2:], b.olr.values.ravel()[2:]), "olr after the failed first blocks")

    eq = os.path.join(work, "equilibrium.toml")
    with open(eq, "w") as f:
        f.write("""title = "too bright suns (invented)"
[grid]
layers = 20
top_pressure_hpa = 1
[longwave]
method = "bands"
[shortwave]
method = "bands"
[equilibrium]
convection = "fixed_lapse_rate"
water = "fixed_relative_humidity"
surface_temperature = "energy_balance"
[[sweeps]]
key = "solar_constant_w_m2"
values = [1361, 2400, 4000]
[[columns]]
name = "sun"
profile = "us_standard_1976"
[output]
file = "equilibrium.nc"
""")
    r = subprocess.run([args.exe, "run", eq, "--out", work, "--quiet", "--no-report", "--chunk-columns", "1"],
                       capture_output=True, text=True)
    check(r.returncode == 0, f"equilibrium sweep: exit {r.returncode}: {r.stderr}")
    with xr.open_dataset(os.path.join(work, "equilibrium.nc")) as ds:
        status = ds.column_status.values.ravel().tolist()
        check(status == [0, 2, 2], f"equilibrium status {status}")
        # The computed column balances its energy at the top (equilibrium criterion, docs/output-file.md).
        net = float(ds.toa_net_flux.values.ravel()[0])
        check(abs(net) < 0.05, f"the computed equilibrium column has TOA net {net} W m-2")
        message = str(ds.column_error.values.ravel()[1])
        check("equilibrium not reached" in message, f"not_converged message: {message!r}")
    return check.report()


if __name__ == "__main__":
    sys.exit(main())

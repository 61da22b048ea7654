#!/usr/bin/python3
"""Downstream check: a band set written by `bandstack bands build default_lw -o d.nc`, opened with
xarray (Debian python3-xarray) and ncdump, against the format of docs/band-set-file.md and the recipe
bands/default_lw.toml it was built from (read with Python's own tomllib).

Checks dimensions, variable shapes and units; Planck fractions and g-point weights summing to 1 over
each band (numpy, grouped by gpoint_band); contiguous band edges spanning the recipe's range;
absorption coefficients finite and non-negative; the global attributes; and that ncdump -h reads the
header. Prints 'band_set_xarray: N passed, M failed'."""
import argparse
import os
import shutil
import subprocess
import sys
import tomllib

import numpy as np
import xarray as xr

SOURCE_DIR = os.path.abspath(os.path.join(os.path.dirname(__file__), "..", ".."))
RECIPE = os.path.join(SOURCE_DIR, "bands", "default_lw.toml")

# docs/band-set-file.md, "Variables": name -> (dimensions, units or None)
VARIABLES = {
    "band_lower_wavenumber": (("band",), "cm-1"),
    "band_upper_wavenumber": (("band",), "cm-1"),
    "gpoint_band": (("gpoint",), None),
    "gpoint_weight": (("gpoint",), "1"),
    "absorber_name": (("absorber", "absorber_text_length"), None),
    "absorber_units": (("absorber", "absorber_text_length"), None),
    "ref_pressure": (("ref_pressure",), "Pa"),
    "ref_temperature": (("ref_temperature",), "K"),
    "planck_temperature": (("planck_temperature",), "K"),
    "absorption_coefficient": (("absorber", "gpoint", "ref_temperature", "ref_pressure"), None),
    "planck_fraction": (("gpoint", "planck_temperature"), "1"),
}
# docs/band-set-file.md, units of absorption_coefficient per absorber
ABSORBER_UNITS = {"h2o": "m2 kg-1", "co2": "m2 kg-1", "o3": "m2 kg-1", "ch4": "m2 kg-1", "n2o": "m2 kg-1",
                  "h2o_self_continuum": "m2 kg-1 Pa-1"}
# docs/band-set-file.md: "summing to 1 (to 1e-9) over each band"
SUM_TOLERANCE = 1e-9

passed = [0]
failures = []


def check(condition, message):
    if condition:
        passed[0] += 1
    else:
        failures.append(message)
    return condition


def text_rows(var):
    """Rows of a char array (absorber, length) as Python strings, whichever way xarray decoded them."""
    values = var.values
    if values.ndim == 1:  # xarray joined the characters already
        return [v.decode() if isinstance(v, bytes) else str(v) for v in values]
    return [b"".join(row).decode().rstrip("\x00 ") for row in values]


def check_file(path, recipe, recipe_text, version_line):
    ds = xr.open_dataset(path, decode_cf=False)

    for dim in ("band", "gpoint", "absorber", "ref_pressure", "ref_temperature", "planck_temperature"):
        check(dim in ds.sizes, "dimension %s missing" % dim)
    for name, (dims, units) in VARIABLES.items():
        if not check(name in ds.variables, "variable %s missing" % name):
            continue
        var = ds[name]
        if name in ("absorber_name", "absorber_units") and var.ndim == 1:
            dims = dims[:1]  # xarray may have turned the char array into strings
        check(var.dims == dims, "%s has dimensions %s, expected %s" % (name, var.dims, dims))
        if units is not None:
            check(var.attrs.get("units") == units, "%s has units %r, expected %r" % (name, var.attrs.get("units"), units))

    bands = recipe["bands"]
    n_band = ds.sizes.get("band", 0)
    check(n_band == len(bands), "%d bands, the recipe has %d" % (n_band, len(bands)))
    check(ds.sizes.get("gpoint", 0) == sum(b["gpoints"] for b in bands), "g-point count differs from the recipe")

    # Band edges: contiguous, increasing, the recipe's edges exactly.
    lower = ds["band_lower_wavenumber"].values
    upper = ds["band_upper_wavenumber"].values
    check(np.array_equal(lower, [b["lower_cm1"] for b in bands]), "lower band edges differ from the recipe")
    check(np.array_equal(upper, [b["upper_cm1"] for b in bands]), "upper band edges differ from the recipe")
    check(np.array_equal(upper[:-1], lower[1:]), "bands are not contiguous")
    check(bool(np.all(upper > lower)), "a band with upper <= lower edge")
    check(lower[0] == 10.0 and upper[-1] == 3000.0,
          "bands span %g-%g cm-1, expected 10-3000 (bands/default_lw.toml)" % (lower[0], upper[-1]))

    # g-points: consecutive per band, every band has some.
    gband = ds["gpoint_band"].values
    check(bool(np.all(np.diff(gband) >= 0)), "gpoint_band is not non-decreasing")
    counts = np.bincount(gband, minlength=n_band)
    check(np.array_equal(counts, [b["gpoints"] for b in bands]), "g-points per band differ from the recipe: %s" % counts)

    # Weights and Planck fractions sum to 1 over each band (for every Planck temperature).
    weight = ds["gpoint_weight"].values
    weight_sums = np.bincount(gband, weights=weight, minlength=n_band)
    check(bool(np.all(np.abs(weight_sums - 1.0) <= SUM_TOLERANCE)),
          "gpoint_weight sums per band: max |sum - 1| = %g" % np.max(np.abs(weight_sums - 1.0)))
    check(bool(np.all((weight > 0.0) & (weight <= 1.0))), "gpoint_weight outside (0, 1]")
    fraction = ds["planck_fraction"]
    sums = fraction.groupby(ds["gpoint_band"]).sum("gpoint").values  # (band, planck_temperature)
    check(sums.shape == (n_band, ds.sizes["planck_temperature"]), "planck_fraction grouped shape %s" % (sums.shape,))
    check(bool(np.all(np.abs(sums - 1.0) <= SUM_TOLERANCE)),
          "planck_fraction sums per band: max |sum - 1| = %g" % np.max(np.abs(sums - 1.0)))
    check(bool(np.all((fraction.values >= 0.0) & (fraction.values <= 1.0))), "planck_fraction outside [0, 1]")

    # Reference grids: strictly increasing, as the recipe says (25 pressures 0.01-1100 hPa in ln p,
    # temperatures every 10 K from 150 to 350 K, Planck temperatures every 5 K over 100-400 K).
    grid = recipe["reference_grid"]
    p = ds["ref_pressure"].values
    check(p.size == grid["pressure_count"], "ref_pressure has %d values" % p.size)
    check(bool(np.all(np.diff(p) > 0)), "ref_pressure not strictly increasing")
    check(np.allclose([p[0], p[-1]], [grid["pressure_min_hpa"] * 100.0, grid["pressure_max_hpa"] * 100.0], rtol=1e-12),
          "ref_pressure ends %g, %g Pa" % (p[0], p[-1]))
    check(np.allclose(np.diff(np.log(p)), np.log(p[-1] / p[0]) / (p.size - 1), rtol=1e-9),
          "ref_pressure not equally spaced in ln p")
    t = ds["ref_temperature"].values
    check(np.allclose(t, np.arange(grid["temperature_min_k"], grid["temperature_max_k"] + 1e-9, grid["temperature_step_k"])),
          "ref_temperature differs from the recipe: %s" % t)
    tp = ds["planck_temperature"].values
    check(np.allclose(tp, np.arange(grid["planck_temperature_min_k"], grid["planck_temperature_max_k"] + 1e-9,
                                    grid["planck_temperature_step_k"])), "planck_temperature differs from the recipe")

    # Absorbers and their coefficients.
    names = text_rows(ds["absorber_name"])
    units = text_rows(ds["absorber_units"])
    check(len(names) > 0 and len(set(names)) == len(names), "absorber names empty or repeated: %s" % names)
    for name, unit in zip(names, units):
        check(ABSORBER_UNITS.get(name) == unit, "absorber %r has units %r" % (name, unit))
    for gas in ("h2o", "co2", "o3"):  # the gases the analytic recipe must have
        check(gas in names, "absorber %s missing (has %s)" % (gas, names))
    k = ds["absorption_coefficient"].values
    check(bool(np.all(np.isfinite(k))), "absorption_coefficient has NaN or infinite values")
    check(bool(np.all(k >= 0.0)), "absorption_coefficient has negative values")
    for i, name in enumerate(names):
        check(bool(np.any(k[i] > 0.0)), "absorber %s is all zero" % name)
    check(k.shape == (len(names), ds.sizes["gpoint"], t.size, p.size), "absorption_coefficient shape %s" % (k.shape,))

    # Global attributes (docs/band-set-file.md, "Global attributes").
    attrs = ds.attrs
    for key in ("Conventions", "title", "band_set_format", "name", "source", "recipe_text", "builder_version",
                "history", "comment"):
        check(key in attrs, "global attribute %s missing" % key)
    check(attrs.get("Conventions") == "CF-1.8", "Conventions = %r" % attrs.get("Conventions"))
    check(attrs.get("name") == "default_lw", "name = %r" % attrs.get("name"))
    check(int(np.asarray(attrs.get("band_set_format", -1)).item()) == 1, "band_set_format = %r" % attrs.get("band_set_format"))
    check(bool(str(attrs.get("source", "")).strip()), "source is empty")
    check("earth_idealised_absorbers" in str(attrs.get("source", "")), "source does not name the absorber recipe: %r"
          % attrs.get("source"))
    check(attrs.get("recipe_text") == recipe_text, "recipe_text is not the text of bands/default_lw.toml")
    check(version_line == "bandstack " + str(attrs.get("builder_version")),
          "builder_version %r vs `bandstack --version` %r" % (attrs.get("builder_version"), version_line))
    ds.close()

    # CF decoding must not trip over anything either.
    with xr.open_dataset(path) as decoded:
        check("absorption_coefficient" in decoded, "decode_cf=True lost absorption_coefficient")


def check_ncdump(path):
    header = subprocess.run(["ncdump", "-h", path], capture_output=True, text=True)
    check(header.returncode == 0, "ncdump -h failed: %s" % header.stderr)
    check("absorption_coefficient(absorber, gpoint, ref_temperature, ref_pressure)" in header.stdout,
          "ncdump -h does not show absorption_coefficient with its dimensions")
    check(":Conventions = \"CF-1.8\"" in header.stdout, "ncdump -h does not show Conventions")
    kind = subprocess.run(["ncdump", "-k", path], capture_output=True, text=True)
    check(kind.returncode == 0 and kind.stdout.strip().startswith("netCDF-4"),
          "ncdump -k says %r, expected netCDF-4 (docs/band-set-file.md)" % kind.stdout.strip())


def main():
    parser = argparse.ArgumentParser(description=__doc__)
    parser.add_argument("--exe", required=True)
    parser.add_argument("--tools", required=True)
    parser.add_argument("--workdir", required=True)
    args = parser.parse_args()
    shutil.rmtree(args.workdir, ignore_errors=True)
    os.makedirs(args.workdir)

    with open(RECIPE, "rb") as f:
        recipe_bytes = f.read()
    recipe = tomllib.loads(recipe_bytes.decode())
    path = os.path.join(args.workdir, "d.nc")
    build = subprocess.run([args.exe, "bands", "build", "default_lw", "-o", path], capture_output=True, text=True)
    if check(build.returncode == 0 and os.path.isfile(path), "bands build failed: %s%s" % (build.stdout, build.stderr)):
        version = subprocess.run([args.exe, "--version"], capture_output=True, text=True).stdout.strip()
        check_file(path, recipe, recipe_bytes.decode(), version)
        check_ncdump(path)

    for message in failures:
        print("FAILED:", message)
    print("band_set_xarray: %d passed, %d failed" % (passed[0], len(failures)))
    return 1 if failures else 0


if __name__ == "__main__":
    sys.exit(main())

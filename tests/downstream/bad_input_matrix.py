"""Bad-input matrix: every input path of `bandstack` (study file, profile file, band-set file,
cross-section file, command-line options) fed malformed syntax, wrong types, unknown or missing keys and
variables, missing or wrong units, NaN and Inf, negative amounts, non-monotonic or duplicated pressures,
zero or one vertical point, absurd sizes and truncated files. The bad netCDF files are written with
Debian's python3-netcdf4.

For every case: exit code 2 (never a crash, a hang, or exit 1 "internal error"); the message names the
file, the variable or key, and the place (line:column, index or level) where there is one; and the output
folder, which holds a complete result of an earlier run under the same name, is left exactly as it was
(no new, partial or working file; the earlier files byte-identical). Prints the number of cases.
"""
import concurrent.futures
import hashlib
import os
import re
import shutil
import subprocess
import sys

import numpy as np
from netCDF4 import Dataset

sys.path.insert(0, os.path.join(os.path.dirname(os.path.abspath(__file__)), "support"))
from checks import Checks, parse_args  # noqa: E402

check = Checks("bad_input_matrix")
args = parse_args()
WORK = args.workdir
CASE_SECONDS = 120  # a case that takes longer has hung (e.g. an absurd size taken literally)


# ---- the earlier, complete result every failed run must leave alone ----

GOOD_STUDY = """title = "earlier run"
[grid]
layers = 8
[longwave]
method = "grey"
[shortwave]
method = "none"
[[columns]]
name = "earlier"
profile = "us_standard_1976"
[output]
file = "result.nc"
"""


def folder_state(folder):
    return {name: hashlib.sha256(open(os.path.join(folder, name), "rb").read()).hexdigest()
            for name in sorted(os.listdir(folder))}


REFERENCE = os.path.join(WORK, "reference")
os.makedirs(REFERENCE)
with open(os.path.join(WORK, "good.toml"), "w") as f:
    f.write(GOOD_STUDY)
subprocess.run([args.exe, "run", os.path.join(WORK, "good.toml"), "--out", REFERENCE, "--quiet"], check=True)
REFERENCE_STATE = folder_state(REFERENCE)
check("result.nc" in REFERENCE_STATE, f"the earlier run wrote result.nc ({list(REFERENCE_STATE)})")


# ---- netCDF files: a valid base of each kind, changed one way per case ----

P_HPA = np.array([1000.0, 850.0, 700.0, 500.0, 300.0, 200.0, 100.0, 50.0, 10.0, 1.0])  # surface first
T_K = np.array([295.0, 285.0, 276.0, 262.0, 240.0, 222.0, 210.0, 215.0, 228.0, 260.0])  # invented sounding


def profile_file(path, fmt="NETCDF4", columns=2, levels=None, drop=(), attrs=None, values=None, dtype=None, extra=None):
    """Two columns (dimension site) on a pressure coordinate `plev` (hPa, surface first): ta (K) and hus
    (kg kg-1) on (site, plev). attrs/values/dtype override per variable; drop removes variables or
    attributes ("ta", "ta.units"); extra(nc) adds more."""
    p = P_HPA if levels is None else levels
    n = p.size
    t = np.resize(T_K, n) if n != T_K.size else T_K
    data = {"plev": p, "ta": np.tile(t, (columns, 1)),
            "hus": np.tile(0.01 * (np.resize(P_HPA, n) / 1000.0) ** 3 + 3e-6, (columns, 1))}
    meta = {"plev": {"standard_name": "air_pressure", "units": "hPa", "positive": "down"},
            "ta": {"standard_name": "air_temperature", "units": "K"},
            "hus": {"standard_name": "specific_humidity", "units": "kg kg-1"}}
    dims = {"plev": ("plev",), "ta": ("site", "plev"), "hus": ("site", "plev")}
    for name, changes in (attrs or {}).items():
        meta[name].update(changes)
    for name, change in (values or {}).items():
        data[name] = change(np.array(data[name], float))
    with Dataset(path, "w", format=fmt) as nc:
        nc.createDimension("site", columns)
        nc.createDimension("plev", n)
        for name in ("plev", "ta", "hus"):
            if name in drop:
                continue
            v = nc.createVariable(name, (dtype or {}).get(name, "f8"), dims[name])
            for key, value in meta[name].items():
                if f"{name}.{key}" not in drop:
                    v.setncattr(key, value)
            if v.dtype == str:
                v[...] = np.full(dims_shape(nc, dims[name]), "x", dtype=object)
            else:
                v[...] = data[name]
        if extra:
            extra(nc)


def dims_shape(nc, dims):
    return tuple(len(nc.dimensions[d]) for d in dims)


def band_set_file(path, fmt="NETCDF4", drop=(), attrs=None, values=None, globals_=None):
    """A small valid longwave band set: 2 bands (2 + 1 g-points), co2, 2 x 2 reference states."""
    data = {"band_lower_wavenumber": [10.0, 600.0], "band_upper_wavenumber": [600.0, 900.0], "gpoint_band": [0, 0, 1],
            "gpoint_weight": [0.25, 0.75, 1.0], "ref_pressure": [100.0, 1e5], "ref_temperature": [200.0, 300.0],
            "planck_temperature": [200.0, 300.0],
            "absorption_coefficient": np.array([[[[0.1, 0.2], [0.15, 0.25]], [[1.0, 2.0], [1.5, 2.5]],
                                                 [[0.01, 0.02], [0.015, 0.025]]]]),
            "planck_fraction": [[0.4, 0.3], [0.6, 0.7], [1.0, 1.0]]}
    dims = {"band_lower_wavenumber": ("band",), "band_upper_wavenumber": ("band",), "gpoint_band": ("gpoint",),
            "gpoint_weight": ("gpoint",), "ref_pressure": ("ref_pressure",), "ref_temperature": ("ref_temperature",),
            "planck_temperature": ("planck_temperature",),
            "absorption_coefficient": ("absorber", "gpoint", "ref_temperature", "ref_pressure"),
            "planck_fraction": ("gpoint", "planck_temperature")}
    units = {"band_lower_wavenumber": "cm-1", "band_upper_wavenumber": "cm-1", "gpoint_weight": "1", "ref_pressure": "Pa",
             "ref_temperature": "K", "planck_temperature": "K", "planck_fraction": "1"}
    for name, change in (values or {}).items():
        data[name] = change(np.array(data[name], float))
    with Dataset(path, "w", format=fmt) as nc:
        for dim, size in [("band", 2), ("gpoint", 3), ("absorber", 1), ("ref_pressure", 2), ("ref_temperature", 2),
                          ("planck_temperature", 2), ("absorber_text_length", 7)]:
            nc.createDimension(dim, size)
        for name, value in data.items():
            if name in drop:
                continue
            v = nc.createVariable(name, "i4" if name == "gpoint_band" else "f8", dims[name])
            a = {"units": units[name]} if name in units else {}
            a.update((attrs or {}).get(name, {}))
            for key, text in a.items():
                if f"{name}.{key}" not in drop:
                    v.setncattr(key, text)
            v[...] = value
        for name, text in [("absorber_name", "co2"), ("absorber_units", "m2 kg-1")]:
            if name not in drop:
                v = nc.createVariable(name, "S1", ("absorber", "absorber_text_length"))
                v[0, :] = np.array(list((globals_ or {}).get(name, text).ljust(7, "\0")[:7]), "S1")
        g = {"band_set_format": np.int32(1), "name": "tiny", "source": "invented", "recipe_text": "",
             "builder_version": "0"}
        g.update((globals_ or {}))
        for key, value in g.items():
            if key not in drop and key not in ("absorber_name", "absorber_units"):
                nc.setncattr(key, value)


NU = np.arange(500.0, 511.0, 1.0)


def cross_section_file(path, fmt="NETCDF4", drop=(), attrs=None, values=None, coefficient_dims=None, name="co2"):
    """co2 coefficients on 11 wavenumbers x 2 pressures x 2 temperatures, m2 kg-1."""
    data = {"wavenumber": NU, "pressure": np.array([100.0, 1e5]), "temperature": np.array([150.0, 350.0]),
            "k": np.full((2, 2, NU.size), 0.5)}
    units = {"wavenumber": "cm-1", "pressure": "Pa", "temperature": "K", "k": "m2 kg-1"}
    for key, change in (values or {}).items():
        data[key] = change(np.array(data[key], float))
    for key, text in (attrs or {}).items():
        units[key] = text
    with Dataset(path, "w", format=fmt) as nc:
        nc.title = "bad-input case"
        for dim in ("wavenumber", "pressure", "temperature"):
            nc.createDimension(dim, data[dim].size)
        for dim in ("wavenumber", "pressure", "temperature"):
            if dim in drop:
                continue
            v = nc.createVariable(dim, "f8", (dim,))
            if f"{dim}.units" not in drop:
                v.units = units[dim]
            v[...] = data[dim]
        if "k" not in drop:
            v = nc.createVariable(f"{name}_mass_absorption_coefficient", "f8",
                                  coefficient_dims or ("temperature", "pressure", "wavenumber"))
            if "k.units" not in drop:
                v.units = units["k"]
            v[...] = data["k"] if coefficient_dims is None else np.resize(data["k"], v.shape)


def truncated(writer, keep):
    """A valid file cut to `keep` of its length, as an interrupted copy leaves it."""
    def write(path):
        writer(path)
        size = os.path.getsize(path)
        with open(path, "r+b") as f:
            f.truncate(int(size * keep))
    return write


def text_file(text):
    def write(path):
        with open(path, "wb") as f:
            f.write(text if isinstance(text, bytes) else text.encode())
    return write


# ---- the cases ----

CASES = []  # (name, files {name: writer(path)}, command (list; {dir} is the case folder), expected regexes)


def study_case(name, text, expected, files=None):
    """`run s.toml --out OUT` with the study `text` (its output file is result.nc)."""
    CASES.append((name, dict(files or {}, **{"s.toml": text_file(text)}), ["run", "{dir}/s.toml", "--out", "{out}"],
                  expected))


COLUMN = '[[columns]]\nname = "c"\nprofile = "tropical"\n'
OUT = '[output]\nfile = "result.nc"\n'


def key_case(name, text, key, line):
    """A study problem at a known key and line: the message gives s.toml:LINE:COL and 'KEY'."""
    study_case(name, text, [rf"s\.toml:{line}:\d+", re.escape(f"'{key}'")])


# Study file: syntax.
study_case("toml_unclosed_table_header", "[grid\nlayers = 10\n" + COLUMN + OUT, [r"s\.toml:1:\d+", "TOML syntax error"])
study_case("toml_unterminated_string", COLUMN.replace('"tropical"\n', '"tropical\n') + OUT,
           [r"s\.toml:3:\d+", "TOML syntax error"])
study_case("toml_duplicate_key", "[grid]\nlayers = 10\nlayers = 20\n" + COLUMN + OUT, [r"s\.toml:3:\d+", "TOML syntax error"])
study_case("toml_value_missing", "[grid]\nlayers =\n" + COLUMN + OUT, [r"s\.toml:2:\d+", "TOML syntax error"])
study_case("toml_binary_garbage", b"\x00\x01\xff\xfe[[" * 10, [r"s\.toml", "TOML syntax error"])
study_case("toml_invalid_utf8", b'[[columns]]\nname = "\xff"\n', [r"s\.toml", "TOML syntax error"])
study_case("empty_study", "", ["s.toml", "no columns"])
# Study file: wrong types.
key_case("layers_is_text", '[grid]\nlayers = "ten"\n' + COLUMN + OUT, "grid.layers", 2)
key_case("layers_is_fraction", "[grid]\nlayers = 10.5\n" + COLUMN + OUT, "grid.layers", 2)
key_case("co2_is_text", COLUMN + 'co2_ppmv = "400"\n' + OUT, "columns[0].co2_ppmv", 4)
key_case("profile_is_number", '[[columns]]\nname = "c"\nprofile = 3\n' + OUT, "columns[0].profile", 3)
key_case("grid_is_number", "grid = 3\n" + COLUMN + OUT, "grid", 1)
key_case("columns_is_table", '[columns]\nprofile = "tropical"\n' + OUT, "columns", 1)
key_case("by_band_not_array", COLUMN + "surface_emissivity_by_band = 0.9\n" + OUT, "columns[0].surface_emissivity_by_band", 4)
key_case("by_band_element_text", COLUMN + 'surface_albedo_by_band = [0.1, "x"]\n' + OUT, "columns[0].surface_albedo_by_band[1]", 4)
key_case("output_file_number", COLUMN + "[output]\nfile = 5\n", "output.file", 5)
key_case("fallback_not_boolean", "[equilibrium]\ntime_marching_fallback = 1\n" + COLUMN + OUT,
         "equilibrium.time_marching_fallback", 2)
# Study file: unknown keys, unknown names.
key_case("unknown_top_level_key", "colums = 3\n" + COLUMN + OUT, "colums", 1)
key_case("unknown_grid_key", "[grid]\nlayer = 10\n" + COLUMN + OUT, "grid.layer", 2)
key_case("unknown_column_key", COLUMN + "co2_ppm = 400\n" + OUT, "columns[0].co2_ppm", 4)
key_case("unknown_profile", '[[columns]]\nname = "c"\nprofile = "venus"\n' + OUT, "columns[0].profile", 3)
key_case("unknown_method", '[longwave]\nmethod = "magic"\n' + COLUMN + OUT, "longwave.method", 2)
key_case("unknown_gas_in_experiment", '[[experiments]]\nscale_gases = { xe = 2 }\n' + COLUMN + OUT,
         "experiments[0].scale_gases.xe", 2)
key_case("unsweepable_key", '[[sweeps]]\nkey = "name"\nvalues = [1]\n' + COLUMN + OUT, "sweeps[0].key", 2)
# Study file: out of range, NaN, Inf, negative.
key_case("layers_zero", "[grid]\nlayers = 0\n" + COLUMN + OUT, "grid.layers", 2)
key_case("layers_negative", "[grid]\nlayers = -5\n" + COLUMN + OUT, "grid.layers", 2)
key_case("layers_absurd", "[grid]\nlayers = 1000000000\n" + COLUMN + OUT, "grid.layers", 2)
study_case("layers_beyond_int64", "[grid]\nlayers = 99999999999999999999\n" + COLUMN + OUT,
           [r"s\.toml:2:\d+", "TOML syntax error"])
key_case("co2_negative", COLUMN + "co2_ppmv = -1\n" + OUT, "columns[0].co2_ppmv", 4)
key_case("co2_nan", COLUMN + "co2_ppmv = nan\n" + OUT, "columns[0].co2_ppmv", 4)
key_case("surface_temperature_inf", COLUMN + "surface_temperature_k = inf\n" + OUT, "columns[0].surface_temperature_k", 4)
key_case("surface_temperature_minus_inf", COLUMN + "surface_temperature_k = -inf\n" + OUT,
         "columns[0].surface_temperature_k", 4)
key_case("albedo_above_one", COLUMN + "surface_albedo = 1.5\n" + OUT, "columns[0].surface_albedo", 4)
key_case("cos_zenith_above_one", COLUMN + "cos_zenith = 2\n" + OUT, "columns[0].cos_zenith", 4)
key_case("top_pressure_nan", "[grid]\ntop_pressure_hpa = nan\n" + COLUMN + OUT, "grid.top_pressure_hpa", 2)
key_case("gauss_angles_absurd", "[longwave]\ngauss_angles = 100000\n" + COLUMN + OUT, "longwave.gauss_angles", 2)
key_case("sweep_count_absurd", '[[sweeps]]\nkey = "co2_ppmv"\nfrom = 1\nto = 2\ncount = 1000000000000\n' + COLUMN + OUT,
         "sweeps[0].count", 5)
key_case("sweep_value_nan", '[[sweeps]]\nkey = "co2_ppmv"\nvalues = [280, nan]\n' + COLUMN + OUT, "sweeps[0].values[1]", 3)
study_case("sweeps_of_a_trillion_columns",
           '[[sweeps]]\nkey = "co2_ppmv"\nfrom = 1\nto = 1000\ncount = 1000000\n'
           '[[sweeps]]\nkey = "surface_albedo"\nfrom = 0\nto = 1\ncount = 1000000\n' + COLUMN + OUT,
           [r"s\.toml", r"\[\[sweeps\]\]", "1000000000000 columns"])
# Study file: missing or contradictory keys.
key_case("column_without_profile", '[[columns]]\nname = "c"\n' + OUT, "columns[0].profile", 1)
study_case("no_columns", "[grid]\nlayers = 10\n" + OUT, ["s.toml", "no columns"])
key_case("sun_needs_day", COLUMN + "latitude_deg = 40\n" + OUT, "columns[0]", 1)
key_case("top_below_surface", "[grid]\ntop_pressure_hpa = 1100\nsurface_pressure_hpa = 1000\n" + COLUMN + OUT, "grid", 1)
key_case("duplicate_column_name", COLUMN + COLUMN + OUT, "columns[1].name", 4)
key_case("output_file_empty", COLUMN + '[output]\nfile = ""\n', "output.file", 5)
study_case("band_set_unknown", '[longwave]\nband_set = "no_such_set"\n' + COLUMN + OUT, ["no_such_set"])
study_case("by_band_wrong_count", COLUMN + "surface_emissivity_by_band = [0.9, 0.8]\n" + OUT,
           [r"columns\[0\]|'c'", "surface_emissivity_by_band"])
study_case("experiment_band_out_of_range", "[[experiments]]\nremove_longwave_bands = [999]\n" + COLUMN + OUT,
           [r"experiments\[0\]", "999"])
study_case("profile_file_missing", '[[columns]]\nname = "c"\nprofile_file = "absent.nc"\n' + OUT, ["absent.nc"])

# Profile files: a study whose column is bad.nc.
PROFILE_STUDY = '[[columns]]\nname = "p"\nprofile_file = "bad.nc"\n' + OUT


def profile_case(name, writer, expected):
    study_case("profile_" + name, PROFILE_STUDY, [r"bad\.nc"] + expected, {"bad.nc": writer})


def nan_at(index, value=np.nan):
    def change(a):
        a[..., index] = value
        return a
    return change


LEVEL = r"level \d+|index \d+|plev \d+"  # the place: a level, or the index along the file's dimension
profile_case("missing_temperature", lambda p: profile_file(p, drop=("ta",)), ["air_temperature|temperature"])
profile_case("missing_pressure", lambda p: profile_file(p, drop=("plev",)), ["air_pressure|pressure"])
profile_case("temperature_without_units", lambda p: profile_file(p, drop=("ta.units",)), ["'ta'", "units"])
profile_case("pressure_without_units", lambda p: profile_file(p, drop=("plev.units",)), ["'plev'", "units"])
profile_case("temperature_in_metres", lambda p: profile_file(p, attrs={"ta": {"units": "m"}}), ["'ta'", "units", '"m"'])
profile_case("pressure_in_kelvin", lambda p: profile_file(p, attrs={"plev": {"units": "K"}}), ["'plev'", "units"])
profile_case("humidity_in_ppmv", lambda p: profile_file(p, attrs={"hus": {"units": "ppmv"}}), ["'hus'", "units"])
profile_case("temperature_nan", lambda p: profile_file(p, values={"ta": nan_at(3)}), ["'ta'", LEVEL])
profile_case("temperature_inf", lambda p: profile_file(p, values={"ta": nan_at(3, np.inf)}), ["'ta'", LEVEL])
profile_case("temperature_fill_value", lambda p: profile_file(p, values={"ta": nan_at(3, 9.969209968386869e36)}),
             ["'ta'", LEVEL])
# A value the file's checks pass but the column's do not: named by column and level of the study.
study_case("profile_temperature_absurd", PROFILE_STUDY, [r"bad\.nc|s\.toml", r"column 0", r"level \d+", "5000"],
           {"bad.nc": lambda p: profile_file(p, values={"ta": nan_at(3, 5000.0)})})
profile_case("temperature_negative", lambda p: profile_file(p, values={"ta": nan_at(3, -10.0)}), ["temperature|'ta'"])
profile_case("pressure_nan", lambda p: profile_file(p, values={"plev": nan_at(4)}), ["'plev'"])
profile_case("pressure_inf", lambda p: profile_file(p, values={"plev": nan_at(4, np.inf)}), ["'plev'"])
profile_case("pressure_negative", lambda p: profile_file(p, values={"plev": nan_at(9, -1.0)}), ["'plev'"])
profile_case("humidity_negative", lambda p: profile_file(p, values={"hus": nan_at(2, -0.001)}), ["'hus'|h2o|humidity", LEVEL])
profile_case("humidity_nan", lambda p: profile_file(p, values={"hus": nan_at(2)}), ["'hus'", LEVEL])
profile_case("pressure_not_monotonic",
             lambda p: profile_file(p, levels=np.array([1000.0, 850.0, 900.0, 500.0, 300.0, 200.0, 100.0, 50.0, 10.0, 1.0])),
             ["'plev'", "monoton|order|increas|decreas"])
profile_case("pressure_duplicated",
             lambda p: profile_file(p, levels=np.array([1000.0, 850.0, 850.0, 500.0, 300.0, 200.0, 100.0, 50.0, 10.0, 1.0])),
             ["'plev'", "monoton|order|increas|decreas|duplicat|twice"])
profile_case("zero_vertical_points", lambda p: profile_file(p, levels=np.array([])), ["plev|vertical|point"])
profile_case("one_vertical_point", lambda p: profile_file(p, levels=np.array([1000.0])), ["plev|vertical|point"])
profile_case("zero_columns", lambda p: profile_file(p, columns=0), ["site|column"])
profile_case("temperature_is_text", lambda p: profile_file(p, dtype={"ta": str}), ["'ta'"])
profile_case("two_temperatures", lambda p: profile_file(
    p, extra=lambda nc: nc.createVariable("ta2", "f8", ("site", "plev")).setncattr("standard_name", "air_temperature")),
    ["air_temperature", "ta2"])
profile_case("humidity_on_other_dimension", lambda p: profile_file(p, extra=lambda nc: (
    nc.createDimension("other", 3),
    nc.createVariable("q2", "f8", ("other",)).setncatts({"standard_name": "specific_humidity", "units": "kg kg-1"}))),
    ["'q2'|q2|'hus'|humidity", "dimension"])
def huge_profile(path):
    """2e9 columns x 10 levels of temperature that were never written (a tiny netCDF-4 file of fill values)."""
    with Dataset(path, "w", format="NETCDF4") as nc:
        nc.createDimension("site", 2_000_000_000)
        nc.createDimension("plev", P_HPA.size)
        v = nc.createVariable("plev", "f8", ("plev",))
        v.setncatts({"standard_name": "air_pressure", "units": "hPa"})
        v[...] = P_HPA
        nc.createVariable("ta", "f4", ("site", "plev"), chunksizes=(1024, P_HPA.size)).setncatts(
            {"standard_name": "air_temperature", "units": "K"})


profile_case("absurd_column_count_of_fill_values", huge_profile, ["2000000000 columns", "more than"])
profile_case("truncated_netcdf4", truncated(lambda p: profile_file(p), 0.5), [])
profile_case("truncated_classic", truncated(lambda p: profile_file(p, fmt="NETCDF3_CLASSIC"), 0.7), [])
profile_case("header_only_classic", truncated(lambda p: profile_file(p, fmt="NETCDF3_CLASSIC"), 0.3), [])
profile_case("not_netcdf", text_file("temperature = 288\n"), [])
profile_case("empty_file", text_file(""), [])
study_case("profile_named_variable_absent",
           '[[columns]]\nname = "p"\nprofile_file = "bad.nc"\n[columns.variables]\ntemperature = "tas"\n' + OUT,
           [r"bad\.nc", "tas"], {"bad.nc": lambda p: profile_file(p)})

# Band-set files: the study's longwave band set is bad_lw.nc.
BAND_STUDY = '[longwave]\nband_set = "bad_lw.nc"\n[shortwave]\nmethod = "none"\n' + COLUMN + OUT


def band_case(name, writer, expected):
    study_case("band_set_" + name, BAND_STUDY, [r"bad_lw\.nc"] + expected, {"bad_lw.nc": writer})


band_case("missing_weights", lambda p: band_set_file(p, drop=("gpoint_weight",)), ["'gpoint_weight'", "missing"])
band_case("missing_kappa", lambda p: band_set_file(p, drop=("absorption_coefficient",)), ["'absorption_coefficient'"])
band_case("missing_format", lambda p: band_set_file(p, drop=("band_set_format",)), ["'band_set_format'"])
band_case("wrong_units", lambda p: band_set_file(p, attrs={"ref_pressure": {"units": "hPa"}}), ["'ref_pressure'", "units"])
band_case("missing_units", lambda p: band_set_file(p, drop=("ref_temperature.units",)), ["'ref_temperature'", "units"])
band_case("kappa_nan", lambda p: band_set_file(p, values={"absorption_coefficient": nan_at(1)}),
          ["'absorption_coefficient'", r"g-point \d+"])
band_case("kappa_negative", lambda p: band_set_file(p, values={"absorption_coefficient": nan_at(0, -1.0)}),
          ["'absorption_coefficient'", r"g-point \d+"])
band_case("weights_inf", lambda p: band_set_file(p, values={"gpoint_weight": nan_at(1, np.inf)}),
          ["'gpoint_weight'", r"g-point 1"])
band_case("weights_do_not_sum", lambda p: band_set_file(p, values={"gpoint_weight": nan_at(0, 0.5)}),
          ["'gpoint_weight'", r"band 0"])
band_case("bands_not_increasing", lambda p: band_set_file(p, values={"band_upper_wavenumber": nan_at(0, 5.0)}),
          ["'band_upper_wavenumber'", r"band 0"])
band_case("ref_pressure_duplicated", lambda p: band_set_file(p, values={"ref_pressure": nan_at(1, 100.0)}),
          ["'ref_pressure'"])
band_case("unknown_absorber", lambda p: band_set_file(p, globals_={"absorber_name": "xenon"}), ["'absorber_name'", "xenon"])
band_case("truncated_netcdf4", truncated(lambda p: band_set_file(p), 0.6), [])
band_case("truncated_classic", truncated(lambda p: band_set_file(p, fmt="NETCDF3_CLASSIC"), 0.6), [])
band_case("not_netcdf", text_file("bands = 3\n"), [])
study_case("band_set_file_missing", '[longwave]\nband_set = "absent_lw.nc"\n' + COLUMN + OUT, ["absent_lw.nc"])

# Cross-section files: the reference method's absorbers come from bad_xs.nc.
XS_STUDY = ('[grid]\nlayers = 4\n[longwave]\nmethod = "reference"\nabsorbers = "bad_xs.nc"\nreference_step_cm1 = 1.0\n'
            '[shortwave]\nmethod = "none"\n' + COLUMN + OUT)


def xs_case(name, writer, expected):
    study_case("cross_section_" + name, XS_STUDY, [r"bad_xs\.nc"] + expected, {"bad_xs.nc": writer})


COEFFICIENT = "'co2_mass_absorption_coefficient'"
xs_case("missing_wavenumber", lambda p: cross_section_file(p, drop=("wavenumber",)), ["'wavenumber'"])
xs_case("missing_coefficients", lambda p: cross_section_file(p, drop=("k",)), ["no absorption coefficients"])
xs_case("missing_units", lambda p: cross_section_file(p, drop=("k.units",)), [COEFFICIENT, "units"])
xs_case("wrong_units", lambda p: cross_section_file(p, attrs={"k": "m2"}), [COEFFICIENT, "units"])
xs_case("pressure_in_kelvin", lambda p: cross_section_file(p, attrs={"pressure": "K"}), ["'pressure'", "units"])
xs_case("coefficient_nan", lambda p: cross_section_file(p, values={"k": nan_at(4)}), [COEFFICIENT, r"wavenumber 4"])
xs_case("coefficient_inf", lambda p: cross_section_file(p, values={"k": nan_at(4, np.inf)}), [COEFFICIENT, r"wavenumber 4"])
xs_case("coefficient_negative", lambda p: cross_section_file(p, values={"k": nan_at(2, -1.0)}),
        [COEFFICIENT, r"wavenumber 2"])
xs_case("wavenumber_not_increasing", lambda p: cross_section_file(p, values={"wavenumber": nan_at(3, 501.0)}),
        ["'wavenumber'", "index 3"])
xs_case("pressure_duplicated", lambda p: cross_section_file(p, values={"pressure": nan_at(1, 100.0)}),
        ["'pressure'", "index 1"])
xs_case("temperature_nan", lambda p: cross_section_file(p, values={"temperature": nan_at(0)}), ["'temperature'", "index 0"])
xs_case("wrong_dimension_order",
        lambda p: cross_section_file(p, coefficient_dims=("wavenumber", "pressure", "temperature")), [COEFFICIENT])
xs_case("unknown_absorber", lambda p: cross_section_file(p, name="xenon"), ["xenon"])
xs_case("truncated_netcdf4", truncated(lambda p: cross_section_file(p), 0.5), [])
xs_case("truncated_classic", truncated(lambda p: cross_section_file(p, fmt="NETCDF3_CLASSIC"), 0.8), [])
xs_case("not_netcdf", text_file("\x89HDF\r\n\x1a\n" + "x" * 100), [])

# Command-line options (the study itself is fine).
def cli_case(name, command, expected):
    CASES.append((name, {"s.toml": text_file(GOOD_STUDY)}, command, expected))


cli_case("unknown_option", ["run", "{dir}/s.toml", "--out", "{out}", "--fast"], ["--fast"])
cli_case("unknown_command", ["compute", "{dir}/s.toml"], ["compute"])
cli_case("no_command", [], ["subcommand|command"])
cli_case("missing_study", ["run", "--out", "{out}"], ["study"])
cli_case("threads_zero", ["run", "{dir}/s.toml", "--out", "{out}", "--threads", "0"], ["--threads"])
cli_case("threads_negative", ["run", "{dir}/s.toml", "--out", "{out}", "--threads", "-2"], ["--threads"])
cli_case("threads_not_a_number", ["run", "{dir}/s.toml", "--out", "{out}", "--threads", "many"], ["--threads"])
cli_case("threads_absurd", ["run", "{dir}/s.toml", "--out", "{out}", "--threads", "99999999999999999999"], ["--threads"])
cli_case("deflate_out_of_range", ["run", "{dir}/s.toml", "--out", "{out}", "--deflate", "10"], ["--deflate"])
cli_case("chunk_columns_zero", ["run", "{dir}/s.toml", "--out", "{out}", "--chunk-columns", "0"], ["--chunk-columns"])
cli_case("chunk_columns_fraction", ["run", "{dir}/s.toml", "--out", "{out}", "--chunk-columns", "2.5"], ["--chunk-columns"])
cli_case("out_missing_value", ["run", "{dir}/s.toml", "--out"], ["--out"])
cli_case("study_absent", ["run", "{dir}/absent.toml", "--out", "{out}"], ["absent.toml"])
cli_case("study_is_folder", ["run", "{dir}", "--out", "{out}"], [re.escape("{dir}")])
cli_case("out_folder_absent", ["run", "{dir}/s.toml", "--out", "{dir}/no/such/folder"], ["no/such/folder"])
cli_case("out_is_a_file", ["run", "{dir}/s.toml", "--out", "{dir}/s.toml"], ["s.toml"])
cli_case("check_absent", ["check", "{dir}/absent.toml"], ["absent.toml"])
cli_case("bands_info_absent", ["bands", "info", "{dir}/absent_lw.nc"], ["absent_lw.nc"])
cli_case("bands_build_unknown_recipe", ["bands", "build", "no_such_recipe", "-o", "{out}/x.nc"], ["no_such_recipe"])


# ---- running them ----

def run_case(number, case):
    name, files, command, expected = case
    folder = os.path.join(WORK, f"{number:03d}_{name}")
    out = os.path.join(folder, "out")
    shutil.copytree(REFERENCE, out)
    for file_name, write in files.items():
        write(os.path.join(folder, file_name))
    argv = [args.exe] + [a.replace("{dir}", folder).replace("{out}", out) for a in command]
    try:
        r = subprocess.run(argv, capture_output=True, text=True, errors="replace", timeout=CASE_SECONDS)
        code, message = r.returncode, r.stdout + r.stderr
    except subprocess.TimeoutExpired:
        code, message = None, f"no answer within {CASE_SECONDS} s"
    problems = []
    if code != 2:
        problems.append(f"exit code {code}, expected 2")
    if "internal error" in message or "Sanitizer" in message or "runtime error" in message:
        problems.append("a crash or an internal error")
    for pattern in expected:
        if not re.search(pattern.replace(re.escape("{dir}"), re.escape(folder)), message):
            problems.append(f"message lacks /{pattern}/")
    state = folder_state(out)
    if state != REFERENCE_STATE:
        problems.append(f"output folder changed: {sorted(state)} (earlier: {sorted(REFERENCE_STATE)})")
    return name, problems, message.strip()


with concurrent.futures.ThreadPoolExecutor(max_workers=2) as pool:
    outcomes = list(pool.map(lambda item: run_case(*item), enumerate(CASES)))
for name, problems, message in outcomes:
    check(not problems, f"{name}: {'; '.join(problems)}\n      message: {message[:600]}")
    if os.environ.get("BANDSTACK_SHOW_MESSAGES"):
        print(f"--- {name}: {message[:400]}")
print(f"bad_input_matrix: {len(CASES)} bad inputs tried")
sys.exit(check.report())

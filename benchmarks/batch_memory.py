#!/usr/bin/python3
"""Peak memory (max RSS) of `bandstack run` against the number of columns, each run in its own process.

Usage: benchmarks/batch_memory.py BANDSTACK_EXE [COUNTS...]   (default counts 10000 100000)
A cheap study (grey longwave, no shortwave, 6 layers) in three layouts: one column with CO2 swept, the
same crossed with 100 surface temperatures, and a profile file of (time, lat, lon) columns written here
with netCDF4 (read block by block), so that 100,000 columns take well under a minute. The run only
(--no-report): the report, written afterwards, reads an even sample of at most 16,384 columns
(report::ReportOptions), so its memory is bounded too. Issue target: max RSS for 100,000 columns
within 10 % of that for 10,000 (results are streamed to the file block by block).
"""
import os
import resource
import subprocess
import sys
import tempfile
import time

STUDY = """
title = "memory benchmark (invented scenario)"
[grid]
layers = 6
[longwave]
method = "grey"
[shortwave]
method = "none"
[[sweeps]]
key = "co2_ppmv"
from = 200
to = 1200
count = {co2_count}
{second_axis}
[[columns]]
name = "bench"
profile = "tropical"
[output]
file = "memory.nc"
"""


# Second layout: the same number of columns as a 2-D sweep (CO2 x surface temperature, 100 values),
# so that the coordinate arrays, which the file must hold, stay small.
SECOND_AXIS = """[[sweeps]]
key = "surface_temperature_k"
from = 280
to = 310
count = 100"""


PROFILE_STUDY = """
title = "memory benchmark, profile file (invented scenario)"
[longwave]
method = "grey"
[shortwave]
method = "none"
[[columns]]
name = "bench"
profile_file = "{profile}"
[output]
file = "memory.nc"
"""


def write_profile_file(path, count):
    """An invented (time, lat, lon, level) file of `count` columns (count a multiple of 100), 6 levels."""
    import numpy as np
    from netCDF4 import Dataset
    with Dataset(path, "w") as nc:
        shape = (count // 100, 10, 10)
        for name, n in zip(("time", "lat", "lon"), shape):
            nc.createDimension(name, n)
        nc.createDimension("level", 6)
        t = nc.createVariable("time", "f8", ("time",))
        t.units = "days since 2001-01-01"
        t[:] = np.arange(shape[0])
        lat = nc.createVariable("lat", "f8", ("lat",))
        lat.units = "degrees_north"
        lat[:] = np.linspace(-45, 45, 10)
        lon = nc.createVariable("lon", "f8", ("lon",))
        lon.units = "degrees_east"
        lon[:] = np.linspace(0, 90, 10)
        p = nc.createVariable("level", "f8", ("level",))
        p.units = "hPa"
        p.standard_name = "air_pressure"
        p[:] = [50, 200, 400, 600, 800, 950]
        ta = nc.createVariable("ta", "f8", ("time", "lat", "lon", "level"))
        ta.units = "K"
        ta.standard_name = "air_temperature"
        base = np.array([215.0, 220.0, 250.0, 268.0, 280.0, 288.0])
        ta[:] = base + (np.arange(count) % 7).reshape(shape + (1,)) * 0.5


def measure(exe, count, folder, layout="one"):
    study = os.path.join(folder, f"memory_{count}_{layout}.toml")
    with open(study, "w") as f:
        if layout == "profile":
            profile = os.path.join(folder, f"profiles_{count}.nc")
            write_profile_file(profile, count)
            f.write(PROFILE_STUDY.format(profile=profile))
        else:
            two_axes = layout == "two"
            f.write(STUDY.format(co2_count=count // 100 if two_axes else count,
                                 second_axis=SECOND_AXIS if two_axes else ""))
    start = time.time()
    pid = os.fork()
    if pid == 0:
        os.execv(exe, [exe, "run", study, "--quiet", "--restart", "--no-report", "--out", folder])
    _, status, usage = os.wait4(pid, 0)
    if status != 0:
        sys.exit(f"bandstack failed for {count} columns")
    return usage.ru_maxrss / 1024.0, time.time() - start  # ru_maxrss is in KiB on Linux


def main():
    exe = sys.argv[1]
    counts = [int(c) for c in sys.argv[2:]] or [10000, 100000]
    layouts = {"one": "one CO2 sweep axis", "two": "2-D sweep (CO2 x 100 surface temperatures)",
               "profile": "profile file (time x 10 lat x 10 lon, 6 levels)"}
    for layout, title in layouts.items():
        with tempfile.TemporaryDirectory() as folder:
            results = [(c, *measure(exe, c, folder, layout)) for c in counts]
        print(title)
        for count, rss, seconds in results:
            print(f"{count:>8} columns: max RSS {rss:7.1f} MiB, {seconds:6.1f} s, {count / seconds:9.0f} columns/s")
        if len(results) >= 2:
            print(f"max RSS ratio {results[-1][1] / results[0][1]:.3f} (target <= 1.10)")


if __name__ == "__main__":
    main()

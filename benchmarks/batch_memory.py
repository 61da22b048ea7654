#!/usr/bin/python3
"""Peak memory (max RSS) of `bandstack run` against the number of columns, each run in its own process.

Usage: benchmarks/batch_memory.py BANDSTACK_EXE [COUNTS...]   (default counts 10000 100000)
A cheap study (grey longwave, no shortwave, 6 layers, one column with CO2 swept, alone or crossed with
100 surface temperatures) so that 100,000
columns take well under a minute. Issue target: max RSS for 100,000 columns within 10 % of that for
10,000 (results are streamed to the file block by block).
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


def measure(exe, count, folder, two_axes=False):
    study = os.path.join(folder, f"memory_{count}_{int(two_axes)}.toml")
    with open(study, "w") as f:
        f.write(STUDY.format(co2_count=count // 100 if two_axes else count, second_axis=SECOND_AXIS if two_axes else ""))
    start = time.time()
    pid = os.fork()
    if pid == 0:
        os.execv(exe, [exe, "run", study, "--quiet", "--restart", "--out", folder])
    _, status, usage = os.wait4(pid, 0)
    if status != 0:
        sys.exit(f"bandstack failed for {count} columns")
    return usage.ru_maxrss / 1024.0, time.time() - start  # ru_maxrss is in KiB on Linux


def main():
    exe = sys.argv[1]
    counts = [int(c) for c in sys.argv[2:]] or [10000, 100000]
    for two_axes in (False, True):
        layout = "2-D sweep (CO2 x 100 surface temperatures)" if two_axes else "one CO2 sweep axis"
        with tempfile.TemporaryDirectory() as folder:
            results = [(c, *measure(exe, c, folder, two_axes)) for c in counts]
        print(layout)
        for count, rss, seconds in results:
            print(f"{count:>8} columns: max RSS {rss:7.1f} MiB, {seconds:6.1f} s, {count / seconds:9.0f} columns/s")
        if len(results) >= 2:
            print(f"max RSS ratio {results[-1][1] / results[0][1]:.3f} (target <= 1.10)")


if __name__ == "__main__":
    main()

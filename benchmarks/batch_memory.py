#!/usr/bin/python3
"""Peak memory (max RSS) of `bandstack run` against the number of columns, each run in its own process.

Usage: benchmarks/batch_memory.py BANDSTACK_EXE [COUNTS...]   (default counts 10000 100000)
A cheap study (grey longwave, no shortwave, 6 layers, one column with CO2 swept) so that 100,000
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
count = {count}
[[columns]]
name = "bench"
profile = "tropical"
[output]
file = "memory.nc"
"""


def measure(exe, count, folder):
    study = os.path.join(folder, f"memory_{count}.toml")
    with open(study, "w") as f:
        f.write(STUDY.format(count=count))
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
    with tempfile.TemporaryDirectory() as folder:
        results = [(c, *measure(exe, c, folder)) for c in counts]
    for count, rss, seconds in results:
        print(f"{count:>8} columns: max RSS {rss:7.1f} MiB, {seconds:6.1f} s, {count / seconds:9.0f} columns/s")
    if len(results) >= 2:
        print(f"max RSS ratio {results[-1][1] / results[0][1]:.3f} (target <= 1.10)")


if __name__ == "__main__":
    main()

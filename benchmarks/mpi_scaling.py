#!/usr/bin/python3
"""Scaling of `bandstack run` across MPI ranks on this machine, and what a global grid would cost.

Usage: benchmarks/mpi_scaling.py BANDSTACK_EXE [--columns N] [--equilibrium-columns M]

Runs two invented studies (default band sets; 60 layers): N plain columns (fluxes only) and M
columns each driven to radiative-convective equilibrium; each one process on 1 thread, then under
mpirun with 1 and 2 ranks of 1 thread each (--oversubscribe; as root it sets OMPI_ALLOW_RUN_AS_ROOT).
Prints columns per second, the speed-up of 2 ranks over 1, and, from the measured seconds per column
per core, an estimate of a 1 x 1 degree global grid (64,800 columns) x 10 scenarios on N nodes of
32 cores, at the parallel efficiency measured here (an assumption for other machines), with the
size of the result files (rank 0 writes them all).
"""
import argparse
import os
import subprocess
import tempfile
import time

ENV = dict(os.environ, OMPI_ALLOW_RUN_AS_ROOT="1", OMPI_ALLOW_RUN_AS_ROOT_CONFIRM="1")

STUDY = """title = "scaling benchmark (invented scenario)"
[grid]
layers = 60
{equilibrium}
[[sweeps]]
key = "co2_ppmv"
from = 200
to = 1200
count = {count}
[[columns]]
name = "bench"
profile = "tropical"
[output]
file = "scaling.nc"
"""

EQUILIBRIUM = """[equilibrium]
convection = "fixed_lapse_rate"
water = "fixed_relative_humidity"
surface_temperature = "energy_balance"
"""


def timed(command, folder):
    start = time.time()
    subprocess.run(command + ["--out", folder, "--quiet", "--no-report", "--restart", "--threads", "1",
                              "--chunk-columns", "16"], check=True, env=ENV)
    return time.time() - start


def measure(exe, count, equilibrium, folder):
    study = os.path.join(folder, f"scaling_{int(equilibrium)}.toml")
    with open(study, "w") as f:
        f.write(STUDY.format(count=count, equilibrium=EQUILIBRIUM if equilibrium else ""))
    run = [exe, "run", study]
    single = timed(run, folder)
    one = timed(["mpirun", "-np", "1", "--oversubscribe"] + run, folder)
    two = timed(["mpirun", "-np", "2", "--oversubscribe"] + run, folder)
    size = os.path.getsize(os.path.join(folder, "scaling.nc"))
    return single, one, two, size / count


def main():
    parser = argparse.ArgumentParser()
    parser.add_argument("exe")
    parser.add_argument("--columns", type=int, default=8000)
    parser.add_argument("--equilibrium-columns", type=int, default=256)
    args = parser.parse_args()
    grid, scenarios = 64800, 10
    with tempfile.TemporaryDirectory() as folder:
        for equilibrium, count in ((False, args.columns), (True, args.equilibrium_columns)):
            single, one, two, bytes_per_column = measure(os.path.abspath(args.exe), count, equilibrium, folder)
            kind = "equilibrium columns" if equilibrium else "plain columns (fluxes)"
            speedup = one / two
            per_column = single / count  # core-seconds per column on this machine
            print(f"{kind}: {count} columns; 1 process {count / single:.0f} columns/s; mpirun 1 rank "
                  f"{count / one:.0f}; 2 ranks {count / two:.0f} columns/s; speed-up {speedup:.2f}x "
                  f"(efficiency {50 * speedup:.0f} %)")
            core_hours = grid * scenarios * per_column / 3600
            print(f"  {grid} columns x {scenarios} scenarios = {core_hours:.1f} core-hours at "
                  f"{per_column * 1e3:.2f} ms per column per core; result files "
                  f"{grid * scenarios * bytes_per_column / 1e9:.0f} GB ({bytes_per_column / 1e3:.0f} kB per column, "
                  "written by rank 0: the file system's write rate bounds the run)")
            for nodes in (1, 4, 16, 64):
                cores = nodes * 32
                efficiency = min(1.0, speedup / 2)
                hours = core_hours / (cores * efficiency)
                print(f"  {nodes:>3} nodes x 32 cores at {100 * efficiency:.0f} % efficiency: {hours * 60:8.1f} minutes")


if __name__ == "__main__":
    main()

"""Downstream check: a study run across MPI ranks (mpirun -np 1, 2, 3 --oversubscribe) writes the same
file as a single-process run, resumes after the whole job is killed, and reports errors.

1. An equilibrium sweep (columns of uneven cost, including too-bright suns that push the
   equilibrium out of the band tables: recorded as failed) on 1, 2 and 3 ranks (one thread each,
   blocks of 2 columns, handed out dynamically): every variable and attribute read with xarray is
   bit-identical to the single-process run's, except the history attribute (the time of the run).
2. A cheap 20,000-column study on 2 ranks: the job (mpirun and its processes) is killed with SIGKILL
   once a few blocks are recorded; the same command run again resumes ("resuming") and gives the file
   of an uninterrupted single-process run.
3. A missing profile file on 2 ranks: exit code 2, the message names the file, no result file.
Open MPI refuses to start as root unless told; the test sets OMPI_ALLOW_RUN_AS_ROOT (CI runs as root).
"""
import os
import shutil
import subprocess
import sys
import time

import numpy as np
import xarray as xr

sys.path.insert(0, os.path.join(os.path.dirname(os.path.abspath(__file__)), "support"))
from checks import Checks, parse_args  # noqa: E402

check = Checks("mpi_ranks")
ENV = dict(os.environ, OMPI_ALLOW_RUN_AS_ROOT="1", OMPI_ALLOW_RUN_AS_ROOT_CONFIRM="1", OMPI_MCA_rmaps_base_oversubscribe="1")

EQUILIBRIUM = """title = "uneven equilibrium columns (invented)"
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
values = [1200, 1300, 1361, 1420, 1500, 2400, 4000]
[[sweeps]]
key = "co2_ppmv"
values = [280, 560]
[[columns]]
name = "world"
profile = "us_standard_1976"
[output]
file = "uneven.nc"
"""

CHEAP = """title = "many cheap columns (invented)"
[grid]
layers = 20
[shortwave]
method = "none"
[[sweeps]]
key = "co2_ppmv"
from = 200
to = 1200
count = 10000
[[sweeps]]
key = "surface_albedo"
values = [0.1, 0.3]
[[columns]]
name = "a"
profile = "tropical"
[output]
file = "cheap.nc"
"""


def write(folder, name, text):
    path = os.path.join(folder, name)
    with open(path, "w") as f:
        f.write(text)
    return path


def mpirun(ranks, exe, *arguments):
    return ["mpirun", "-np", str(ranks), "--oversubscribe", exe, *arguments]


def same_attributes(a, b):
    return a.keys() == b.keys() and all(np.array_equal(np.asarray(a[k]), np.asarray(b[k])) for k in a)


def same_files(a_path, b_path, what):
    with xr.open_dataset(a_path, decode_cf=False) as a, xr.open_dataset(b_path, decode_cf=False) as b:
        check(set(a.variables) == set(b.variables), f"{what}: other variables")
        for name in a.variables:
            check(a[name].equals(b[name]) and same_attributes(a[name].attrs, b[name].attrs), f"{what}: {name} differs")
        attrs_a = {k: v for k, v in a.attrs.items() if k != "history"}
        attrs_b = {k: v for k, v in b.attrs.items() if k != "history"}
        check(same_attributes(attrs_a, attrs_b), f"{what}: global attributes differ")


def checkpoint_columns(folder, name):
    try:
        with open(os.path.join(folder, f".{name}.checkpoint")) as f:
            for line in f:
                if line.startswith("columns_written"):
                    return int(line.split()[1])
    except (OSError, ValueError, IndexError):
        pass
    return 0


def main():
    args = parse_args()
    work = args.workdir
    exe = os.path.abspath(args.exe)
    study = write(work, "uneven.toml", EQUILIBRIUM)
    common = ["run", study, "--threads", "1", "--chunk-columns", "2", "--quiet", "--no-report"]
    reference = os.path.join(work, "single")
    os.makedirs(reference)
    subprocess.run([exe, *common, "--out", reference], check=True, env=ENV)
    with xr.open_dataset(os.path.join(reference, "uneven.nc")) as ds:
        status = ds.column_status.values
        # The brightest suns heat the column out of the band tables (not converged); most others converge.
        check(bool((status[..., -2:, :] == 2).all()) and int((status == 0).sum()) >= 6,
              f"reference run: statuses {status.tolist()}")
    for ranks in (1, 2, 3):
        out = os.path.join(work, f"ranks_{ranks}")
        os.makedirs(out)
        r = subprocess.run(mpirun(ranks, exe, *common, "--out", out), env=ENV, capture_output=True, text=True)
        check(r.returncode == 0, f"{ranks} ranks: exit {r.returncode}: {r.stderr[-2000:]}")
        if r.returncode == 0:
            same_files(os.path.join(reference, "uneven.nc"), os.path.join(out, "uneven.nc"), f"{ranks} ranks")
        check(sorted(os.listdir(out)) == ["uneven.nc"], f"{ranks} ranks left {os.listdir(out)}")

    # Kill the whole job mid-way, then resume.
    cheap = write(work, "cheap.toml", CHEAP)
    single = os.path.join(work, "cheap_single")
    os.makedirs(single)
    subprocess.run([exe, "run", cheap, "--threads", "2", "--chunk-columns", "100", "--quiet", "--no-report", "--out", single],
                   check=True, env=ENV)
    out = os.path.join(work, "cheap_mpi")
    os.makedirs(out)
    job = mpirun(2, exe, "run", cheap, "--threads", "1", "--chunk-columns", "100", "--no-report", "--out", out)
    p = subprocess.Popen(job, env=ENV, stdout=subprocess.DEVNULL, stderr=subprocess.DEVNULL, start_new_session=True)
    deadline = time.time() + 60
    while checkpoint_columns(out, "cheap.nc") < 300 and p.poll() is None and time.time() < deadline:
        time.sleep(0.02)
    killed_at = checkpoint_columns(out, "cheap.nc")
    # mpirun puts its ranks in process groups of their own: kill every process of the job by its
    # command line (it holds the output folder), as a node failure would.
    for _ in range(50):
        subprocess.run(["pkill", "-KILL", "-f", out], check=False)
        if subprocess.run(["pgrep", "-f", out], capture_output=True).returncode != 0:
            break
        time.sleep(0.05)
    p.wait()
    check(0 < killed_at < 20000, f"the job was not caught mid-way (checkpoint at {killed_at} columns)")
    check(not os.path.exists(os.path.join(out, "cheap.nc")), "a killed job left a final file")
    r = subprocess.run(job, env=ENV, capture_output=True, text=True)
    check(r.returncode == 0 and "resuming" in r.stderr, f"resume: exit {r.returncode}: {r.stderr[-3000:]}")
    if r.returncode == 0:
        same_files(os.path.join(single, "cheap.nc"), os.path.join(out, "cheap.nc"), "resumed 2-rank job")
    print(f"mpi_ranks: killed at {killed_at} of 20000 columns, then "
          f"{'started afresh (the killed write had damaged the file)' if 'afresh' in r.stderr else 'resumed'}")

    # An error on every rank.
    bad = write(work, "bad.toml", 'title = "missing file"\n[[columns]]\nname = "x"\nprofile_file = "nowhere.nc"\n'
                                  '[output]\nfile = "bad.nc"\n')
    r = subprocess.run(mpirun(2, exe, "run", bad, "--out", work, "--quiet"), env=ENV, capture_output=True, text=True)
    check(r.returncode == 2 and "nowhere.nc" in r.stderr, f"missing profile file: exit {r.returncode}: {r.stderr[-1500:]}")
    check(not os.path.exists(os.path.join(work, "bad.nc")), "an error left a result file")
    shutil.rmtree(os.path.join(work, "cheap_mpi"), ignore_errors=True)
    return check.report()


if __name__ == "__main__":
    sys.exit(main())

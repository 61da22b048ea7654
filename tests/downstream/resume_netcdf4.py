"""Downstream check: an interrupted run resumes and gives the same file as an uninterrupted one.

Runs a study of 6000 cheap columns block by block (--chunk-columns 100) and stops it once a few
blocks are recorded: with kill -9 (no chance to clean up), with SIGTERM and with SIGINT (the run
finishes its block, exits 143 / 130 and says how to resume). Each time: no final file may exist, the
same command run again must resume (it says so) and every variable of the resumed file, read with
netCDF4-python, must be bit-identical to that of an uninterrupted run with another thread count;
the global attributes too, except `history` (it holds the time of the run).
"""
import argparse
import os
import shutil
import signal
import subprocess
import sys
import time

import netCDF4
import numpy as np

STUDY = """
title = "resume check (invented scenario)"
[grid]
layers = 20
[shortwave]
method = "none"
[[sweeps]]
key = "co2_ppmv"
from = 200
to = 1200
count = 3000
[[sweeps]]
key = "surface_albedo"
values = [0.1, 0.3]
[[columns]]
name = "a"
profile = "tropical"
[output]
file = "resume.nc"
"""

failures = []


def check(condition, message):
    if not condition:
        failures.append(message)
    return bool(condition)


def command(exe, study, out, threads):
    return [exe, "run", study, "--threads", str(threads), "--chunk-columns", "100", "--out", out]


def columns_written(out):
    try:
        with open(os.path.join(out, ".resume.nc.checkpoint")) as f:
            for line in f:
                if line.startswith("columns_written"):
                    return int(line.split()[1])
    except (OSError, ValueError, IndexError):
        pass
    return 0


def same_file(a_path, b_path, label):
    a, b = netCDF4.Dataset(a_path), netCDF4.Dataset(b_path)
    a.set_auto_mask(False)
    b.set_auto_mask(False)
    check(set(a.variables) == set(b.variables), f"{label}: other variables")
    for name in a.variables:
        if name in b.variables:
            x, y = a.variables[name][...], b.variables[name][...]
            check(x.shape == y.shape and np.asarray(x).tobytes() == np.asarray(y).tobytes(), f"{label}: {name} differs")
    for key in a.ncattrs():
        if key != "history":
            check(a.getncattr(key) == b.getncattr(key), f"{label}: global attribute {key} differs")
    a.close()
    b.close()


def interrupted(exe, study, workdir, reference, how):
    out = os.path.join(workdir, how)
    os.makedirs(out)
    proc = subprocess.Popen(command(exe, study, out, 1), stdout=subprocess.PIPE, stderr=subprocess.PIPE, text=True)
    deadline = time.time() + 120
    while columns_written(out) < 300 and proc.poll() is None and time.time() < deadline:
        time.sleep(0.005)
    if not check(proc.poll() is None, f"{how}: the run ended before it could be interrupted"):
        proc.communicate()
        return
    proc.send_signal({"kill": signal.SIGKILL, "term": signal.SIGTERM, "int": signal.SIGINT}[how])
    _, err = proc.communicate()
    expected = {"kill": -signal.SIGKILL, "term": 143, "int": 130}[how]
    check(proc.returncode == expected, f"{how}: exit code {proc.returncode}, expected {expected}")
    if how != "kill":
        check("run the same command again" in err, f"{how}: no hint how to resume: {err!r}")
    check(not os.path.exists(os.path.join(out, "resume.nc")), f"{how}: a final file exists after the interruption")
    check(os.path.exists(os.path.join(out, ".resume.nc.partial")), f"{how}: no working file kept")
    done = subprocess.run(command(exe, study, out, 2), capture_output=True, text=True)
    check(done.returncode == 0, f"{how}: the resumed run failed: {done.stderr}")
    check("resuming" in done.stderr, f"{how}: the second run did not resume: {done.stderr!r}")
    check(not os.path.exists(os.path.join(out, ".resume.nc.partial")), f"{how}: working file left behind")
    same_file(os.path.join(out, "resume.nc"), reference, how)


def main():
    parser = argparse.ArgumentParser()
    parser.add_argument("--exe", required=True)
    parser.add_argument("--tools")
    parser.add_argument("--workdir", required=True)
    args = parser.parse_args()
    shutil.rmtree(args.workdir, ignore_errors=True)
    os.makedirs(args.workdir)
    study = os.path.join(args.workdir, "resume.toml")
    with open(study, "w") as f:
        f.write(STUDY)
    reference_dir = os.path.join(args.workdir, "reference")
    os.makedirs(reference_dir)
    subprocess.run(command(args.exe, study, reference_dir, 2) + ["--quiet"], check=True)
    reference = os.path.join(reference_dir, "resume.nc")
    for how in ("kill", "term", "int"):
        interrupted(args.exe, study, args.workdir, reference, how)
    if failures:
        print("\n".join(failures))
        sys.exit(1)
    print("resume_netcdf4: all checks passed")


if __name__ == "__main__":
    main()

"""Fault tests of the output side: an output folder that cannot be written, a full disk, and read-only
inputs. (A run killed mid-way and resumed is tests/downstream/resume_netcdf4.py.)

Run as root (as CI does), the faults are real file systems: a small tmpfs (`mount -t tmpfs -o size=...`)
that fills up, and the same tmpfs remounted read-only (chmod does not stop root). Run as another user,
the read-only folder is chmod 555 and the full-disk cases are skipped with a message. Expected each
time: exit code 2, a message naming the file or folder, no new file left behind (no partial or working
file), and a complete earlier result in the folder byte-identical afterwards.
"""
import hashlib
import os
import shutil
import stat
import subprocess
import sys

import numpy as np
from netCDF4 import Dataset

sys.path.insert(0, os.path.join(os.path.dirname(os.path.abspath(__file__)), "support"))
from checks import Checks, parse_args  # noqa: E402

check = Checks("fault_output")
args = parse_args()
WORK = args.workdir
ROOT = os.geteuid() == 0

STUDY = """title = "fault test"
[grid]
layers = 8
[longwave]
method = "grey"
[shortwave]
method = "none"
[[columns]]
name = "{name}"
{column}
[output]
file = "{out}"
"""


def write_study(name, out, column='profile = "us_standard_1976"'):
    path = os.path.join(WORK, name + ".toml")
    with open(path, "w") as f:
        f.write(STUDY.format(name=name, column=column, out=out))
    return path


def run(study, out, *extra):
    r = subprocess.run([args.exe, "run", study, "--out", out, "--quiet", *extra], capture_output=True, text=True)
    return r.returncode, r.stdout + r.stderr


def state(folder):
    return {n: hashlib.sha256(open(os.path.join(folder, n), "rb").read()).hexdigest() for n in sorted(os.listdir(folder))}


def mount_tmpfs(folder, size):
    os.makedirs(folder, exist_ok=True)
    r = subprocess.run(["mount", "-t", "tmpfs", "-o", f"size={size}", "tmpfs", folder], capture_output=True, text=True)
    return r.returncode == 0, r.stderr.strip()


def remount_read_only(folder):
    return subprocess.run(["mount", "-o", "remount,ro", folder], capture_output=True).returncode == 0


def unmount(folder):
    subprocess.run(["umount", folder], capture_output=True)


# An earlier complete result of a small study, and its size (the tmpfs sizes are set from it).
earlier_study = write_study("earlier", "result.nc")
reference = os.path.join(WORK, "reference")
os.makedirs(reference)
code, message = run(earlier_study, reference, "--no-report")
check(code == 0, f"the earlier run works: {message}")
result_size = os.path.getsize(os.path.join(reference, "result.nc"))

mounted = []
try:
    # (a) An output folder that cannot be written. The earlier result stays; nothing is added.
    read_only = os.path.join(WORK, "read_only")
    if ROOT:
        ok, why = mount_tmpfs(read_only, "4m")
        if ok:
            mounted.append(read_only)
    else:
        os.makedirs(read_only)
        ok, why = True, ""
    if not ok:
        print(f"SKIP read-only output folder: mount is not permitted here ({why})")
    else:
        shutil.copy(os.path.join(reference, "result.nc"), read_only)
        before = state(read_only)
        if ROOT:
            check(remount_read_only(read_only), "remounting the tmpfs read-only works")
        else:
            os.chmod(read_only, stat.S_IRUSR | stat.S_IXUSR | stat.S_IRGRP | stat.S_IXGRP | stat.S_IROTH | stat.S_IXOTH)
        for name, out in [("new_name", "other.nc"), ("same_name", "result.nc")]:
            code, message = run(write_study("ro_" + name, out), read_only, "--no-report")
            check(code == 2, f"read-only folder, {name}: exit code {code}, expected 2: {message}")
            check(read_only in message, f"read-only folder, {name}: the message names the folder: {message}")
            check("internal error" not in message, f"read-only folder, {name}: no internal error: {message}")
            check(state(read_only) == before, f"read-only folder, {name}: folder unchanged: {sorted(state(read_only))}")
        if not ROOT:
            os.chmod(read_only, stat.S_IRWXU)

    # (b) A full disk: a tmpfs with room for the earlier result but not for another.
    if not ROOT:
        print("SKIP full disk: needs root to mount a small tmpfs")
    else:
        for name, out, room in [("empty_disk_new_file", "other.nc", 0), ("beside_earlier_new_file", "other.nc", result_size),
                                ("beside_earlier_same_name", "result.nc", result_size)]:
            folder = os.path.join(WORK, "full_" + name)
            # tmpfs counts whole 4 KiB pages: room for the earlier file plus a quarter of another.
            size_kib = (room + 4095) // 4096 * 4 + max(4, result_size // 4096)
            ok, why = mount_tmpfs(folder, f"{size_kib}k")
            if not ok:
                print(f"SKIP full disk: mount is not permitted here ({why})")
                break
            mounted.append(folder)
            if room:
                shutil.copy(os.path.join(reference, "result.nc"), folder)
            before = state(folder)
            code, message = run(write_study("full_" + name, out), folder)
            check(code == 2, f"full disk, {name}: exit code {code}, expected 2: {message}")
            check(out in message, f"full disk, {name}: the message names the file {out}: {message}")
            check("internal error" not in message and "Sanitizer" not in message, f"full disk, {name}: no crash: {message}")
            check(state(folder) == before,
                  f"full disk, {name}: no file left behind and the earlier one unchanged: {sorted(state(folder))}")

    # (c) Read-only inputs: the study and its profile file chmod 444 (and, as root, on a read-only
    # file system) run normally.
    inputs = os.path.join(WORK, "inputs")
    os.makedirs(inputs)
    p = np.array([1000.0, 850.0, 700.0, 500.0, 300.0, 200.0, 100.0, 50.0, 10.0, 1.0])
    t = np.array([295.0, 285.0, 276.0, 262.0, 240.0, 222.0, 210.0, 215.0, 228.0, 260.0])  # invented sounding
    with Dataset(os.path.join(inputs, "sounding.nc"), "w") as nc:
        nc.createDimension("plev", p.size)
        v = nc.createVariable("plev", "f8", ("plev",))
        v.setncatts({"standard_name": "air_pressure", "units": "hPa"})
        v[:] = p
        v = nc.createVariable("ta", "f8", ("plev",))
        v.setncatts({"standard_name": "air_temperature", "units": "K"})
        v[:] = t
    study = os.path.join(inputs, "ro.toml")
    with open(study, "w") as f:
        f.write(STUDY.format(name="sounding", column='profile_file = "sounding.nc"', out="ro_inputs.nc"))
    for name in ("ro.toml", "sounding.nc"):
        os.chmod(os.path.join(inputs, name), 0o444)
    if ROOT and subprocess.run(["mount", "--bind", "-o", "ro", inputs, inputs], capture_output=True).returncode == 0:
        mounted.append(inputs)
        subprocess.run(["mount", "-o", "remount,bind,ro", inputs], capture_output=True)
        check(not os.access(inputs, os.W_OK) or subprocess.run(["touch", os.path.join(inputs, "x")]).returncode != 0,
              "the inputs folder is read-only")
    out = os.path.join(WORK, "ro_out")
    os.makedirs(out)
    code, message = run(study, out)
    check(code == 0, f"read-only inputs: exit code {code}, expected 0: {message}")
    check(os.path.exists(os.path.join(out, "ro_inputs.nc")), "read-only inputs: the result is written")
    check(state(inputs).keys() == {"ro.toml", "sounding.nc"}, f"read-only inputs: nothing written beside the inputs: "
                                                              f"{sorted(state(inputs))}")
finally:
    for folder in reversed(mounted):
        unmount(folder)

sys.exit(check.report())

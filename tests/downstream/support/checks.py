"""Shared by the downstream scripts (this folder is not globbed as tests): argument parsing, a check
counter that reports in the 'N passed, N failed' form, running bandstack, and comparing two results
variable by variable."""
import argparse
import os
import shutil
import subprocess

import numpy as np


def parse_args():
    """--exe, --tools, --workdir as tests/CMakeLists.txt passes them; the workdir is emptied."""
    parser = argparse.ArgumentParser()
    parser.add_argument("--exe", required=True)
    parser.add_argument("--tools", required=False)
    parser.add_argument("--workdir", required=True)
    args = parser.parse_args()
    shutil.rmtree(args.workdir, ignore_errors=True)
    os.makedirs(args.workdir)
    return args


class Checks:
    def __init__(self, name):
        self.name = name
        self.count = 0
        self.failures = []

    def __call__(self, condition, message):
        self.count += 1
        if not condition:
            self.failures.append(message)
        return bool(condition)

    def identical(self, a, b, what):
        """Every numeric variable of dataset a equals b's bit for bit (NaN equal to NaN)."""
        for name in a.data_vars:
            if np.issubdtype(a[name].dtype, np.number):
                self(np.array_equal(a[name].values, b[name].values, equal_nan=True), f"{name} differs {what}")

    def report(self):
        for f in self.failures:
            print("FAIL:", f)
        print(f"{self.name}: {self.count - len(self.failures)} passed, {len(self.failures)} failed")
        return 1 if self.failures else 0


def bandstack(exe, *arguments):
    """Runs the bandstack executable quietly; raises if it fails."""
    subprocess.run([exe, *arguments, "--quiet"], check=True)


def run_study(exe, study, out, threads=None):
    """`bandstack run STUDY --out OUT [--threads N]`; returns nothing (the caller knows the file name)."""
    os.makedirs(out, exist_ok=True)
    bandstack(exe, "run", study, "--out", out, *(["--threads", str(threads)] if threads else []))

"""What the benchmark's outside references share: their command line for the problem files, reading those files,
the timing loop and the JSON line they print.

The Java side (org.isorisk.bench.NumpyReference, org.isorisk.bench.CvxoptReference) writes every array as
little-endian float64 in row-major order and reads the JSON object on the last line of the output. Imported by
numpy_reference.py and cvxopt_reference.py from this folder (Python puts a script's own folder on sys.path).
"""
import argparse
import json
import sys
import time

import numpy as np


def problem_parser(description, vectors=()):
    """An argument parser with --sigma and --mu, then one option per (name, help) in vectors, then --n."""
    p = argparse.ArgumentParser(description=description)
    p.add_argument("--sigma", required=True)
    p.add_argument("--mu", required=True)
    for name, text in vectors:
        p.add_argument("--" + name, required=True, help=text)
    p.add_argument("--n", type=int, required=True)
    return p


def read_vector(path):
    """A float64 vector from a little-endian file."""
    return np.fromfile(path, dtype="<f8")


def read_problem(args):
    """(sigma, mu) from the files named by --sigma (n x n, row-major) and --mu."""
    return read_vector(args.sigma).reshape(args.n, args.n), read_vector(args.mu)


def timed(work, reps, warmup):
    """Runs work warmup times untimed, then reps times; returns (median wall s, median CPU s, last result)."""
    for _ in range(warmup):
        work()
    wall, cpu, last = [], [], None
    for _ in range(reps):
        c = time.process_time()
        s = time.perf_counter()
        last = work()
        wall.append(time.perf_counter() - s)
        cpu.append(time.process_time() - c)
    wall.sort()
    cpu.sort()
    return wall[len(wall) // 2], cpu[len(cpu) // 2], last


def openblas_info():
    """Which OpenBLAS runs (version, core, threads), as far as threadpoolctl can tell."""
    try:
        from threadpoolctl import threadpool_info
    except ImportError:
        return "threadpoolctl not installed: OpenBLAS core not known"
    for lib in threadpool_info():
        if lib.get("internal_api") == "openblas":
            return "OpenBLAS %s, core %s, %s threads" % (lib.get("version"), lib.get("architecture"),
                                                        lib.get("num_threads"))
    return "no OpenBLAS found by threadpoolctl"


def print_json(out):
    """The result as one JSON object on one line of stdout."""
    json.dump(out, sys.stdout)
    sys.stdout.write("\n")

"""Reference for sample quantiles: numpy.quantile with its default method ("linear", Hyndman & Fan type 7).

Usage: python3 quantiles_numpy.py CASES.json
CASES.json: a list of {"values": [...], "probabilities": [...]}, numbers written with full round-trip digits.
Prints a JSON list with, per case, the list of numpy.quantile(values, p), floats in Python's repr (round trip).
"""
import json
import sys

import numpy as np

with open(sys.argv[1], encoding="utf-8") as f:
    cases = json.load(f)
out = []
for case in cases:
    values = np.asarray(case["values"], dtype=np.float64)
    out.append([float(np.quantile(values, p)) for p in case["probabilities"]])
json.dump(out, sys.stdout)

"""Reference for the Ledoit-Wolf identity-target shrinkage: scikit-learn's LedoitWolf (Debian python3-sklearn).

Usage: python3 ledoit_wolf_sklearn.py RETURNS.csv [MORE.csv ...]
Each file: a header row, then one row per period, one column per asset (decimals).
Prints one JSON list, one object per file: {"shrinkage": delta, "covariance": [[...]], "location": [...]}.
scikit-learn centres the data on the sample mean and uses the biased covariance X'X/n, as the paper does.
"""
import json
import sys

import numpy as np
from sklearn.covariance import LedoitWolf

results = []
for path in sys.argv[1:]:
    x = np.loadtxt(path, delimiter=",", skiprows=1, ndmin=2)
    fit = LedoitWolf(assume_centered=False).fit(x)
    results.append({"shrinkage": float(fit.shrinkage_),
                    "covariance": fit.covariance_.tolist(),
                    "location": fit.location_.tolist()})
json.dump(results, sys.stdout)

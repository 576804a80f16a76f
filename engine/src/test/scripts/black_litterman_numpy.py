"""Reference for the views blend: the Black-Litterman posterior written out in numpy (Debian python3-numpy).

Usage: python3 black_litterman_numpy.py CASES.json
CASES.json: a list of {"sigma": [[...]], "pi": [...], "P": [[...]], "Q": [...], "omega": [...] (view variances,
the diagonal of Omega), "delta": d, "tau": t}; every return is an excess return. Prints a JSON list with, per case:
  posterior: mu_bar = Pi + tau Sigma P' (P tau Sigma P' + Omega)^-1 (Q - P Pi)
  M:         tau Sigma - tau Sigma P' (P tau Sigma P' + Omega)^-1 P tau Sigma
  optimal:   (delta (Sigma + M))^-1 mu_bar
  lambda:    He & Litterman's (1999) view weights in their own form, which needs Omega invertible:
             tau Omega^-1 Q / delta - A^-1 P Sigma w_eq / (1 + tau) - A^-1 P Sigma P' tau Omega^-1 Q / (delta (1 + tau)),
             A = Omega / tau + P Sigma P' / (1 + tau), w_eq = (delta Sigma)^-1 Pi; null when some omega is 0.
Floats are written with Python's repr (shortest round trip).
"""
import json
import sys

import numpy as np

with open(sys.argv[1], encoding="utf-8") as f:
    cases = json.load(f)
out = []
for c in cases:
    sigma = np.array(c["sigma"], dtype=np.float64)
    pi = np.array(c["pi"], dtype=np.float64)
    p = np.array(c["P"], dtype=np.float64).reshape(-1, sigma.shape[0])
    q = np.array(c["Q"], dtype=np.float64)
    om = np.diag(np.array(c["omega"], dtype=np.float64))
    delta = float(c["delta"])
    tau = float(c["tau"])
    ts = tau * sigma
    b = p @ ts @ p.T + om
    mu = pi + ts @ p.T @ np.linalg.solve(b, q - p @ pi)
    m = ts - ts @ p.T @ np.linalg.solve(b, p @ ts)
    w = np.linalg.solve(delta * (sigma + m), mu)
    lam = None
    if np.all(np.diag(om) > 0):
        w_eq = np.linalg.solve(delta * sigma, pi)
        om_inv_q = np.linalg.solve(om, q)
        a = om / tau + p @ sigma @ p.T / (1 + tau)
        lam = (tau * om_inv_q / delta
               - np.linalg.solve(a, p @ sigma @ w_eq) / (1 + tau)
               - np.linalg.solve(a, p @ sigma @ p.T @ (tau * om_inv_q)) / (delta * (1 + tau)))
        lam = lam.tolist()
    out.append({"posterior": mu.tolist(), "M": m.tolist(), "optimal": w.tolist(), "lambda": lam})
json.dump(out, sys.stdout)

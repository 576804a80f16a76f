#!/usr/bin/python3
"""Cross-check of isorisk's turnover-limited rebalance against cvxopt's interior-point QP.

Reads one problem as JSON on stdin:
  {"sigma": [[...]], "mu": [...], "w0": [...], "lower": [...], "upper": [...],
   "turnover": tau, "costs": [...decimal...], "target": m}
and solves, in its own formulation with x = (w, b, s):
  minimise w' Sigma w  s.t.  1'w = 1,  w - b + s = w0,  b, s >= 0,  lower <= w <= upper,
                             1'(b + s) <= tau,  mu'w - c'(b + s) >= m
Prints JSON: {"status": ..., "primal_infeasibility": ..., "dual_infeasibility": ...,
              "weights": [...], "variance": v, "turnover_price": dV*/dtau,
              "target_price": dV*/dm}
(shadow prices in isorisk's convention dV*/d(limit), from cvxopt's duals z >= 0 of G x <= h).
With tolerances of 1e-12 cvxopt often stops with status "unknown" one step short of them; the caller then
judges the residuals it prints.
Exits 3 when cvxopt is not installed, so that the caller can skip with a clear message.
"""
import json
import sys

try:
    from cvxopt import matrix, solvers
except ImportError:
    print("python3-cvxopt is not installed", file=sys.stderr)
    sys.exit(3)


def main():
    p = json.load(sys.stdin)
    sigma, mu, w0 = p["sigma"], p["mu"], p["w0"]
    lo, hi, tau, c, m = p["lower"], p["upper"], p["turnover"], p["costs"], p["target"]
    n = len(mu)
    N = 3 * n
    P = [[0.0] * N for _ in range(N)]
    for i in range(n):
        for j in range(n):
            P[i][j] = 2.0 * sigma[i][j]  # 1/2 x'Px = w' Sigma w
    A, b = [], []
    A.append([1.0] * n + [0.0] * (2 * n)); b.append(1.0)
    for i in range(n):
        row = [0.0] * N
        row[i], row[n + i], row[2 * n + i] = 1.0, -1.0, 1.0
        A.append(row); b.append(w0[i])
    G, h = [], []
    for k in range(n, N):
        row = [0.0] * N; row[k] = -1.0; G.append(row); h.append(0.0)
    for i in range(n):
        row = [0.0] * N; row[i] = 1.0; G.append(row); h.append(hi[i])
        row = [0.0] * N; row[i] = -1.0; G.append(row); h.append(-lo[i])
    turnover_row = len(G)
    G.append([0.0] * n + [1.0] * (2 * n)); h.append(tau)
    target_row = len(G)
    G.append([-x for x in mu] + list(c) + list(c)); h.append(-m)
    solvers.options.update({"show_progress": False, "abstol": 1e-12, "reltol": 1e-12, "feastol": 1e-12,
                            "maxiters": 200})
    # cvxopt's matrix() takes columns: transpose the row lists
    tr = lambda rows: matrix([[rows[r][k] for r in range(len(rows))] for k in range(len(rows[0]))])
    sol = solvers.qp(tr(P), matrix([0.0] * N), tr(G), matrix(h), tr(A), matrix(b))
    x = list(sol["x"])
    z = list(sol["z"])
    w = x[:n]
    v = sum(w[i] * sigma[i][j] * w[j] for i in range(n) for j in range(n))
    print(json.dumps({"status": sol["status"], "primal_infeasibility": sol["primal infeasibility"],
                      "dual_infeasibility": sol["dual infeasibility"], "weights": w, "variance": v,
                      "turnover_price": -z[turnover_row], "target_price": z[target_row]}))


if __name__ == "__main__":
    main()

#!/usr/bin/python3
"""Independent cross-check of isorisk's active-set QP with CVXOPT's interior-point QP (Debian python3-cvxopt).

Usage: /usr/bin/python3 check_qp_against_cvxopt.py ROOT

Every sub-folder of ROOT holds one problem written by the Java tests ExternalSolverCrossCheckTests and
ParametricQpTests:
  sigma.csv        n lines of n numbers: the covariance matrix
  constraints.csv  one constraint a'w (=|<=|>=) limit per line: name,relation,limit,a_1,...,a_n
                   (bounds come as rows too, named lower:<asset> / upper:<asset>)
  linear.csv       optional, n lines: a linear term q (surplus, tracking error); absent means q = 0
The script minimises w'Sigma w - 2 q'w and writes beside them
  cvxopt_weights.csv      n lines: the weights
  cvxopt_multipliers.csv  name,value: each constraint's multiplier in isorisk's convention dV*/dlimit
  cvxopt_status.txt       the solver's status and timing

cvxopt.solvers.qp solves min 1/2 x'Px + q'x s.t. Gx <= h, Ax = b with KKT  Px + q + G'z + A'y = 0, z >= 0.
With P = 2 Sigma and q = -2 q_lin (both times the scale set in solve(), undone on the multipliers):
2 Sigma w - 2 q_lin = -sum z_k g_k - sum y_k a_k. A '<=' row is g = a, so nu = -z <= 0; a '>=' row is written
g = -a, so nu = +z >= 0; an equality gives nu = -y. Its default tolerances stop early (up to ~3e-6 in the
weights), so the tolerances are tightened to 1e-14 with three steps of iterative refinement of each KKT solve: at
1e-12 weakly active bounds still sit ~1e-8 off, and on ill-conditioned problems (the sample fund, with its
low-volatility cash) 1e-13 without refinement leaves ~7e-8 in the weights.
"""
import os
import sys
import time

from cvxopt import matrix, solvers

solvers.options.update({"abstol": 1e-14, "reltol": 1e-14, "feastol": 1e-14, "refinement": 3, "show_progress": False,
                        "maxiters": 200})


def read_rows(path):
    rows = []
    with open(path) as f:
        for line in f:
            parts = line.rstrip("\n").split(",")
            rows.append((parts[0], parts[1], float(parts[2]), [float(v) for v in parts[3:]]))
    return rows


def solve(folder):
    with open(os.path.join(folder, "sigma.csv")) as f:
        sigma = [[float(v) for v in line.split(",")] for line in f if line.strip()]
    n = len(sigma)
    rows = read_rows(os.path.join(folder, "constraints.csv"))
    ineq = [r for r in rows if r[1] != "="]
    eq = [r for r in rows if r[1] == "="]
    # abstol bounds the absolute duality gap, so the objective is scaled to a largest diagonal entry of P of 1 (a
    # covariance of annual decimals has entries ~0.01-0.1, where a gap of 1e-14 left weights near a bound ~2e-8
    # off); the multipliers are scaled back below.
    scale = 1.0 / max(2.0 * sigma[i][i] for i in range(n))
    p = matrix([[2.0 * scale * sigma[i][j] for i in range(n)] for j in range(n)])  # column-major
    linear = [0.0] * n
    if os.path.exists(os.path.join(folder, "linear.csv")):
        with open(os.path.join(folder, "linear.csv")) as f:
            linear = [float(line) for line in f if line.strip()]
    q = matrix([-2.0 * scale * v for v in linear])
    sign = {"<=": 1.0, ">=": -1.0}
    g = matrix([[sign[r[1]] * r[3][j] for r in ineq] for j in range(n)], (len(ineq), n))
    h = matrix([sign[r[1]] * r[2] for r in ineq])
    a = matrix([[r[3][j] for r in eq] for j in range(n)], (len(eq), n))
    b = matrix([r[2] for r in eq])
    start = time.perf_counter()
    sol = solvers.qp(p, q, g, h, a, b)
    elapsed = time.perf_counter() - start
    z = list(sol["z"])
    y = list(sol["y"])
    nu = {}
    for k, r in enumerate(ineq):
        nu[r[0]] = (-z[k] if r[1] == "<=" else z[k]) / scale
    for k, r in enumerate(eq):
        nu[r[0]] = -y[k] / scale
    with open(os.path.join(folder, "cvxopt_weights.csv"), "w") as f:
        f.write("\n".join(repr(v) for v in sol["x"]) + "\n")
    with open(os.path.join(folder, "cvxopt_multipliers.csv"), "w") as f:
        f.write("\n".join("%s,%r" % (r[0], nu[r[0]]) for r in rows) + "\n")
    with open(os.path.join(folder, "cvxopt_status.txt"), "w") as f:
        f.write("%s %.6f %d\n" % (sol["status"], elapsed, sol["iterations"]))


def main():
    if len(sys.argv) != 2:
        sys.exit("usage: check_qp_against_cvxopt.py ROOT")
    root = sys.argv[1]
    for name in sorted(os.listdir(root)):
        folder = os.path.join(root, name)
        if os.path.isdir(folder):
            solve(folder)


if __name__ == "__main__":
    main()

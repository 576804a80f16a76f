"""Reference timing for the parametric benchmark: CVXOPT's interior-point QP (Debian python3-cvxopt) solving the
same group-constrained problem target by target.

Called by the Java benchmark (org.isorisk.bench.ParametricCase) with little-endian float64 files in row-major
order: the covariance, the expected returns, the mandate's rows (k x n), their relations (0 for '=', 1 for '<=',
-1 for '>='), their limits, the lower and upper bounds (infinite for none), the return targets and isorisk's exact
weights at those targets (one row per target). The problem: minimise w'Sigma w subject to the rows, the bounds and
mu'w = m, solved once per target (CVXOPT has no warm start), at CVXOPT's default tolerances; only the loop of
solve calls is timed; five targets are solved again at tight tolerances, untimed, to compare the weights. Prints
one JSON object on stdout.
"""
import platform

import numpy as np
import cvxopt
from cvxopt import matrix, spmatrix, solvers

from reference_common import openblas_info, print_json, problem_parser, read_problem, read_vector, timed

# As bench/cvxopt_reference.py: what a full-accuracy answer needs.
TIGHT = {"abstol": 1e-13, "reltol": 1e-13, "feastol": 1e-13}


def main():
    p = problem_parser(__doc__, [("rows", "the mandate's rows, k x n"), ("relations", None), ("limits", None),
                                 ("lower", None), ("upper", None), ("targets", None),
                                 ("weights", "isorisk's weights at the targets, one row per target")])
    p.add_argument("--k", type=int, required=True)
    p.add_argument("--reps", type=int, default=1)
    p.add_argument("--warmup", type=int, default=0)
    a = p.parse_args()
    n = a.n
    sigma, mu = read_problem(a)
    rows = read_vector(a.rows).reshape(a.k, n)
    rel = read_vector(a.relations)
    lim = read_vector(a.limits)
    lower = read_vector(a.lower)
    upper = read_vector(a.upper)
    targets = read_vector(a.targets)
    ours = read_vector(a.weights).reshape(targets.size, n)

    big_p = matrix(2.0 * sigma)
    q = matrix(0.0, (n, 1))
    eq = [i for i in range(a.k) if rel[i] == 0]
    le = [i for i in range(a.k) if rel[i] != 0]
    g_dense = [rel[i] * rows[i] for i in le]
    h_dense = [rel[i] * lim[i] for i in le]
    vals, ri, ci, h = [], [], [], []
    r = 0
    for gi, hi in zip(g_dense, h_dense):
        for j in range(n):
            if gi[j] != 0:
                vals.append(float(gi[j]))
                ri.append(r)
                ci.append(j)
        h.append(float(hi))
        r += 1
    for j in range(n):
        if np.isfinite(lower[j]):
            vals.append(-1.0)
            ri.append(r)
            ci.append(j)
            h.append(float(-lower[j]))
            r += 1
        if np.isfinite(upper[j]):
            vals.append(1.0)
            ri.append(r)
            ci.append(j)
            h.append(float(upper[j]))
            r += 1
    g = spmatrix(vals, ri, ci, (r, n))
    hm = matrix(h)
    a_eq = matrix(np.vstack([rows[eq], mu]) if eq else mu.reshape(1, n))
    solvers.options.clear()
    solvers.options["show_progress"] = False
    results = []

    def sweep():
        results.clear()
        for m in targets:
            b = matrix(np.append(lim[eq], m))
            results.append(solvers.qp(big_p, q, g, hm, a_eq, b))
        return len(results)

    wall, cpu, _ = timed(sweep, a.reps, a.warmup)
    statuses = sorted(set(s["status"] for s in results))
    diff = max(float(np.max(np.abs(np.array(s["x"]).ravel() - w))) for s, w in zip(results, ours))
    # Untimed: five of the targets again at tight tolerances (as in the qp case), to show both solve the same
    # problem; the objective is scaled to a unit largest diagonal so that the absolute gap tolerance means full
    # accuracy (as engine/src/test/scripts/check_qp_against_cvxopt.py does).
    solvers.options.update(TIGHT)
    scale = 1.0 / float(np.max(2.0 * np.diag(sigma)))
    tight = 0.0
    for j in np.unique(np.linspace(0, targets.size - 1, min(5, targets.size)).astype(int)):
        b = matrix(np.append(lim[eq], targets[j]))
        x = solvers.qp(matrix(2.0 * scale * sigma), q, g, hm, a_eq, b)["x"]
        tight = max(tight, float(np.max(np.abs(np.array(x).ravel() - ours[j]))))
    print_json({
        "sweep_s": wall,
        "sweep_cpu_s": cpu,
        "targets": int(targets.size),
        "iterations": int(sum(s["iterations"] for s in results)),
        "status": ", ".join(statuses),
        "weights_diff": diff,
        "weights_diff_tight": tight,
        "cvxopt": cvxopt.__version__,
        "python": platform.python_version(),
        "openblas": openblas_info(),
    })


if __name__ == "__main__":
    main()

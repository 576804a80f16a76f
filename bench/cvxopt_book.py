"""Reference timing for the book benchmark: CVXOPT's interior-point QP (Debian python3-cvxopt) in a plain Python
loop over the same bounded target problems as a book's rows, at CVXOPT's default tolerances.

Called by the Java benchmark (org.isorisk.bench.BookCase) with the covariance and expected returns, and for each
of the rows to solve its upper bounds (n per row; lower bounds are 0), its target and isorisk's weights, all as
little-endian float64 in row-major order. Each problem: minimise w'Sigma w subject to sum(w) = 1, mu'w = target,
0 <= w <= upper, solved one by one (CVXOPT has no warm start); only the solve calls are timed. Prints one JSON object.
"""
import platform
import time

import numpy as np
import cvxopt
from cvxopt import matrix, spmatrix, solvers

from reference_common import openblas_info, print_json, problem_parser, read_problem, read_vector


def main():
    p = problem_parser(__doc__, [("uppers", "upper bounds, rows x n"), ("targets", "one target per row"),
                                 ("weights", "isorisk's weights, rows x n, to compare")])
    p.add_argument("--rows", type=int, required=True)
    a = p.parse_args()
    n = a.n
    sigma, mu = read_problem(a)
    uppers = read_vector(a.uppers).reshape(a.rows, n)
    targets = read_vector(a.targets)
    isorisk = read_vector(a.weights).reshape(a.rows, n)
    big_p = matrix(2.0 * sigma)
    q = matrix(0.0, (n, 1))
    g = spmatrix([-1.0] * n + [1.0] * n, list(range(2 * n)), list(range(n)) * 2)
    aeq = matrix(np.vstack([np.ones(n), mu]))
    solvers.options.clear()
    solvers.options["show_progress"] = False
    statuses = {}
    worst = 0.0
    total = 0.0
    cpu = 0.0
    for k in range(a.rows):
        h = matrix(np.concatenate([np.zeros(n), uppers[k]]))
        b = matrix([1.0, float(targets[k])])
        c0 = time.process_time()
        s0 = time.perf_counter()
        sol = solvers.qp(big_p, q, g, h, aeq, b)
        total += time.perf_counter() - s0
        cpu += time.process_time() - c0
        statuses[sol["status"]] = statuses.get(sol["status"], 0) + 1
        if sol["status"] == "optimal":
            worst = max(worst, float(np.max(np.abs(np.array(sol["x"]).ravel() - isorisk[k]))))
    # the first rows again at tight tolerances: both solve the same problems (a check, not timed)
    solvers.options.update({"abstol": 1e-13, "reltol": 1e-13, "feastol": 1e-13})
    tight = 0.0
    for k in range(min(50, a.rows)):
        h = matrix(np.concatenate([np.zeros(n), uppers[k]]))
        sol = solvers.qp(big_p, q, g, h, aeq, matrix([1.0, float(targets[k])]))
        if sol["status"] == "optimal":
            tight = max(tight, float(np.max(np.abs(np.array(sol["x"]).ravel() - isorisk[k]))))
    print_json({
        "weights_diff_tight": tight,
        "rows": a.rows,
        "seconds": total,
        "cpu_seconds": cpu,
        "per_solve_s": total / a.rows,
        "statuses": statuses,
        "weights_diff_max": worst,
        "cvxopt": cvxopt.__version__,
        "python": platform.python_version(),
        "openblas": openblas_info(),
    })


if __name__ == "__main__":
    main()

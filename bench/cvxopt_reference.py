"""Reference timing for the qp benchmark: CVXOPT's interior-point QP (Debian python3-cvxopt) on the same problem.

Called by the Java benchmark (org.isorisk.bench.CvxoptReference) with the covariance, expected returns, return
targets and isorisk's minimum-variance weights it generated or computed, written as little-endian float64 in
row-major order. The problem: minimise w'Sigma w subject to sum(w) = 1 and 0 <= w_i <= upper (every asset), then
the same with the return target mu'w = m for each target, solved one by one (CVXOPT has no warm start).
CVXOPT at its best: dense P = 2 Sigma, the bound rows as a sparse G, its BLAS/LAPACK through OpenBLAS; only the
solve call is timed. Prints one JSON object on stdout.
"""
import platform

import numpy as np
import cvxopt
from cvxopt import matrix, spmatrix, solvers

from reference_common import openblas_info, print_json, problem_parser, read_problem, read_vector, timed

# CVXOPT's defaults stop early (up to ~3e-6 in the weights); "tight" is what a full-accuracy answer needs,
# as in engine/src/test/scripts/check_qp_against_cvxopt.py.
TIGHT = {"abstol": 1e-13, "reltol": 1e-13, "feastol": 1e-13}


def main():
    p = problem_parser(__doc__, [("targets", None), ("weights", "isorisk's minimum-variance weights, to compare")])
    p.add_argument("--upper", type=float, required=True)
    p.add_argument("--reps", type=int, default=5)
    p.add_argument("--warmup", type=int, default=1)
    p.add_argument("--sweep-reps", type=int, default=1)
    a = p.parse_args()
    n = a.n
    sigma, mu = read_problem(a)
    targets = read_vector(a.targets)
    isorisk_w = read_vector(a.weights)

    big_p = matrix(2.0 * sigma)
    q = matrix(0.0, (n, 1))
    g = spmatrix([-1.0] * n + [1.0] * n, list(range(2 * n)), list(range(n)) * 2)
    h = matrix([0.0] * n + [a.upper] * n)
    a1 = matrix(1.0, (1, n))
    b1 = matrix(1.0)
    a2 = matrix(np.vstack([np.ones(n), mu]))

    def options(opts):
        solvers.options.clear()
        solvers.options.update(opts)
        solvers.options["show_progress"] = False

    def options_timed(opts, work, reps, warmup):
        options(opts)
        return timed(work, reps, warmup)

    def minvar():
        return solvers.qp(big_p, q, g, h, a1, b1)

    def sweep():
        worst = "optimal"
        for m in targets:
            sol = solvers.qp(big_p, q, g, h, a2, matrix([1.0, float(m)]))
            if sol["status"] != "optimal":
                worst = sol["status"]
        return worst

    default_s, default_cpu, d = options_timed({}, minvar, a.reps, a.warmup)
    tight_s, _, t = options_timed(TIGHT, minvar, a.reps, a.warmup)
    sweep_s, _, sweep_status = options_timed({}, sweep, a.sweep_reps, 0)
    out = {
        "minvar_default_s": default_s,
        "minvar_default_cpu_s": default_cpu,
        "minvar_default_iterations": d["iterations"],
        "minvar_default_status": d["status"],
        "minvar_tight_s": tight_s,
        "minvar_tight_iterations": t["iterations"],
        "minvar_tight_status": t["status"],
        "weights_diff_default": float(np.max(np.abs(np.array(d["x"]).ravel() - isorisk_w))),
        "weights_diff_tight": float(np.max(np.abs(np.array(t["x"]).ravel() - isorisk_w))),
        "sweep_s": sweep_s,
        "sweep_status": sweep_status,
        "targets": int(targets.size),
        "cvxopt": cvxopt.__version__,
        "python": platform.python_version(),
        "openblas": openblas_info(),
    }
    print_json(out)


if __name__ == "__main__":
    main()

"""Reference timing for the closed-form benchmark: numpy (LAPACK through OpenBLAS) on the same matrices.

Called by the Java benchmark (org.isorisk.bench.NumpyReference) with the covariance and expected returns it
generated, written as little-endian float64 in row-major order. Does the same work as the Java case:
factor Σ once (Cholesky), solve Σx = 1 and Σx = μ through the factor, then the global minimum-variance
portfolio and a frontier of target returns with weights, multipliers and variance (one Σw product per
portfolio). Prints one JSON object on stdout.
"""
import platform

import numpy as np

from reference_common import openblas_info, print_json, problem_parser, read_problem, timed


def triangular_solver():
    """Forward and backward substitution with the factor: scipy's LAPACK trsm when present, else numpy."""
    try:
        from scipy.linalg import solve_triangular

        def solve(lower, rhs):
            y = solve_triangular(lower, rhs, lower=True, check_finite=False)
            return solve_triangular(lower.T, y, lower=False, check_finite=False)

        return solve, "scipy.linalg.solve_triangular"
    except ImportError:
        def solve(lower, rhs, block=256):
            n = lower.shape[0]
            y = np.array(rhs, dtype=float, copy=True)
            for s in range(0, n, block):
                e = min(n, s + block)
                y[s:e] -= lower[s:e, :s] @ y[:s]
                y[s:e] = np.linalg.solve(lower[s:e, s:e], y[s:e])
            x = y
            upper = lower.T
            for e in range(n, 0, -block):
                s = max(0, e - block)
                x[s:e] -= upper[s:e, e:] @ x[e:]
                x[s:e] = np.linalg.solve(upper[s:e, s:e], x[s:e])
            return x

        return solve, "numpy blocked substitution"


def main():
    p = problem_parser(__doc__)
    p.add_argument("--reps", type=int, default=7)
    p.add_argument("--warmup", type=int, default=2)
    p.add_argument("--points", type=int, default=25)
    p.add_argument("--span", type=float, default=0.05)
    a = p.parse_args()
    n = a.n
    sigma, mu = read_problem(a)
    solve, solver_name = triangular_solver()
    ones = np.ones(n)

    def cholesky_only():
        return np.linalg.cholesky(sigma)

    def closed_form():
        lower = np.linalg.cholesky(sigma)
        x = solve(lower, np.column_stack([ones, mu]))
        x1, xm = x[:, 0], x[:, 1]
        big_a, big_b, big_c = x1 @ mu, xm @ mu, x1.sum()
        big_d = big_b * big_c - big_a * big_a
        w = x1 / big_c
        checksum = w @ (sigma @ w)
        m0 = big_a / big_c
        for k in range(a.points):
            m = m0 + a.span * k / max(1, a.points - 1)
            w = ((big_b - big_a * m) / big_d) * x1 + ((big_c * m - big_a) / big_d) * xm
            nu_return = 2 * (big_c * m - big_a) / big_d
            nu_budget = 2 * (big_b - big_a * m) / big_d
            variance = w @ (sigma @ w)
            checksum += variance + nu_return + nu_budget
        return checksum

    out = {
        "cholesky_s": timed(cholesky_only, a.reps, a.warmup)[0],
        "total_s": timed(closed_form, a.reps, a.warmup)[0],
        "numpy": np.__version__,
        "python": platform.python_version(),
        "triangular": solver_name,
        "openblas": openblas_info(),
    }
    print_json(out)


if __name__ == "__main__":
    main()

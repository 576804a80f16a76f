package org.isorisk.engine.estimate;

import java.util.ArrayList;
import java.util.Comparator;
import java.util.List;
import java.util.Locale;
import org.apache.commons.math3.linear.Array2DRowRealMatrix;
import org.apache.commons.math3.linear.EigenDecomposition;
import org.apache.commons.math3.linear.RealMatrix;
import org.isorisk.engine.error.InputException;
import org.isorisk.engine.error.NoSolutionException;
import org.isorisk.engine.linalg.Cholesky;
import org.isorisk.engine.linalg.Spectrum;

/**
 * Repair of a covariance or correlation matrix that is not positive semi-definite (typical after hand edits or
 * pairwise estimation): the nearest correlation matrix in the Frobenius norm by Higham's alternating
 * projections with Dykstra's correction (Higham, N. J. (2002), "Computing the nearest correlation matrix — a
 * problem from finance", IMA J. Numer. Anal. 22, Algorithm 3.3 with W = I), with the volatilities kept. Never
 * applied silently: the caller shows the distance and the largest changes.
 */
public final class Repair {
    private Repair() {
    }

    /** The command that repairs a matrix, named by every message that refuses a broken one. */
    public static final String COMMAND = "isorisk check --repair";

    /** Relative asymmetry above which a matrix is refused rather than repaired. */
    static final double SYMMETRY_TOLERANCE = 1e-12;

    /**
     * Repairs a covariance matrix: its correlation matrix is replaced by the nearest correlation matrix whose
     * eigenvalues are at least {@code s.minEigenvalue()}, and the volatilities {@code sqrt(Σ_ii)} are kept.
     *
     * @param assets asset names in matrix order
     * @param cov    symmetric, positive diagonal (not modified)
     * @param source name of the table, for messages
     */
    public static RepairResult covariance(List<String> assets, double[][] cov, RepairSettings s, String source) {
        validate(assets, cov, source);
        int n = cov.length;
        double[] vol = new double[n];
        for (int i = 0; i < n; i++) {
            if (!(cov[i][i] > 0)) {
                throw InputException.of("variance is not positive, so the volatility cannot be kept").file(source)
                        .asset(assets.get(i)).value(cov[i][i]).fix("give a positive variance on the diagonal").build();
            }
            vol[i] = Math.sqrt(cov[i][i]);
        }
        double[][] corr = new double[n][n];
        for (int i = 0; i < n; i++) {
            for (int j = 0; j < n; j++) {
                corr[i][j] = i == j ? 1.0 : cov[i][j] / (vol[i] * vol[j]);
            }
        }
        return run(true, assets, cov, corr, vol, s);
    }

    /**
     * Repairs a correlation matrix (unit diagonal required): the nearest correlation matrix whose eigenvalues
     * are at least {@code s.minEigenvalue()}.
     */
    public static RepairResult correlation(List<String> assets, double[][] corr, RepairSettings s, String source) {
        validate(assets, corr, source);
        int n = corr.length;
        for (int i = 0; i < n; i++) {
            if (Math.abs(corr[i][i] - 1) > SYMMETRY_TOLERANCE) {
                throw InputException.of("a correlation matrix has 1 on its diagonal").file(source)
                        .asset(assets.get(i)).value(corr[i][i])
                        .fix("set the diagonal to 1, or repair it as a covariance matrix").build();
            }
        }
        double[] ones = new double[n];
        java.util.Arrays.fill(ones, 1.0);
        double[][] c = new double[n][];
        for (int i = 0; i < n; i++) {
            c[i] = corr[i].clone();
            c[i][i] = 1.0;
        }
        return run(false, assets, corr, c, ones, s);
    }

    private static RepairResult run(boolean covInput, List<String> assets, double[][] input, double[][] corr,
                                    double[] vol, RepairSettings s) {
        int n = corr.length;
        Spectrum before = Estimator.spectrum(input);
        Spectrum corrBefore = Estimator.spectrum(corr);
        boolean valid = corrBefore.smallest() >= s.minEigenvalue() && corrBefore.smallest() > 0
                && Cholesky.factor(input) != null;
        if (valid) {
            return new RepairResult(covInput, assets, input, input, false, 0, 0, 0, before, before, List.of());
        }
        Projected p = nearestCorrelation(corr, s);
        double[][] out = new double[n][n];
        double dist = 0;
        double cdist = 0;
        List<RepairResult.Change> changes = new ArrayList<>();
        for (int i = 0; i < n; i++) {
            for (int j = 0; j < n; j++) {
                out[i][j] = i == j ? input[i][i] : p.matrix[i][j] * vol[i] * vol[j];
                double d = out[i][j] - input[i][j];
                dist += d * d;
                double dc = p.matrix[i][j] - corr[i][j];
                cdist += dc * dc;
                if (j > i && dc != 0) {
                    changes.add(new RepairResult.Change(assets.get(i), assets.get(j), corr[i][j], p.matrix[i][j],
                            input[i][j], out[i][j]));
                }
            }
        }
        changes.sort(Comparator.comparingDouble((RepairResult.Change c) -> -Math.abs(c.correlationChange()))
                .thenComparing(RepairResult.Change::first).thenComparing(RepairResult.Change::second));
        List<RepairResult.Change> top = changes.subList(0, Math.min(s.reportedChanges(), changes.size()));
        Spectrum after = Estimator.spectrum(out);
        return new RepairResult(covInput, assets, input, out, true, Math.sqrt(dist), Math.sqrt(cdist), p.iterations,
                before, after, top);
    }

    /** The projected matrix and the iterations used. */
    private record Projected(double[][] matrix, int iterations) {
    }

    /**
     * Higham (2002), Algorithm 3.3 (W = I): {@code ΔS₀ = 0, Y₀ = A}; repeat {@code R = Y − ΔS},
     * {@code X = P_S(R)}, {@code ΔS = X − R}, {@code Y = P_U(X)}, where P_S clips the eigenvalues at the floor
     * and P_U sets the diagonal to 1. Stops when X and Y change by less than the tolerance (relative, Frobenius)
     * and agree to it. The returned matrix is the last X rescaled to an exact unit diagonal, which keeps it
     * positive semi-definite (and positive definite for a positive floor).
     */
    private static Projected nearestCorrelation(double[][] a, RepairSettings s) {
        int n = a.length;
        double[][] y = copy(a);
        double[][] ds = new double[n][n];
        double[][] x = copy(a);
        double[][] xOld;
        double[][] yOld;
        for (int k = 1; k <= s.maxIterations(); k++) {
            double[][] r = new double[n][n];
            for (int i = 0; i < n; i++) {
                for (int j = 0; j < n; j++) {
                    r[i][j] = y[i][j] - ds[i][j];
                }
            }
            xOld = x;
            x = projectEigenvalues(r, s.minEigenvalue());
            for (int i = 0; i < n; i++) {
                for (int j = 0; j < n; j++) {
                    ds[i][j] = x[i][j] - r[i][j];
                }
            }
            yOld = y;
            y = copy(x);
            for (int i = 0; i < n; i++) {
                y[i][i] = 1.0;
            }
            double ny = norm(y);
            double cx = diffNorm(x, xOld) / norm(x);
            double cy = diffNorm(y, yOld) / ny;
            double cxy = diffNorm(y, x) / ny;
            if (Math.max(cx, Math.max(cy, cxy)) <= s.tolerance()) {
                return new Projected(unitDiagonal(x), k);
            }
        }
        throw new NoSolutionException(NoSolutionException.Reason.NOT_CONVERGED, String.format(Locale.ROOT,
                "the nearest-correlation repair did not converge in %d iterations (tolerance %.1g); fix: raise the "
                        + "iteration limit or the tolerance", s.maxIterations(), s.tolerance()), List.of());
    }

    /** {@code V max(Λ, floor) V'} for symmetric {@code r} (symmetrised first against rounding). */
    private static double[][] projectEigenvalues(double[][] r, double floor) {
        int n = r.length;
        double[][] sym = new double[n][n];
        for (int i = 0; i < n; i++) {
            for (int j = 0; j < n; j++) {
                sym[i][j] = 0.5 * (r[i][j] + r[j][i]);
            }
        }
        EigenDecomposition ed = new EigenDecomposition(new Array2DRowRealMatrix(sym, false));
        double[] ev = ed.getRealEigenvalues();
        RealMatrix v = ed.getV();
        double[][] vv = v.getData();
        double[] lam = new double[n];
        for (int k = 0; k < n; k++) {
            lam[k] = Math.max(ev[k], floor);
        }
        double[][] out = new double[n][n];
        for (int i = 0; i < n; i++) {
            for (int j = i; j < n; j++) {
                double sum = 0;
                for (int k = 0; k < n; k++) {
                    sum += vv[i][k] * lam[k] * vv[j][k];
                }
                out[i][j] = sum;
                out[j][i] = sum;
            }
        }
        return out;
    }

    private static double[][] unitDiagonal(double[][] x) {
        int n = x.length;
        double[] d = new double[n];
        for (int i = 0; i < n; i++) {
            d[i] = 1.0 / Math.sqrt(x[i][i]);
        }
        double[][] out = new double[n][n];
        for (int i = 0; i < n; i++) {
            for (int j = 0; j < n; j++) {
                out[i][j] = i == j ? 1.0 : x[i][j] * d[i] * d[j];
            }
        }
        return out;
    }

    private static void validate(List<String> assets, double[][] m, String source) {
        int n = assets.size();
        if (m.length != n) {
            throw InputException.of("the matrix must be " + n + " by " + n + ", one row and column per asset")
                    .file(source).build();
        }
        double scale = 0;
        for (int i = 0; i < n; i++) {
            if (m[i].length != n) {
                throw InputException.of("the matrix must be " + n + " by " + n).file(source).asset(assets.get(i))
                        .build();
            }
            for (int j = 0; j < n; j++) {
                if (!Double.isFinite(m[i][j])) {
                    throw InputException.of("entry is not a finite number").file(source).asset(assets.get(i))
                            .column(assets.get(j)).value(m[i][j]).fix("give a number").build();
                }
                scale = Math.max(scale, Math.abs(m[i][j]));
            }
        }
        for (int i = 0; i < n; i++) {
            for (int j = i + 1; j < n; j++) {
                if (Math.abs(m[i][j] - m[j][i]) > SYMMETRY_TOLERANCE * Math.max(scale, Double.MIN_NORMAL)) {
                    throw InputException.of(String.format(Locale.ROOT, "the matrix is not symmetric: the entry "
                                    + "for ('%s', '%s') is %s but the entry for ('%s', '%s') is %s", assets.get(i),
                                    assets.get(j), Estimator.plain(m[i][j]), assets.get(j), assets.get(i),
                                    Estimator.plain(m[j][i])))
                            .file(source).fix("make the two entries equal; a repair does not guess which is right")
                            .build();
                }
            }
        }
    }

    private static double[][] copy(double[][] a) {
        double[][] c = new double[a.length][];
        for (int i = 0; i < a.length; i++) {
            c[i] = a[i].clone();
        }
        return c;
    }

    private static double norm(double[][] a) {
        double s = 0;
        for (double[] row : a) {
            for (double v : row) {
                s += v * v;
            }
        }
        return Math.sqrt(s);
    }

    private static double diffNorm(double[][] a, double[][] b) {
        double s = 0;
        for (int i = 0; i < a.length; i++) {
            for (int j = 0; j < a.length; j++) {
                double d = a[i][j] - b[i][j];
                s += d * d;
            }
        }
        return Math.sqrt(s);
    }
}

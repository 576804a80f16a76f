package org.isorisk.engine.views;

import java.util.ArrayList;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Locale;
import java.util.Set;
import org.apache.commons.math3.linear.Array2DRowRealMatrix;
import org.apache.commons.math3.linear.EigenDecomposition;
import org.apache.commons.math3.linear.RealVector;
import org.isorisk.engine.error.NoSolutionException;
import org.isorisk.engine.linalg.Cholesky;

/**
 * Solves {@code B y = r} for the views' symmetric positive semi-definite k × k matrix, {@code B = PτΣP' + Ω} (or
 * {@code Ω + PτΣP'/(1 + τ)} for the view weights). It is singular exactly when some views held with full
 * confidence (ω = 0) have linearly dependent portfolios: a null vector x has {@code P'x = 0} and {@code Ωx = 0}.
 *
 * <p>The rank is read from the eigenvalues (Commons Math's symmetric eigendecomposition) of the Jacobi-scaled
 * matrix {@code D^{-1/2} B D^{-1/2}}, {@code D = diag(B)}, whose diagonal is 1, so that a view with a huge
 * variance (a confidence near 0) does not make the others look dependent. When the scaled matrix's smallest
 * eigenvalue exceeds {@link #DEPENDENT}, B is solved by its Cholesky factor. Otherwise the views in the null
 * space are dependent: the system is consistent exactly when their returns agree ({@code x'r = 0}, since
 * {@code x'P = 0}); if they disagree by more than {@link #CONTRADICTION} the views are refused by name, and if
 * they agree the minimum-norm solution in the scaled coordinates (the pseudo-inverse on the range) is used. Any
 * solution gives the same {@code τΣP'y}, hence the same posterior, as dropping the redundant views.
 */
final class ViewSystem {
    /**
     * Smallest eigenvalue of the unit-diagonal scaled matrix below which the views count as linearly dependent:
     * a condition number of 10^12, beyond which a double-precision solve keeps about four digits (the threshold
     * the project uses for matrices read from files, {@code linalg.Definiteness.INPUT}).
     */
    static final double DEPENDENT = 1e-12;

    /**
     * Largest disagreement, in return units (decimal per year), between dependent full-confidence views that still
     * counts as agreement: a millionth of a basis point, far below any precision a view is stated with (a
     * hundredth of a basis point is 1e-6) and far above the rounding of the inputs (about 1e-17).
     */
    static final double CONTRADICTION = 1e-10;

    /** Coefficient (relative to the largest) from which a view counts as part of a dependence. */
    private static final double MEMBER = 1e-6;

    /** How the system was solved. */
    enum Method {
        CHOLESKY, PSEUDO_INVERSE
    }

    private final int k;
    private final Method method;
    private final Cholesky factor;
    private final double[] scale;
    private final double[][] eigenvectors;
    private final double[] eigenvalues;
    private final boolean[] nullDirection;
    private final List<String> names;

    private ViewSystem(int k, Method method, Cholesky factor, double[] scale, double[][] eigenvectors,
                       double[] eigenvalues, boolean[] nullDirection, List<String> names) {
        this.k = k;
        this.method = method;
        this.factor = factor;
        this.scale = scale;
        this.eigenvectors = eigenvectors;
        this.eigenvalues = eigenvalues;
        this.nullDirection = nullDirection;
        this.names = names;
    }

    /**
     * Analyses B.
     *
     * @param b     symmetric positive semi-definite, with a positive diagonal (not modified)
     * @param names the views' names, in B's order
     */
    static ViewSystem of(double[][] b, List<String> names) {
        int k = b.length;
        double[] scale = new double[k];
        for (int i = 0; i < k; i++) {
            if (!(b[i][i] > 0)) {
                throw new IllegalStateException("a view's variance is not positive: " + b[i][i]);
            }
            scale[i] = 1 / Math.sqrt(b[i][i]);
        }
        double[][] s = new double[k][k];
        for (int i = 0; i < k; i++) {
            for (int j = 0; j <= i; j++) {
                double v = 0.5 * (b[i][j] + b[j][i]) * scale[i] * scale[j];
                s[i][j] = i == j ? 1 : v;
                s[j][i] = s[i][j];
            }
        }
        EigenDecomposition eig = new EigenDecomposition(new Array2DRowRealMatrix(s, false));
        double[] values = eig.getRealEigenvalues();
        double[][] vectors = new double[k][];
        boolean[] none = new boolean[k];
        boolean dependent = false;
        for (int e = 0; e < k; e++) {
            RealVector v = eig.getEigenvector(e);
            vectors[e] = v.toArray();
            none[e] = values[e] <= DEPENDENT;
            dependent |= none[e];
        }
        Cholesky chol = dependent ? null : Cholesky.factor(b, 1);
        if (chol == null) {
            dependent = true;
            if (!anyTrue(none)) {
                // Cholesky failed although every scaled eigenvalue passed the threshold: treat the smallest as null.
                int min = 0;
                for (int e = 1; e < k; e++) {
                    min = values[e] < values[min] ? e : min;
                }
                none[min] = true;
            }
        }
        return new ViewSystem(k, dependent ? Method.PSEUDO_INVERSE : Method.CHOLESKY, chol, scale, vectors, values,
                none, List.copyOf(names));
    }

    Method method() {
        return method;
    }

    /** The views that take part in a linear dependence (empty when B is positive definite). */
    List<String> dependentViews() {
        Set<String> out = new LinkedHashSet<>();
        for (int e = 0; e < k; e++) {
            if (nullDirection[e]) {
                double[] x = combination(e);
                for (int i = 0; i < k; i++) {
                    if (Math.abs(x[i]) > MEMBER) {
                        out.add(names.get(i));
                    }
                }
            }
        }
        return List.copyOf(out);
    }

    /**
     * Solves {@code B y = r}.
     *
     * @throws NoSolutionException when dependent full-confidence views contradict each other, naming them
     */
    double[] solve(double[] r) {
        if (method == Method.CHOLESKY) {
            return factor.solve(r);
        }
        for (int e = 0; e < k; e++) {
            if (nullDirection[e]) {
                double[] x = combination(e);
                double disagreement = 0;
                for (int i = 0; i < k; i++) {
                    disagreement += x[i] * r[i];
                }
                if (Math.abs(disagreement) > CONTRADICTION) {
                    throw contradiction(x, disagreement);
                }
            }
        }
        // y = D^{-1/2} S⁺ D^{-1/2} r over the non-null eigenpairs of the scaled matrix S.
        double[] rs = new double[k];
        for (int i = 0; i < k; i++) {
            rs[i] = scale[i] * r[i];
        }
        double[] y = new double[k];
        for (int e = 0; e < k; e++) {
            if (nullDirection[e]) {
                continue;
            }
            double[] v = eigenvectors[e];
            double c = 0;
            for (int i = 0; i < k; i++) {
                c += v[i] * rs[i];
            }
            c /= eigenvalues[e];
            for (int i = 0; i < k; i++) {
                y[i] += c * v[i];
            }
        }
        for (int i = 0; i < k; i++) {
            y[i] *= scale[i];
        }
        return y;
    }

    /** Null direction e in the views' own coordinates ({@code x = D^{-1/2}v}), largest coefficient 1. */
    private double[] combination(int e) {
        double[] x = new double[k];
        double big = 0;
        for (int i = 0; i < k; i++) {
            x[i] = scale[i] * eigenvectors[e][i];
            if (Math.abs(x[i]) > Math.abs(big)) {
                big = x[i];
            }
        }
        for (int i = 0; i < k; i++) {
            x[i] /= big;
        }
        return x;
    }

    private NoSolutionException contradiction(double[] x, double disagreement) {
        List<String> involved = new ArrayList<>();
        StringBuilder sum = new StringBuilder();
        for (int i = 0; i < k; i++) {
            if (Math.abs(x[i]) <= MEMBER) {
                continue;
            }
            involved.add(names.get(i));
            double c = x[i];
            sum.append(sum.length() == 0 ? (c < 0 ? "-" : "") : (c < 0 ? " - " : " + "));
            if (Math.abs(Math.abs(c) - 1) > 1e-9) {
                sum.append(plain(Math.abs(c), 4)).append(" × ");
            }
            sum.append('\'').append(names.get(i)).append('\'');
        }
        List<String> quoted = new ArrayList<>();
        for (String v : involved) {
            quoted.add("'" + v + "'");
        }
        String message = String.format(Locale.ROOT, "views %s are held with full confidence but contradict each "
                        + "other: the combination %s has a zero portfolio, yet a view return of %s instead of 0; fix: "
                        + "lower the confidence of one of them below 1 (or give it a variance above 0), or correct "
                        + "their returns", join(quoted), sum, plain(disagreement, 6));
        List<String> constraints = new ArrayList<>();
        for (String v : involved) {
            constraints.add("view:" + v);
        }
        return new NoSolutionException(NoSolutionException.Reason.INFEASIBLE, message, constraints);
    }

    /** {@code v} to {@code digits} significant digits, plain notation, no trailing zeros. */
    private static String plain(double v, int digits) {
        return new java.math.BigDecimal(v).round(new java.math.MathContext(digits)).stripTrailingZeros()
                .toPlainString();
    }

    private static String join(List<String> items) {
        if (items.size() <= 1) {
            return String.join("", items);
        }
        return String.join(", ", items.subList(0, items.size() - 1)) + " and " + items.get(items.size() - 1);
    }

    private static boolean anyTrue(boolean[] a) {
        for (boolean b : a) {
            if (b) {
                return true;
            }
        }
        return false;
    }
}

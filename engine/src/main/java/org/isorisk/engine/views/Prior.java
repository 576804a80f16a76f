package org.isorisk.engine.views;

import java.util.ArrayList;
import java.util.HashSet;
import java.util.List;
import java.util.Locale;
import java.util.Set;
import org.isorisk.engine.error.InputException;
import org.isorisk.engine.estimate.Repair;
import org.isorisk.engine.linalg.Cholesky;
import org.isorisk.engine.model.AssetUniverse;

/**
 * The prior the views are blended with: the covariance Σ, the prior excess returns Π over the risk-free rate, and
 * the risk aversion δ of the unconstrained optimum {@code w = (δΣ)⁻¹μ}. Build it with {@link #implied},
 * {@link #impliedBySharpeRatio} or {@link #given}.
 *
 * <p>Implied returns (reverse optimisation, Black &amp; Litterman 1992): {@code Π = δΣw_ref} are the excess
 * returns for which the reference portfolio maximises {@code w'Π − (δ/2)w'Σw}; the prior's total returns are
 * {@code r_f + Π}, as {@code estimate --mean implied} writes them.
 *
 * @param assets        asset names, unique, in the order of every vector and matrix (copied)
 * @param covariance    Σ, annualised, symmetric positive definite (copied, symmetrised)
 * @param excessReturns Π, annualised excess returns over {@code riskFree} (copied)
 * @param riskFree      r_f, annualised, decimal
 * @param riskAversion  δ > 0, or NaN when not known (a given prior without one: no optimum, no view weights)
 * @param origin        how Π was obtained
 */
public record Prior(List<String> assets, double[][] covariance, double[] excessReturns, double riskFree,
                    double riskAversion, Origin origin) {

    /**
     * Relative asymmetry of Σ accepted (and averaged away): far below any typing error, above the rounding of a
     * matrix computed in double precision.
     */
    static final double SYMMETRY = 1e-10;

    /** How the prior was obtained. */
    public enum Kind {
        /** {@code Π = δΣw_ref} with δ given. */
        IMPLIED_BY_RISK_AVERSION,
        /** {@code Π = δΣw_ref} with {@code δ = SR/σ_ref}. */
        IMPLIED_BY_SHARPE_RATIO,
        /** Expected returns given (e.g. a file), {@code Π = μ − r_f}. */
        GIVEN
    }

    /**
     * Where the prior came from, for reports.
     *
     * @param kind                 how Π was obtained
     * @param referenceWeights     w_ref for implied priors, null for a given one (copied)
     * @param sharpeRatio          the reference portfolio's Sharpe ratio when δ was implied by it, else NaN
     * @param referenceVolatility  {@code σ_ref = sqrt(w_ref'Σw_ref)} for implied priors, else NaN
     */
    public record Origin(Kind kind, double[] referenceWeights, double sharpeRatio, double referenceVolatility) {
        public Origin {
            if (kind == null) {
                throw new IllegalArgumentException("kind is required");
            }
            referenceWeights = referenceWeights == null ? null : referenceWeights.clone();
        }

        @Override
        public double[] referenceWeights() {
            return referenceWeights == null ? null : referenceWeights.clone();
        }
    }

    public Prior {
        if (assets == null || assets.isEmpty()) {
            throw InputException.of("the prior has no assets").fix("give at least one asset").build();
        }
        assets = List.copyOf(assets);
        Set<String> seen = new HashSet<>();
        for (String a : assets) {
            if (a == null || a.isBlank() || !seen.add(a)) {
                throw InputException.of(a == null || a.isBlank() ? "an asset name is blank" : "asset named twice")
                        .asset(a).fix("give each asset one unique name").build();
            }
        }
        int n = assets.size();
        covariance = symmetricCopy(covariance, assets);
        if (Cholesky.factor(covariance, 1) == null) {
            throw InputException.of("the covariance matrix is not positive definite, so no views can be blended "
                    + "with it").key("covariance").fix("check it, or repair it with " + Repair.COMMAND).build();
        }
        excessReturns = finiteCopy(excessReturns, n, "prior expected return", assets);
        if (!Double.isFinite(riskFree)) {
            throw InputException.of("the risk-free rate is not a finite number").key("risk_free").value(riskFree)
                    .fix("give a decimal such as 0.02").build();
        }
        if (!Double.isNaN(riskAversion) && !(riskAversion > 0 && Double.isFinite(riskAversion))) {
            throw InputException.of("the risk aversion must be a positive number").key("risk_aversion")
                    .value(riskAversion).fix("give a value such as 2.5").build();
        }
        if (origin == null) {
            throw new IllegalArgumentException("origin is required");
        }
        if (origin.kind() != Kind.GIVEN && Double.isNaN(riskAversion)) {
            throw new IllegalArgumentException("an implied prior has a risk aversion");
        }
    }

    /**
     * Returns implied by reference weights and a risk aversion: {@code Π = δΣw_ref}.
     *
     * @param assets           asset names
     * @param covariance       Σ, annualised (not modified)
     * @param referenceWeights w_ref, one decimal weight per asset, usually summing to 1 (not modified)
     * @param riskAversion     δ > 0 (He &amp; Litterman 1999 use 2.5)
     * @param riskFree         r_f, added back to give total returns
     */
    public static Prior implied(List<String> assets, double[][] covariance, double[] referenceWeights,
                                double riskAversion, double riskFree) {
        checkRiskAversion(riskAversion);
        double[] w = finiteCopy(referenceWeights, assets.size(), "reference weight", assets);
        double[] sw = times(covariance, w);
        double[] pi = new double[w.length];
        for (int i = 0; i < pi.length; i++) {
            pi[i] = riskAversion * sw[i];
        }
        return new Prior(assets, covariance, pi, riskFree, riskAversion,
                new Origin(Kind.IMPLIED_BY_RISK_AVERSION, w, Double.NaN, Math.sqrt(dot(w, sw))));
    }

    /**
     * Returns implied by reference weights whose Sharpe ratio is given: the risk aversion is
     * {@code δ = SR/σ_ref} with {@code σ_ref = sqrt(w_ref'Σw_ref)}. Reason: the reference portfolio's implied
     * excess return is {@code w_ref'Π = δσ_ref²}, and setting it to {@code SR·σ_ref} gives δ; this is Idzorek's
     * (2005) {@code δ = (E(r) − r_f)/σ²} for the market portfolio (from memory), with {@code E(r) − r_f = SR·σ_ref}.
     *
     * @param sharpeRatio the reference portfolio's annualised Sharpe ratio, positive
     */
    public static Prior impliedBySharpeRatio(List<String> assets, double[][] covariance, double[] referenceWeights,
                                             double sharpeRatio, double riskFree) {
        if (!(sharpeRatio > 0 && Double.isFinite(sharpeRatio))) {
            throw InputException.of("the Sharpe ratio must be a positive number").key("sharpe_ratio")
                    .value(sharpeRatio).fix("give an annualised value such as 0.4").build();
        }
        double[] w = finiteCopy(referenceWeights, assets.size(), "reference weight", assets);
        double[] sw = times(covariance, w);
        double sigma = Math.sqrt(Math.max(0, dot(w, sw)));
        if (!(sigma > 0)) {
            throw InputException.of("the reference portfolio has no volatility, so its Sharpe ratio implies no risk "
                    + "aversion").key("reference_weights").fix("give the risk aversion instead").build();
        }
        double delta = sharpeRatio / sigma;
        double[] pi = new double[w.length];
        for (int i = 0; i < pi.length; i++) {
            pi[i] = delta * sw[i];
        }
        return new Prior(assets, covariance, pi, riskFree, delta,
                new Origin(Kind.IMPLIED_BY_SHARPE_RATIO, w, sharpeRatio, sigma));
    }

    /**
     * Given expected total returns μ: {@code Π = μ − r_f}.
     *
     * @param expectedReturns μ, annualised total returns (not modified)
     * @param riskFree        r_f; it cancels from the posterior returns and matters only for the optimum
     * @param riskAversion    δ > 0 for the optimum and the view weights, or NaN for neither
     */
    public static Prior given(List<String> assets, double[][] covariance, double[] expectedReturns, double riskFree,
                              double riskAversion) {
        if (!Double.isNaN(riskAversion)) {
            checkRiskAversion(riskAversion);
        }
        double[] mu = finiteCopy(expectedReturns, assets.size(), "prior expected return", assets);
        for (int i = 0; i < mu.length; i++) {
            mu[i] -= riskFree;
        }
        return new Prior(assets, covariance, mu, riskFree, riskAversion, new Origin(Kind.GIVEN, null, Double.NaN,
                Double.NaN));
    }

    /** {@link #given} with the assets, expected returns and covariance of a universe. */
    public static Prior given(AssetUniverse universe, double riskFree, double riskAversion) {
        return given(universe.assets(), universe.covariance(), universe.expectedReturns(), riskFree, riskAversion);
    }

    /** Number of assets. */
    public int size() {
        return assets.size();
    }

    @Override
    public double[][] covariance() {
        double[][] c = new double[covariance.length][];
        for (int i = 0; i < c.length; i++) {
            c[i] = covariance[i].clone();
        }
        return c;
    }

    @Override
    public double[] excessReturns() {
        return excessReturns.clone();
    }

    /** The prior's total returns {@code r_f + Π}. */
    public double[] expectedReturns() {
        double[] mu = excessReturns.clone();
        for (int i = 0; i < mu.length; i++) {
            mu[i] += riskFree;
        }
        return mu;
    }

    /** Π_i without copying. */
    double excess(int i) {
        return excessReturns[i];
    }

    /** Things worth a warning, e.g. reference weights that do not sum to 1 (then Π scales with their sum). */
    public List<String> warnings() {
        List<String> out = new ArrayList<>();
        double[] w = origin.referenceWeights();
        if (w != null) {
            double s = 0;
            for (double v : w) {
                s += v;
            }
            if (Math.abs(s - 1) > 1e-9) {
                out.add(String.format(Locale.ROOT, "the reference weights sum to %s, not 1; the implied returns are "
                        + "proportional to them", Double.toString(s)));
            }
        }
        return out;
    }

    static double[] times(double[][] a, double[] x) {
        int n = x.length;
        if (a == null || a.length != n) {
            throw InputException.of("the covariance matrix must be " + n + " by " + n).key("covariance").build();
        }
        double[] y = new double[n];
        for (int i = 0; i < n; i++) {
            if (a[i] == null || a[i].length != n) {
                throw InputException.of("the covariance matrix must be " + n + " by " + n).key("covariance").build();
            }
            double s = 0;
            for (int j = 0; j < n; j++) {
                s += a[i][j] * x[j];
            }
            y[i] = s;
        }
        return y;
    }

    static double dot(double[] a, double[] b) {
        double s = 0;
        for (int i = 0; i < a.length; i++) {
            s += a[i] * b[i];
        }
        return s;
    }

    private static void checkRiskAversion(double delta) {
        if (!(delta > 0 && Double.isFinite(delta))) {
            throw InputException.of("the risk aversion must be a positive number").key("risk_aversion").value(delta)
                    .fix("give a value such as 2.5").build();
        }
    }

    private static double[] finiteCopy(double[] a, int n, String what, List<String> assets) {
        if (a == null || a.length != n) {
            throw InputException.of("one " + what + " per asset is needed").value(a == null ? "none" : a.length)
                    .fix("give " + n + " values, one per asset").build();
        }
        for (int i = 0; i < n; i++) {
            if (!Double.isFinite(a[i])) {
                throw InputException.of(what + " is not a finite number").asset(assets.get(i)).value(a[i])
                        .fix("give a decimal number").build();
            }
        }
        return a.clone();
    }

    private static double[][] symmetricCopy(double[][] m, List<String> assets) {
        int n = assets.size();
        if (m == null || m.length != n) {
            throw InputException.of("the covariance matrix must be " + n + " by " + n).key("covariance").build();
        }
        for (int i = 0; i < n; i++) {
            if (m[i] == null || m[i].length != n) {
                throw InputException.of("the covariance matrix must be " + n + " by " + n).key("covariance").build();
            }
            for (int j = 0; j < n; j++) {
                if (!Double.isFinite(m[i][j])) {
                    throw InputException.of("a covariance is not a finite number").key("covariance")
                            .asset(assets.get(i)).value(m[i][j]).build();
                }
            }
        }
        double[][] c = new double[n][n];
        for (int i = 0; i < n; i++) {
            for (int j = 0; j <= i; j++) {
                double scale = Math.sqrt(Math.abs(m[i][i] * m[j][j]));
                if (Math.abs(m[i][j] - m[j][i]) > SYMMETRY * scale) {
                    throw InputException.of("the covariance matrix is not symmetric").key("covariance")
                            .asset(assets.get(i) + "/" + assets.get(j)).value(m[i][j] + " vs " + m[j][i])
                            .fix("make entry (i, j) equal to entry (j, i)").build();
                }
                double v = i == j ? m[i][i] : 0.5 * (m[i][j] + m[j][i]);
                c[i][j] = v;
                c[j][i] = v;
            }
        }
        return c;
    }
}

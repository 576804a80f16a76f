package org.isorisk.engine.views;

import java.util.ArrayList;
import java.util.HashMap;
import java.util.HashSet;
import java.util.List;
import java.util.Map;
import java.util.Set;
import org.isorisk.engine.error.InputException;
import org.isorisk.engine.error.NoSolutionException;
import org.isorisk.engine.linalg.Cholesky;

/**
 * Views blended with a prior: the front door of the package.
 *
 * <p>The posterior, in the form that stays valid at full confidence (Ω singular, even Ω = 0), with
 * {@code S = τΣ}, {@code B = PSP' + Ω} and the views' excess returns {@code Q}:
 * <pre>
 *   μ̄ = Π + SP'B⁻¹(Q − PΠ)                 (posterior excess returns)
 *   M  = S − SP'B⁻¹PS                       (uncertainty of the mean; posterior covariance Σ + M)
 * </pre>
 * (Black &amp; Litterman 1992; He &amp; Litterman 1999, who also use Σ + M for the optimum.) Views are stated as
 * total returns; a view's excess return is {@code q − r_f·Σ_i p_i} (the risk-free rate cancels from a relative
 * view). B is solved by {@link ViewSystem}: Cholesky when positive definite; when full-confidence views are
 * linearly dependent, a symmetric eigendecomposition that refuses contradicting views by name and otherwise uses
 * the pseudo-inverse (the same posterior as dropping the redundant views).
 *
 * <p><b>τ cancels from μ̄ when Ω is proportional to τ</b> — He &amp; Litterman's default {@code ω = p'τΣp} and
 * Idzorek's {@code ω = ((1 − c)/c)p'τΣp} both are: then {@code B = τ(PΣP' + Ω/τ)} and
 * {@code SP'B⁻¹ = ΣP'(PΣP' + Ω/τ)⁻¹} holds no τ. τ still scales M, hence Σ + M and the optimum. A variance ω
 * given directly does not scale with τ, and then τ matters for μ̄ too.
 *
 * <p><b>View weights</b> (He &amp; Litterman's Λ). With {@code δΣw_prior = Π} (so {@code w_prior = w_ref} for an
 * implied prior), the unconstrained optimum {@code w* = (δ(Σ + M))⁻¹μ̄} is
 * <pre>
 *   w* = (w_prior + P'Λ)/(1 + τ),   Λ = (τ/δ)·(Ω + (τ/(1 + τ))PΣP')⁻¹·(Q − PΠ/(1 + τ)).
 * </pre>
 * Derivation: put {@code w = (w_prior + P'Λ)/(1 + τ)} into {@code δ(Σ + M)w}, with
 * {@code Σ + M = (1 + τ)Σ − SP'B⁻¹PS}: it equals
 * {@code Π + δΣP'Λ − (τ²/(1 + τ))ΣP'B⁻¹(PΠ + δPΣP'Λ)}, which is μ̄ when
 * {@code δBΛ − (δτ²/(1 + τ))PΣP'Λ = τ(Q − PΠ) + (τ²/(1 + τ))PΠ}, i.e.
 * {@code δ(Ω + (τ/(1 + τ))PΣP')Λ = τQ − (τ/(1 + τ))PΠ}. For an invertible Ω this is He &amp; Litterman's
 * {@code Λ = τΩ⁻¹Q/δ − A⁻¹PΣw_eq/(1 + τ) − A⁻¹PΣP'τΩ⁻¹Q/(δ(1 + τ))} with {@code A = Ω/τ + PΣP'/(1 + τ)}
 * (both equal {@code A⁻¹Q/δ − A⁻¹PΣw_eq/(1 + τ)}); unlike it, this form needs no Ω⁻¹ and holds at full
 * confidence. The optimum is computed directly by a Cholesky solve; the tests check the reconstruction.
 */
public final class Blend {
    private Blend() {
    }

    /**
     * The default τ, 0.05: the value in He &amp; Litterman's (1999) worked example. It sets how uncertain the
     * prior mean is relative to Σ (a standard error of the mean of √τ·σ); with Ω proportional to τ it does not
     * change μ̄.
     */
    public static final double DEFAULT_TAU = 0.05;

    /**
     * Blends the views with the prior.
     *
     * @param prior the prior (covariance, prior excess returns, risk-free rate, risk aversion)
     * @param views the views, with unique names; may be empty (the posterior mean is then the prior's and
     *              M = τΣ, the prior uncertainty of the mean)
     * @param tau   τ > 0, e.g. {@link #DEFAULT_TAU}
     * @throws InputException      on a bad τ, a repeated view name, or a view naming an asset the prior lacks
     * @throws NoSolutionException when views held with full confidence contradict each other (named)
     */
    public static Posterior posterior(Prior prior, List<View> views, double tau) {
        if (!(tau > 0 && Double.isFinite(tau))) {
            throw InputException.of("tau must be a positive number").key("tau").value(tau)
                    .fix("give a value such as " + DEFAULT_TAU + " (He & Litterman's example)").build();
        }
        int n = prior.size();
        Map<String, Integer> index = new HashMap<>();
        for (int i = 0; i < n; i++) {
            index.put(prior.assets().get(i), i);
        }
        Set<String> names = new HashSet<>();
        for (View v : views) {
            if (!names.add(v.name())) {
                throw InputException.of("two views are named '" + v.name() + "'").key("name").value(v.name())
                        .fix("give every view its own name").build();
            }
        }

        // Every view: its vector p over the assets, Σp and the prior variance p'τΣp along it.
        int all = views.size();
        double[][] sigma = prior.covariance();
        double[][] p = new double[all][];
        double[][] sp = new double[all][];
        double[] priorVariance = new double[all];
        double[] omega = new double[all];
        boolean[] dropped = new boolean[all];
        List<Integer> active = new ArrayList<>();
        for (int v = 0; v < all; v++) {
            View view = views.get(v);
            p[v] = vector(view, index, prior);
            sp[v] = Prior.times(sigma, p[v]);
            priorVariance[v] = tau * Prior.dot(p[v], sp[v]);
            switch (view.uncertainty()) {
                case CONFIDENCE -> {
                    double c = view.confidence();
                    dropped[v] = c == 0;
                    omega[v] = c == 0 ? Double.NaN : (1 - c) / c * priorVariance[v];
                }
                case VARIANCE -> omega[v] = view.variance();
                case PRIOR -> omega[v] = priorVariance[v];
                default -> throw new IllegalStateException("unknown uncertainty");
            }
            if (!dropped[v]) {
                active.add(v);
            }
        }

        // The active views' system: X = PτΣ (k × n), B = XP' + Ω, r = Q − PΠ (excess returns).
        int k = active.size();
        double[][] x = new double[k][n];
        double[][] b = new double[k][k];
        double[][] c = new double[k][k];
        double[] r = new double[k];
        double[] lambdaRhs = new double[k];
        List<String> activeNames = new ArrayList<>();
        double delta = prior.riskAversion();
        for (int a = 0; a < k; a++) {
            int v = active.get(a);
            activeNames.add(views.get(v).name());
            for (int j = 0; j < n; j++) {
                x[a][j] = tau * sp[v][j];
            }
            double q = excessViewReturn(views.get(v), prior.riskFree());
            double pPi = 0;
            for (int j = 0; j < n; j++) {
                pPi += p[v][j] * prior.excess(j);
            }
            r[a] = q - pPi;
            lambdaRhs[a] = tau / delta * (q - pPi / (1 + tau));
        }
        for (int a = 0; a < k; a++) {
            for (int e = 0; e <= a; e++) {
                // p_a'τΣp_e, symmetrised from both sides.
                double s = 0.5 * (Prior.dot(x[a], p[active.get(e)]) + Prior.dot(x[e], p[active.get(a)]));
                double om = a == e ? omega[active.get(a)] : 0;
                b[a][e] = s + om;
                b[e][a] = b[a][e];
                c[a][e] = s / (1 + tau) + om;
                c[e][a] = c[a][e];
            }
        }

        // Without views the mean keeps its prior uncertainty: M = τΣ (so that w* = w_prior/(1 + τ)).
        double[] mu = prior.excessReturns();
        double[][] m = new double[n][n];
        for (int i = 0; i < n; i++) {
            for (int j = 0; j < n; j++) {
                m[i][j] = tau * sigma[i][j];
            }
        }
        ViewSystem system = null;
        if (k > 0) {
            system = ViewSystem.of(b, activeNames);
            double[] y = system.solve(r);
            for (int a = 0; a < k; a++) {
                for (int j = 0; j < n; j++) {
                    mu[j] += x[a][j] * y[a];
                }
            }
            // M = τΣ − X'B⁻¹X, column by column of X (B⁻¹X solved per asset), then symmetrised.
            double[][] yx = new double[n][];
            for (int j = 0; j < n; j++) {
                double[] col = new double[k];
                for (int a = 0; a < k; a++) {
                    col[a] = x[a][j];
                }
                yx[j] = system.solve(col);
            }
            for (int i = 0; i < n; i++) {
                for (int j = 0; j <= i; j++) {
                    double s1 = 0;
                    double s2 = 0;
                    for (int a = 0; a < k; a++) {
                        s1 += x[a][i] * yx[j][a];
                        s2 += x[a][j] * yx[i][a];
                    }
                    double v = m[i][j] - 0.5 * (s1 + s2);
                    m[i][j] = v;
                    m[j][i] = v;
                }
            }
        }

        // The optimum and the view weights, when there is a risk aversion.
        double[] optimum = null;
        double[] priorOptimum = null;
        double[] lambda = new double[k];
        boolean lambdaUnique = true;
        if (!Double.isNaN(delta)) {
            double[][] post = new double[n][n];
            double[][] scaled = new double[n][n];
            for (int i = 0; i < n; i++) {
                for (int j = 0; j < n; j++) {
                    post[i][j] = delta * (sigma[i][j] + m[i][j]);
                    scaled[i][j] = delta * sigma[i][j];
                }
            }
            Cholesky postFactor = Cholesky.factor(post, 1);
            Cholesky priorFactor = Cholesky.factor(scaled, 1);
            if (postFactor == null || priorFactor == null) {
                throw new IllegalStateException("δΣ or δ(Σ + M) lost positive definiteness");
            }
            optimum = postFactor.solve(mu);
            priorOptimum = priorFactor.solve(prior.excessReturns());
            if (k > 0) {
                ViewSystem cs = ViewSystem.of(c, activeNames);
                lambda = cs.solve(lambdaRhs);
                lambdaUnique = cs.method() == ViewSystem.Method.CHOLESKY;
            }
        }

        // The table of views: implied total returns before and after.
        List<BlendedView> out = new ArrayList<>();
        for (int v = 0, a = 0; v < all; v++) {
            double before = prior.riskFree() * sum(p[v]);
            double after = before;
            for (int j = 0; j < n; j++) {
                before += p[v][j] * prior.excess(j);
                after += p[v][j] * mu[j];
            }
            double weight = Double.isNaN(delta) ? Double.NaN : dropped[v] ? 0 : lambda[a];
            double confidence = dropped[v] ? 0 : priorVariance[v] / (priorVariance[v] + omega[v]);
            out.add(new BlendedView(views.get(v), p[v], priorVariance[v], omega[v], confidence, before, after, weight,
                    dropped[v]));
            a += dropped[v] ? 0 : 1;
        }
        Posterior.Method method = system == null || system.method() == ViewSystem.Method.CHOLESKY
                ? Posterior.Method.CHOLESKY : Posterior.Method.EIGEN_PSEUDO_INVERSE;
        List<String> dependent = system == null ? List.of() : system.dependentViews();
        return new Posterior(prior, tau, out, mu, m, optimum, priorOptimum, method, dependent, lambdaUnique);
    }

    /** The view's excess return: {@code q − r_f·Σp} (a relative view's coefficients sum to 0). */
    static double excessViewReturn(View v, double riskFree) {
        return v.viewReturn() - riskFree * v.netExposure();
    }

    private static double[] vector(View view, Map<String, Integer> index, Prior prior) {
        double[] p = new double[prior.size()];
        for (Map.Entry<String, Double> e : view.portfolio().entrySet()) {
            Integer i = index.get(e.getKey());
            if (i == null) {
                throw View.error(view.name(), "names an asset that is not among the assets").key("portfolio")
                        .asset(e.getKey()).fix("use one of the assets of the covariance table: "
                                + list(prior.assets())).build();
            }
            p[i] += e.getValue();
        }
        return p;
    }

    private static String list(List<String> assets) {
        int shown = Math.min(assets.size(), 12);
        String head = String.join(", ", assets.subList(0, shown));
        return shown < assets.size() ? head + ", ... (" + assets.size() + " assets)" : head;
    }

    private static double sum(double[] a) {
        double s = 0;
        for (double v : a) {
            s += v;
        }
        return s;
    }
}

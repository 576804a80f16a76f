package org.isorisk.engine.solve;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.concurrent.ConcurrentHashMap;
import org.isorisk.engine.error.NoSolutionException;
import org.isorisk.engine.linalg.Cholesky;
import org.isorisk.engine.linalg.Definiteness;
import org.isorisk.engine.linalg.Spectrum;
import org.isorisk.engine.model.AssetUniverse;
import org.isorisk.engine.model.Mandate;
import org.isorisk.engine.model.SolverSettings;

/**
 * An asset universe with its covariance factored once, so that many closed-form solves (a frontier sweep,
 * several constraint sets) share one O(n³) factorisation. Solutions {@code Σ⁻¹a} of constraint gradients are
 * remembered (a sweep over return targets reuses Σ⁻¹1 and Σ⁻¹μ for every point). Safe to share between threads.
 */
public final class Factored {
    /** Most remembered solves; past it the memory starts afresh (sweeps use two or three gradients). */
    private static final int MEMO_LIMIT = 64;

    private final AssetUniverse universe;
    private final Cholesky chol;
    private volatile Spectrum spectrum;
    /** The spectrum being estimated on another thread ({@link #ofOverlapped}); null once known or when none. */
    private final java.util.concurrent.FutureTask<Spectrum> pending;
    /** The last product {@code {w, Σw}}, so that the certificate of the same weights does not compute it twice. */
    private volatile double[][] lastProduct;
    private final Map<Key, double[]> memo = new ConcurrentHashMap<>();
    /**
     * Critical-line sweeps kept for the mandates this prepared universe solves more than once (by identity: a book's
     * rows that share a policy share its mandate object), or the error their checks gave; shared by the
     * {@link #fresh()} copies.
     */
    private final Map<Object, Object> sweeps;

    /** Most mandates whose sweeps are kept; past it the memory starts afresh. */
    static final int SWEEP_LIMIT = 256;

    private Factored(AssetUniverse universe, Cholesky chol, Spectrum spectrum,
                     java.util.concurrent.FutureTask<Spectrum> pending) {
        this(universe, chol, spectrum, pending, new ConcurrentHashMap<>());
    }

    private Factored(AssetUniverse universe, Cholesky chol, Spectrum spectrum,
                     java.util.concurrent.FutureTask<Spectrum> pending, Map<Object, Object> sweeps) {
        this.sweeps = sweeps;
        this.universe = universe;
        this.pending = pending;
        this.chol = chol;
        this.spectrum = spectrum;
    }

    /**
     * Factors the universe's covariance with the default settings (all processors).
     *
     * @throws NoSolutionException (NOT_CONVEX) when Σ is not positive definite or singular to working precision,
     *                             naming the smallest eigenvalue and, when there is one, a pair of perfectly
     *                             correlated assets
     */
    public static Factored of(AssetUniverse u) {
        return of(u, SolverSettings.defaults());
    }

    /**
     * Factors the universe's covariance using {@link SolverSettings#threads()} threads.
     *
     * @throws NoSolutionException (NOT_CONVEX) as {@link #of(AssetUniverse)}
     */
    public static Factored of(AssetUniverse u, SolverSettings settings) {
        // Only the lower triangle is copied, and factored in place; products with Σ read the universe's own rows.
        double[][] rows = u.covarianceLowerRows();
        if (!Cholesky.factorRowsInPlace(rows, settings.threads())) {
            double[][] sigma = u.covariance();
            throw notPositiveDefinite(u, sigma, Spectrum.of(sigma, null));
        }
        Cholesky chol = Cholesky.ofRows(rows);
        Spectrum sp = u.size() <= Spectrum.EXACT_LIMIT ? Spectrum.exact(u.covariance())
                : Spectrum.ofFactor(chol, Spectrum.CONDITION_ACCURACY);
        return new Factored(u, chol, checked(u, sp), null);
    }

    /**
     * As {@link #of(AssetUniverse, SolverSettings)}, but with two or more threads the condition estimate runs on
     * another thread while the caller solves with the factor; {@link #spectrum()} waits for it, and it is there,
     * not here, that a Σ singular to working precision is refused (NOT_CONVEX). For the closed form when nothing
     * binds, whose solve and products overlap the estimate.
     */
    static Factored ofOverlapped(AssetUniverse u, SolverSettings settings) {
        if (settings.threads() < 2 || u.size() <= Spectrum.EXACT_LIMIT) {
            return of(u, settings);
        }
        double[][] rows = u.covarianceLowerRows();
        if (!Cholesky.factorRowsInPlace(rows, settings.threads())) {
            double[][] sigma = u.covariance();
            throw notPositiveDefinite(u, sigma, Spectrum.of(sigma, null));
        }
        Cholesky chol = Cholesky.ofRows(rows);
        java.util.concurrent.FutureTask<Spectrum> task = new java.util.concurrent.FutureTask<>(
                () -> Spectrum.ofFactor(chol, Spectrum.CONDITION_ACCURACY));
        Thread t = new Thread(task, "isorisk-condition-estimate");
        t.setDaemon(true);
        t.start();
        return new Factored(u, chol, null, task);
    }

    /**
     * The same factor and spectrum with an empty memory of solves, for one solve of a book of portfolios that
     * shares this factorisation: every {@code Σ⁻¹a} is then computed exactly as a freshly factored universe
     * computes it (several right-hand sides are solved together, as a fresh solve would), so a solve through
     * {@link Allocator#solveWith} gives bit for bit the answer of {@link Allocator#solve}. Waits for a pending
     * condition estimate.
     */
    Factored fresh() {
        return new Factored(universe, chol, spectrum(), null, sweeps);
    }

    /** The key of a mandate's sweep: the mandate object itself (identity) and the settings (by value). */
    private record SweepKey(Mandate mandate, SolverSettings settings) {
        @Override
        public boolean equals(Object o) {
            return o instanceof SweepKey k && k.mandate == mandate && k.settings.equals(settings);
        }

        @Override
        public int hashCode() {
            return System.identityHashCode(mandate) * 31 + settings.hashCode();
        }
    }

    /**
     * The sweep kept for {@code m} (see {@link MandateSweep#shared()}), made on the second solve with the same
     * mandate object; null on the first (a mandate seen once is solved as usual, with a walk that stops at its
     * target). A check of the mandate that failed is rethrown, the same error every time.
     */
    MandateSweep sharedSweep(Mandate m, SolverSettings settings, java.util.function.Supplier<MandateSweep> make) {
        SweepKey key = new SweepKey(m, settings);
        Object o = sweeps.get(key);
        if (o == null) {
            if (sweeps.size() >= SWEEP_LIMIT) {
                sweeps.clear();
            }
            sweeps.putIfAbsent(key, Boolean.FALSE); // seen once
            return null;
        }
        if (o == Boolean.FALSE) {
            Object made;
            try {
                made = make.get().shared();
            } catch (RuntimeException e) {
                made = e;
            }
            sweeps.put(key, made);
            o = made;
        }
        if (o instanceof RuntimeException e) {
            throw e;
        }
        return (MandateSweep) o;
    }

    private static Spectrum checked(AssetUniverse u, Spectrum sp) {
        if (!Definiteness.positiveDefinite(sp, Definiteness.SINGULAR)) {
            throw notPositiveDefinite(u, u.covariance(), sp);
        }
        return sp;
    }

    static NoSolutionException notPositiveDefinite(AssetUniverse u, double[][] sigma, Spectrum sp) {
        int n = sigma.length;
        List<String> involved = new ArrayList<>();
        String pair = "";
        Definiteness.Pair p = Definiteness.perfectlyCorrelatedPair(sigma);
        if (p != null) {
            String x = u.assets().get(p.first());
            String y = u.assets().get(p.second());
            involved.add(x);
            involved.add(y);
            pair = String.format(Locale.ROOT, p.outsideRange()
                            ? "; assets '%s' and '%s' have correlation %.6f, outside [-1, 1]"
                            : "; assets '%s' and '%s' are perfectly correlated (%.6f)", x, y, p.correlation());
        }
        for (int i = 0; i < n && pair.isEmpty(); i++) {
            if (!(sigma[i][i] > 0)) {
                involved.add(u.assets().get(i));
                pair = String.format(Locale.ROOT, "; asset '%s' has variance %s", u.assets().get(i), sigma[i][i]);
            }
        }
        String smallest = Math.abs(sp.smallest()) <= Definiteness.SINGULAR * Math.abs(sp.largest())
                ? "smallest eigenvalue 0 to working precision: singular"
                : String.format(Locale.ROOT, "smallest eigenvalue %.6g", sp.smallest());
        String msg = String.format(Locale.ROOT,
                "the covariance matrix is not positive definite (%s)%s, so the minimum-variance "
                        + "portfolio is not unique; fix: remove one of a perfectly correlated pair, or repair the "
                        + "matrix to the nearest valid one (isorisk check --repair)", smallest, pair);
        return new NoSolutionException(NoSolutionException.Reason.NOT_CONVEX, msg, involved);
    }

    public AssetUniverse universe() {
        return universe;
    }

    /**
     * {@code Σw} from the universe's covariance, not copied ({@code w} not modified); the last product is
     * remembered, so that the certificate of the same weights does not compute it again.
     */
    double[] sigmaTimes(double[] w) {
        double[][] last = lastProduct;
        if (last != null && Arrays.equals(last[0], w)) {
            return last[1].clone();
        }
        double[] sw = universe.covarianceTimes(w);
        lastProduct = new double[][] {w.clone(), sw.clone()};
        return sw;
    }

    public Cholesky cholesky() {
        return chol;
    }

    /**
     * Extreme eigenvalues of Σ: exact up to {@link Spectrum#EXACT_LIMIT} assets, above it the Lanczos estimate
     * to {@link Spectrum#CONDITION_ACCURACY} (each to about 1 %, inside the spectrum), which is what the
     * certificate's condition number and the singularity check need.
     */
    public Spectrum spectrum() {
        Spectrum sp = spectrum;
        if (sp != null) {
            return sp;
        }
        try {
            sp = pending.get();
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            throw new IllegalStateException("interrupted while estimating the condition number", e);
        } catch (java.util.concurrent.ExecutionException e) {
            throw new IllegalStateException("the condition estimate failed", e.getCause());
        }
        sp = checked(universe, sp);
        spectrum = sp;
        return sp;
    }

    /** Solves {@code Σ x = b}; {@code b} is not modified. */
    public double[] solve(double[] b) {
        return chol.solve(b);
    }

    /** Solves {@code Σ X = B} for several right-hand sides, reading the factor once per group of four. */
    public double[][] solve(double[][] b) {
        return chol.solve(b);
    }

    /**
     * {@code Σ⁻¹a} for each gradient, from memory when the same gradient was solved before; the returned
     * arrays are shared and must not be modified.
     */
    double[][] solveRemembered(List<double[]> gradients) {
        int k = gradients.size();
        double[][] out = new double[k][];
        List<Integer> missing = new ArrayList<>();
        for (int r = 0; r < k; r++) {
            out[r] = memo.get(new Key(gradients.get(r)));
            if (out[r] == null) {
                missing.add(r);
            }
        }
        if (!missing.isEmpty()) {
            double[][] rhs = new double[missing.size()][];
            for (int i = 0; i < rhs.length; i++) {
                rhs[i] = gradients.get(missing.get(i));
            }
            double[][] x = chol.solve(rhs);
            if (memo.size() + x.length > MEMO_LIMIT) {
                memo.clear();
            }
            for (int i = 0; i < x.length; i++) {
                out[missing.get(i)] = x[i];
                memo.put(new Key(rhs[i].clone()), x[i]);
            }
        }
        return out;
    }

    /** A gradient compared by value. */
    private static final class Key {
        private final double[] a;
        private final int hash;

        Key(double[] a) {
            this.a = a;
            this.hash = Arrays.hashCode(a);
        }

        @Override
        public boolean equals(Object o) {
            return o instanceof Key k && k.hash == hash && Arrays.equals(k.a, a);
        }

        @Override
        public int hashCode() {
            return hash;
        }
    }
}

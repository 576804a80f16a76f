package org.isorisk.engine.rebalance;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Locale;
import java.util.Optional;
import org.isorisk.engine.error.NoSolutionException;
import org.isorisk.engine.linalg.Spectrum;
import org.isorisk.engine.model.AssetUniverse;
import org.isorisk.engine.model.Certificate;
import org.isorisk.engine.model.LinearConstraint;
import org.isorisk.engine.model.Mandate;
import org.isorisk.engine.model.Method;
import org.isorisk.engine.model.Multiplier;
import org.isorisk.engine.model.Solution;
import org.isorisk.engine.risk.RiskAnalysis;
import org.isorisk.engine.risk.RiskDecomposition;
import org.isorisk.engine.solve.Kkt;

/**
 * The front door for rebalancing: today's holdings to a proposal under the mandate and the trading limits.
 *
 * <p>Formulation: split buy/sell variables {@code w = w0 + b − s, b, s ≥ 0}; turnover {@code 1'(b + s) ≤ τ}
 * (two-way); per-asset limits {@code b_i, s_i ≤ T_i}; costs deducted from the return the target must reach,
 * {@code μ'w − c'(b + s) ≥ m}; assets on the no-trade list or frozen by the minimum-trade rule have
 * {@code b_i = s_i = 0}. w is eliminated ({@link Lifted}); the objective has a positive semi-definite, singular
 * Hessian in (b, s). The certificate is the KKT certificate of this lifted problem without any regularisation,
 * which is the original problem: turnover {@code Σ|w − w0|} and costs are exactly {@code 1'(b + s)} and
 * {@code c'(b + s)} once idle round trips are netted out.
 */
public final class Rebalancer {
    private Rebalancer() {
    }

    /** Trades smaller than this (1e-9 of the fund) are round-off, not trades. */
    public static final double ZERO_TRADE = 1e-9;
    /** A limit counts as binding when its slack is at most this (1e-8). */
    public static final double BINDING = 1e-8;
    /** Step used in the turnover sentence: 1 % more turnover (decimal 0.01). */
    public static final double TURNOVER_STEP = 0.01;
    /** Grid of the nearest-portfolio scan (targets along the efficient branch); 21, common practice, no source. */
    static final int NEAREST_GRID = 21;

    /**
     * Computes a proposal.
     *
     * @throws NoSolutionException when the limits contradict each other, the target cannot be reached within
     *                             them, or curing today's breaches needs more turnover than allowed
     */
    public static RebalanceResult rebalance(RebalanceRequest r) {
        return new Run(r, new SessionLiftedSolver(r.settings())).run();
    }

    /**
     * {@link #rebalance(RebalanceRequest)} on a universe factored beforehand for many requests (a book of
     * portfolios): bit for bit the same result. The certificate's spectrum of Σ is the prepared one where it is the
     * very value a lone rebalance computes (the exact decomposition, up to
     * {@link org.isorisk.engine.linalg.Spectrum#EXACT_LIMIT} assets); above that it is computed as before.
     *
     * @param prepared {@code Allocator.prepare(r.universe(), ...)} (not modified)
     * @throws IllegalArgumentException when {@code prepared} was made for another universe object
     */
    public static RebalanceResult rebalance(RebalanceRequest r, org.isorisk.engine.solve.Factored prepared) {
        if (prepared.universe() != r.universe()) {
            throw new IllegalArgumentException("the prepared factor belongs to another universe");
        }
        Run run = new Run(r, new SessionLiftedSolver(r.settings()));
        run.prepared = prepared;
        return run.run();
    }

    /**
     * The limits of the mandate that today's holdings break, each in a sentence without a cure (e.g. when no move
     * within the trading limits reaches the target and there is no trade list): the same test and wording as the
     * breaches of a {@link RebalanceResult}.
     *
     * @param current today's weights in the universe's order (not modified), summing to the budget
     */
    public static List<Breach> breaches(AssetUniverse u, Mandate m, double[] current) {
        if (current.length != u.size()) {
            throw new IllegalArgumentException("the holdings must cover the universe's " + u.size() + " assets");
        }
        return Breaches.find(u, m, current.clone(), null, null);
    }

    /** One rebalance: the state of the minimum-trade rule and the objective searches. */
    static final class Run {
        final RebalanceRequest req;
        final AssetUniverse u;
        final Mandate m;
        final TradingLimits lim;
        final LiftedSolver solver;
        final int n;
        final double[] w0;
        final double[] mu;
        final List<String> notes = new ArrayList<>();
        int solves;
        QpPoint warm;
        /** The universe factored once for many rebalances, or null. */
        org.isorisk.engine.solve.Factored prepared;

        Run(RebalanceRequest req, LiftedSolver solver) {
            this.req = req;
            this.u = req.universe();
            this.m = req.mandate();
            this.lim = req.limits();
            this.solver = solver;
            this.n = u.size();
            this.w0 = req.holdings().alignedTo(u, m.budget());
            this.mu = u.expectedReturns();
        }

        RebalanceResult run() {
            double held = 0;
            for (double v : req.holdings().weights()) {
                held += v;
            }
            // Market values divided by their total add up to the budget only to rounding (1e-16); a note that would
            // print the same number twice ("1.000000 ... 1.000000") says nothing, so only a visible difference is told.
            if (Math.abs(held - m.budget()) >= 5e-7) {
                notes.add(String.format(Locale.ROOT, "The holding weights add up to %.6f; they were rescaled to the "
                        + "budget %.6f (rounding).", held, m.budget()));
            }
            notes.add(RebalanceResult.TURNOVER_CONVENTION);
            if (lim.hasCosts()) {
                notes.add(RebalanceResult.COST_CONVENTION);
            }
            boolean[] frozen = new boolean[n];
            String[] why = new String[n];
            for (int i : lim.noTrade()) {
                frozen[i] = true;
                why[i] = "no-trade";
            }
            int rounds = 0;
            Solved s;
            while (true) {
                rounds++;
                try {
                    s = solveObjective(frozen);
                } catch (NoSolutionException e) {
                    if (rounds == 1) {
                        throw e;
                    }
                    List<String> dropped = new ArrayList<>();
                    for (int i = 0; i < n; i++) {
                        if ("min-trade".equals(why[i])) {
                            dropped.add(u.assets().get(i));
                        }
                    }
                    throw new NoSolutionException(e.reason(), "after dropping the trades below the minimum trade size "
                            + Breaches.pct(lim.minTrade()) + " (" + String.join(", ", dropped) + ") the problem has "
                            + "no solution: " + e.getMessage() + "; fix: lower the minimum trade size", dropped);
                }
                if (lim.minTrade() <= 0) {
                    break;
                }
                boolean more = false;
                double[] w = s.p.weights(s.x);
                for (int i = 0; i < n; i++) {
                    double d = Math.abs(w[i] - w0[i]);
                    if (!frozen[i] && d > ZERO_TRADE && d < lim.minTrade()) {
                        frozen[i] = true;
                        why[i] = "min-trade";
                        more = true;
                    }
                }
                if (!more) {
                    break;
                }
            }
            if (rounds > 1) {
                notes.add(String.format(Locale.ROOT, "Minimum trade size %s: trades below it were dropped and the "
                        + "problem re-solved with those assets frozen at today's weight (%d solves of the rule).",
                        Breaches.pct(lim.minTrade()), rounds));
            }
            return assemble(s, why, rounds);
        }

        /** A solved lifted problem, netted. */
        record Solved(Lifted p, double[] x, QpPoint prices) {
        }

        Solved solve(boolean[] frozen, Double target) {
            Lifted p = new Lifted(u, m, w0, lim, frozen, target);
            if (p.emptyBox()) {
                throw emptyBox(p);
            }
            QpPoint pt;
            try {
                pt = solver.solve(p, warm);
            } catch (NoSolutionException e) {
                throw diagnose(p, frozen, target, e);
            }
            solves++;
            warm = pt;
            return new Solved(p, p.net(pt.x()), pt);
        }

        Solved solveObjective(boolean[] frozen) {
            RebalanceObjective o = req.objective();
            if (o instanceof RebalanceObjective.TargetReturn t) {
                return solve(frozen, t.target());
            }
            if (o instanceof RebalanceObjective.SameRisk) {
                return sameRisk(frozen);
            }
            return nearest(frozen);
        }

        double variance(double[] w) {
            double v = 0;
            for (int i = 0; i < n; i++) {
                double s = 0;
                for (int j = 0; j < n; j++) {
                    s += u.covariance(i, j) * w[j];
                }
                v += w[i] * s;
            }
            return v;
        }

        double netReturn(double[] y, Lifted p) {
            return p.netReturn(y);
        }

        /** Highest net return reachable within mandate and limits (LP). */
        double maxNetReturn(boolean[] frozen) {
            Lifted p = new Lifted(u, m, w0, lim, frozen, null);
            if (p.emptyBox()) {
                throw emptyBox(p);
            }
            return SessionLiftedSolver.maxNetReturn(p);
        }

        Solved sameRisk(boolean[] frozen) {
            double v0 = variance(w0);
            double sigma0 = Math.sqrt(v0);
            Solved low = solve(frozen, null);
            double vLow = variance(low.p.weights(low.x));
            if (vLow >= v0) {
                notes.add(String.format(Locale.ROOT, "No portfolio within the policy and the trading limits is less risky "
                        + "than today's (lowest reachable volatility %s, today %s): the proposal is the lowest-risk one.",
                        Breaches.pct(Math.sqrt(vLow)), Breaches.pct(sigma0)));
                return low;
            }
            double mLo = netReturn(low.x, low.p);
            double mHi = maxNetReturn(frozen);
            if (mHi <= mLo) {
                return low;
            }
            if (Double.isInfinite(mHi)) {
                // No limit caps the return: the minimum variance grows without bound along the target, so double
                // the span until it passes today's; that end brackets the answer.
                double step = Math.max(0.01, 0.1 * Math.abs(mLo));
                for (int k = 0; k < 60; k++) {
                    Solved s = solve(frozen, mLo + step);
                    if (variance(s.p.weights(s.x)) >= v0) {
                        break;
                    }
                    step *= 2;
                }
                mHi = mLo + step;
            }
            Solved hi = solve(frozen, mHi);
            double vHi = variance(hi.p.weights(hi.x));
            if (vHi <= v0) {
                notes.add("Same risk: even the highest return reachable within the limits stays within today's "
                        + "volatility, so the proposal is that highest-return portfolio.");
                return hi;
            }
            Solved loS = low;
            double m0 = mHi;
            Solved cur = hi;
            double vCur = vHi;
            int it = 0;
            while (it++ < 200) {
                if (Math.abs(Math.sqrt(vCur) - sigma0) <= 1e-11 * Math.max(1, sigma0)) {
                    break;
                }
                double slope = cur.prices.rowPrices()[cur.p.targetRow];
                double next = slope > 0 ? m0 - (vCur - v0) / slope : Double.NaN;
                if (!(next > mLo && next < mHi)) {
                    next = 0.5 * (mLo + mHi);
                }
                Solved s = solve(frozen, next);
                double v = variance(s.p.weights(s.x));
                if (v > v0) {
                    mHi = next;
                } else {
                    mLo = next;
                    loS = s;
                }
                m0 = next;
                cur = s;
                vCur = v;
                if (mHi - mLo <= 1e-14 * Math.max(1, Math.abs(m0))) {
                    cur = loS;
                    vCur = variance(loS.p.weights(loS.x));
                    break;
                }
            }
            notes.add(String.format(Locale.ROOT, "Same risk: the highest return after costs at today's volatility %s, "
                    + "found by a safeguarded Newton iteration on the minimum variance V*(m) = σ0² along the return "
                    + "target, using the target's shadow price as the slope (%d solves in all).", Breaches.pct(sigma0),
                    solves));
            return cur;
        }

        Solved nearest(boolean[] frozen) {
            Solved low = solve(frozen, null);
            double mLo = netReturn(low.x, low.p);
            double mHi = maxNetReturn(frozen);
            if (!(mHi > mLo + 1e-12)) {
                notes.add("Nearest: the efficient branch is a single point within the limits.");
                return low;
            }
            if (Double.isInfinite(mHi)) {
                // No limit caps the return (short positions allowed): along the branch the weights grow without
                // bound, so the tracking error does too; double the span until it rises, which brackets the nearest.
                double step = Math.max(0.01, 0.1 * Math.abs(mLo));
                double teLow = trackingError(low.p.weights(low.x));
                double prev = teLow;
                double end = mLo + step;
                for (int k = 0; k < 60; k++) {
                    Solved s = solve(frozen, end);
                    double te = trackingError(s.p.weights(s.x));
                    if (te > prev && te > teLow) {
                        break;
                    }
                    prev = te;
                    step *= 2;
                    end = mLo + step;
                }
                mHi = end;
                notes.add(String.format(Locale.ROOT, "Nearest: no limit caps the return, so the search ran over targets "
                        + "up to %s, beyond which the tracking error against today's only grows.", Breaches.pct(mHi)));
            }
            double[] t = new double[NEAREST_GRID];
            double[] te = new double[NEAREST_GRID];
            Solved best = null;
            double bestTe = Double.POSITIVE_INFINITY;
            int bestK = 0;
            for (int k = 0; k < NEAREST_GRID; k++) {
                t[k] = mLo + (mHi - mLo) * k / (NEAREST_GRID - 1);
                Solved s = k == 0 ? low : solve(frozen, t[k]);
                te[k] = trackingError(s.p.weights(s.x));
                if (te[k] < bestTe) {
                    bestTe = te[k];
                    best = s;
                    bestK = k;
                }
            }
            double a = t[Math.max(0, bestK - 1)];
            double b = t[Math.min(NEAREST_GRID - 1, bestK + 1)];
            double g = (Math.sqrt(5) - 1) / 2;
            double c = b - g * (b - a);
            double d = a + g * (b - a);
            Solved sc = solve(frozen, c);
            Solved sd = solve(frozen, d);
            double fc = trackingError(sc.p.weights(sc.x));
            double fd = trackingError(sd.p.weights(sd.x));
            while (b - a > 1e-9 * Math.max(1e-6, mHi - mLo)) {
                if (fc < fd) {
                    b = d;
                    d = c;
                    sd = sc;
                    fd = fc;
                    c = b - g * (b - a);
                    sc = solve(frozen, c);
                    fc = trackingError(sc.p.weights(sc.x));
                } else {
                    a = c;
                    c = d;
                    sc = sd;
                    fc = fd;
                    d = a + g * (b - a);
                    sd = solve(frozen, d);
                    fd = trackingError(sd.p.weights(sd.x));
                }
            }
            if (fc < bestTe) {
                bestTe = fc;
                best = sc;
            }
            if (fd < bestTe) {
                bestTe = fd;
                best = sd;
            }
            notes.add(String.format(Locale.ROOT, "Nearest: the efficient portfolio (minimum risk for its return after "
                    + "costs, within the policy and the trading limits) with the smallest tracking error against "
                    + "today's, %s; found by scanning %d targets from %s to %s and a golden-section refinement "
                    + "(%d solves in all).", Breaches.pct(bestTe), NEAREST_GRID, Breaches.pct(mLo), Breaches.pct(mHi),
                    solves));
            return best;
        }

        double trackingError(double[] w) {
            return RiskAnalysis.trackingError(u, w, w0).value();
        }

        RiskDecomposition decomposeOrNull(double[] w) {
            try {
                return RiskAnalysis.decompose(u, w);
            } catch (org.isorisk.engine.error.InputException zeroRisk) {
                return null;
            }
        }

        /** A breached bound that the trade limit or the no-trade list does not let the proposal cure. */
        NoSolutionException emptyBox(Lifted p) {
            for (int i = 0; i < n; i++) {
                double need = Math.max(p.lower[i], -p.upper[n + i]);
                boolean buy = p.lower[i] > 0;
                if (p.lower[i] > p.upper[i] || p.lower[n + i] > p.upper[n + i]) {
                    String a = u.assets().get(i);
                    String what = lim.noTrade().contains(i) ? "it is on the no-trade list"
                            : "its trade limit is " + Breaches.pct(lim.maxTrade(i));
                    return new NoSolutionException(NoSolutionException.Reason.INFEASIBLE, String.format(Locale.ROOT,
                            "%s is %s its %s today and needs a %s of at least %s to comply, but %s; fix: allow the "
                                    + "trade (raise its trade limit or take it off the no-trade list)", a,
                            buy ? "below" : "above", buy ? "minimum" : "maximum", buy ? "purchase" : "sale",
                            Breaches.pct(need), what), List.of((buy ? "lower:" : "upper:") + a));
                }
            }
            throw new IllegalStateException("no empty box");
        }

        /** Turns an infeasible lifted problem into a message that says which limit is in the way. */
        NoSolutionException diagnose(Lifted p, boolean[] frozen, Double target, NoSolutionException e) {
            if (e.reason() != NoSolutionException.Reason.INFEASIBLE) {
                return e;
            }
            // 1. Can the mandate be met at all within the per-asset limits, and with how much turnover?
            Lifted free = new Lifted(u, m, w0, lim.withMaxTurnover(Double.POSITIVE_INFINITY), frozen, null);
            if (free.emptyBox()) {
                return emptyBox(free);
            }
            double need;
            try {
                need = SessionLiftedSolver.minTurnover(free);
            } catch (NoSolutionException none) {
                return new NoSolutionException(NoSolutionException.Reason.INFEASIBLE, "no portfolio meets the policy "
                        + "within the per-asset trade limits and the no-trade list, whatever the turnover; fix: loosen "
                        + "the per-asset trade limits or the no-trade list, or check the policy's bounds and groups",
                        List.of("trade_limits", "no_trade"));
            }
            if (need > lim.maxTurnover() + 1e-9) {
                return new NoSolutionException(NoSolutionException.Reason.INFEASIBLE, String.format(Locale.ROOT,
                        "meeting the policy needs a turnover of at least %s, above the turnover limit %s (today's "
                                + "holdings break the policy); fix: raise turnover.max (or --max-turnover) to at least %s",
                        Breaches.pct(need), Breaches.pct(lim.maxTurnover()), Breaches.pct(need)), List.of("turnover"));
            }
            if (target != null) {
                double best = maxNetReturn(frozen);
                if (target > best) {
                    return new NoSolutionException(NoSolutionException.Reason.INFEASIBLE, String.format(Locale.ROOT,
                            "the return target %s is above the highest expected return after costs reachable within "
                                    + "the policy and the trading limits, %s; fix: lower --target-return to at most %s "
                                    + "or raise the turnover limit", Breaches.pct(target), Breaches.pct(best),
                            Breaches.pct(best)), List.of("target_return", "turnover"));
                }
            }
            return e;
        }

        RebalanceResult assemble(Solved s, String[] why, int rounds) {
            Lifted p = s.p;
            double[] x = s.x;
            QpPoint pr = s.prices;
            double[] w = p.weights(x);
            double var = variance(w);
            double vol = Math.sqrt(Math.max(0, var));
            double ret = 0;
            for (int i = 0; i < n; i++) {
                ret += mu[i] * w[i];
            }
            double ret0 = 0;
            for (int i = 0; i < n; i++) {
                ret0 += mu[i] * w0[i];
            }
            double size = req.holdings().fundSize();
            List<Trade> trades = new ArrayList<>();
            double buys = 0;
            double sells = 0;
            double cost = 0;
            for (int i = 0; i < n; i++) {
                double d = w[i] - w0[i];
                if (Math.abs(d) <= ZERO_TRADE) {
                    d = 0;
                }
                double ci = lim.cost(i) * Math.abs(d);
                cost += ci;
                if (d > 0) {
                    buys += d;
                } else {
                    sells -= d;
                }
                Trade.Side side = d > 0 ? Trade.Side.BUY : d < 0 ? Trade.Side.SELL : Trade.Side.HOLD;
                trades.add(new Trade(u.assets().get(i), w0[i], w0[i] + d, d, d * size, ci, side, why[i]));
            }
            double turnover = buys + sells;
            Spectrum sp;
            if (prepared != null && n <= Spectrum.EXACT_LIMIT) {
                sp = prepared.spectrum(); // Spectrum.exact of the same Σ, as computed below
            } else {
                double[][] sigma = u.covariance();
                org.isorisk.engine.linalg.Cholesky ch = org.isorisk.engine.linalg.Cholesky.factor(sigma);
                sp = ch == null ? Spectrum.of(sigma) : Spectrum.of(sigma, ch);
            }
            Certificate cert = Kkt.certify(p.hessian(), x, p.rows, pr.rowPrices(), p.lower, p.upper,
                    pr.lowerPrices(), pr.upperPrices(), sp.conditionNumber(), req.settings().numericalTolerance(),
                    sp.smallest() >= -1e-12 * Math.max(1, sp.largest()));
            List<Multiplier> mult = multipliers(p, x, pr, vol, why);
            Optional<Multiplier> tp = mult.stream().filter(q -> q.constraint().equals("turnover")).findFirst();
            List<Multiplier> binding = mult.stream().filter(Multiplier::binding).toList();
            List<String> sentences = sentences(mult, tp, turnover, p, pr);
            List<String> frozenMin = new ArrayList<>();
            for (int i = 0; i < n; i++) {
                if ("min-trade".equals(why[i])) {
                    frozenMin.add(u.assets().get(i));
                }
            }
            List<String> solNotes = new ArrayList<>(notes);
            solNotes.add("The covariance matrix is positive semi-definite, so the problem is convex: the KKT "
                    + "(first-order) conditions, checked by the certificate, are sufficient and the minimum is global.");
            Solution sol = new Solution(Method.NUMERICAL, u.assets(), w, ret, var, vol, mult, cert, solNotes);
            List<Breach> breaches = Breaches.find(u, m, w0, w, trades);
            return new RebalanceResult(req.objective().label(), sol, w0, trades, breaches, turnover, buys, sells, cost,
                    cost * size, ret0, Math.sqrt(Math.max(0, variance(w0))), ret, ret - cost, vol, trackingError(w),
                    decomposeOrNull(w0), decomposeOrNull(w), RiskAnalysis.trackingError(u, w, w0), tp, binding,
                    sentences, frozenMin, rounds, solNotes);
        }

        /**
         * The multipliers of the original limits from those of the lifted problem: rows map one to one; a bound of
         * a buy or sell variable is the asset's bound, its trade limit or its freeze, whichever gave it.
         */
        List<Multiplier> multipliers(Lifted p, double[] y, QpPoint pr, double vol, String[] why) {
            List<Multiplier> out = new ArrayList<>();
            double[] rp = pr.rowPrices();
            double[] lp = pr.lowerPrices();
            double[] up = pr.upperPrices();
            double[] w = p.weights(y);
            for (int k = 0; k < p.mandateRows; k++) {
                out.add(row(p.rows.get(k), y, rp[k], vol));
            }
            for (var e : m.fixed().entrySet()) {
                int i = e.getKey();
                // w_i = f: both bounds of b_i and s'_i are tight; ∂V*/∂f is the sum of the active bounds' prices
                double price = lp[i] + up[i] + lp[n + i] + up[n + i];
                out.add(mult("fixed:" + u.assets().get(i), price, vol, true));
            }
            for (int i = 0; i < n; i++) {
                if (m.fixed().containsKey(i)) {
                    continue;
                }
                String a = u.assets().get(i);
                int k = n + i;
                if (Double.isFinite(m.lower(i))) {
                    double price = 0;
                    if (p.lowerSource[i] == Lifted.Source.ASSET_LOWER) {
                        price += lp[i];
                    }
                    if (p.lowerSource[k] == Lifted.Source.ASSET_LOWER) {
                        price += lp[k];
                    }
                    out.add(mult("lower:" + a, price, vol, w[i] - m.lower(i) <= BINDING));
                }
                if (Double.isFinite(m.upper(i))) {
                    double price = 0;
                    if (p.upperSource[i] == Lifted.Source.ASSET_UPPER) {
                        price += up[i];
                    }
                    if (p.upperSource[k] == Lifted.Source.ASSET_UPPER) {
                        price += up[k];
                    }
                    out.add(mult("upper:" + a, price, vol, m.upper(i) - w[i] <= BINDING));
                }
            }
            if (p.turnoverRow >= 0) {
                out.add(row(p.rows.get(p.turnoverRow), y, rp[p.turnoverRow], vol));
            }
            if (p.targetRow >= 0) {
                out.add(row(p.rows.get(p.targetRow), y, rp[p.targetRow], vol));
            }
            for (int i = 0; i < n; i++) {
                String a = u.assets().get(i);
                int k = n + i;
                // ∂V*/∂T: T is the upper bound of b_i and minus the lower bound of s'_i
                double buyPrice = p.upperSource[i] == Lifted.Source.TRADE_LIMIT
                        || p.upperSource[i] == Lifted.Source.FROZEN ? up[i] : 0;
                double sellPrice = p.lowerSource[k] == Lifted.Source.TRADE_LIMIT
                        || p.lowerSource[k] == Lifted.Source.FROZEN ? -lp[k] : 0;
                if (why[i] != null) {
                    // the price of the more useful direction: ∂V* per unit of trade allowed that way
                    out.add(mult(why[i].replace('-', '_') + ":" + a, Math.min(buyPrice, sellPrice), vol, true));
                } else if (Double.isFinite(lim.maxTrade(i))) {
                    boolean bind = (p.upperSource[i] == Lifted.Source.TRADE_LIMIT && p.upper[i] - y[i] <= BINDING)
                            || (p.lowerSource[k] == Lifted.Source.TRADE_LIMIT && y[k] - p.lower[k] <= BINDING);
                    out.add(mult("trade_limit:" + a, buyPrice + sellPrice, vol, bind));
                }
            }
            return out;
        }

        static Multiplier row(LinearConstraint c, double[] x, double price, double vol) {
            double slack = Math.abs(c.evaluate(x) - c.limit());
            boolean binding = c.relation() == org.isorisk.engine.model.Relation.EQUAL || slack <= BINDING;
            return mult(c.name(), price, vol, binding);
        }

        static Multiplier mult(String name, double price, double vol, boolean binding) {
            double v = binding ? price : 0;
            return new Multiplier(name, v, vol > 0 ? v / (2 * vol) : Double.NaN, binding);
        }

        List<String> sentences(List<Multiplier> mult, Optional<Multiplier> tp, double turnover, Lifted p,
                               QpPoint pr) {
            List<String> out = new ArrayList<>();
            boolean sameRisk = req.objective() instanceof RebalanceObjective.SameRisk;
            double slope = p.targetRow >= 0 ? pr.rowPrices()[p.targetRow] : 0;
            if (tp.isPresent()) {
                Multiplier t = tp.get();
                if (t.binding() && t.variancePerUnit() < 0) {
                    double dv = -t.volatilityPerUnit() * TURNOVER_STEP;
                    String s = String.format(Locale.ROOT, "Allowing 1 %% more turnover would lower volatility by %s "
                            + "(first-order estimate from the turnover limit's shadow price ∂V*/∂τ = %.6g, "
                            + "∂σ*/∂τ = %.6g).", small(dv), t.variancePerUnit(), t.volatilityPerUnit());
                    if (sameRisk && slope > 0) {
                        s += String.format(Locale.ROOT, " At today's risk it would raise the reachable return after "
                                + "costs by %s.", small(-t.variancePerUnit() / slope * TURNOVER_STEP));
                    }
                    out.add(s);
                } else {
                    out.add(String.format(Locale.ROOT, "The turnover limit %s is not binding: the proposal trades %s, "
                            + "so allowing more turnover would change nothing.", Breaches.pct(lim.maxTurnover()),
                            Breaches.pct(turnover)));
                }
            }
            for (Multiplier q : mult) {
                if (!q.binding() || q.constraint().equals("turnover") || q.constraint().equals("budget")) {
                    continue;
                }
                String c = q.constraint();
                double dv = q.volatilityPerUnit() * org.isorisk.engine.explain.Explain.WEIGHT_STEP;
                if (c.startsWith("trade_limit:")) {
                    out.add(String.format(Locale.ROOT, "Allowing 1 %% more trading in %s would %s volatility by %s.",
                            c.substring(12), dv <= 0 ? "lower" : "raise", small(Math.abs(dv))));
                } else if (c.startsWith("no_trade:") || c.startsWith("min_trade:")) {
                    String a = c.substring(c.indexOf(':') + 1);
                    out.add(String.format(Locale.ROOT, "%s is not traded (%s); trading 1 %% of it in the helpful "
                            + "direction would lower volatility by %s.", a,
                            c.startsWith("no_trade") ? "no-trade list" : "its trade was below the minimum size",
                            small(Math.abs(dv))));
                } else {
                    out.add(sentence(q));
                }
            }
            return out;
        }

        /**
         * The reading of a mandate limit's shadow price for a small step (0.10 % for the return target, 1 % for
         * weight limits), with enough decimals to show small changes.
         */
        static String sentence(Multiplier q) {
            String c = q.constraint();
            boolean ret = c.equals("target_return");
            double step = ret ? org.isorisk.engine.explain.Explain.RETURN_STEP
                    : org.isorisk.engine.explain.Explain.WEIGHT_STEP;
            double dv = q.volatilityPerUnit() * step;
            String what = ret ? "the return target (after costs)" : org.isorisk.engine.explain.Explain.describe(c);
            String verb = dv > 0 ? "raise" : "lower";
            return String.format(Locale.ROOT, "Raising %s by %s would %s volatility by %s%s.", what,
                    Breaches.pct(step), verb, small(Math.abs(dv)),
                    ret ? " (the marginal risk of tightening the return target)" : "");
        }

        /** A percent with enough decimals to show small first-order changes. */
        static String small(double x) {
            double a = Math.abs(x) * 100;
            return a >= 0.01 || a == 0 ? String.format(Locale.ROOT, "%.2f %%", x * 100)
                    : String.format(Locale.ROOT, "%.4f %%", x * 100);
        }
    }
}

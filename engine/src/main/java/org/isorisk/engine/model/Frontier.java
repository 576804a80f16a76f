package org.isorisk.engine.model;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import org.isorisk.engine.error.NoSolutionException;

/**
 * An efficient frontier: corner portfolios (exact turning points of the mandate frontier, ordered from the
 * minimum-variance end to the maximum-return end) and portfolios sampled on a grid of targets.
 *
 * @param corners            corner portfolios, increasing in expected return; empty for the closed-form frontier
 * @param points             sampled portfolios, increasing in expected return
 * @param unconstrained      the closed-form frontier's scalars for comparison; null when not available
 * @param minReturn          expected return of the minimum-variance portfolio under the mandate
 * @param maxReturn          highest expected return the mandate allows (infinite without bounds)
 * @param inefficientCorners corners of the inefficient branch, increasing in expected return, from the lowest
 *                           return the mandate allows up to and including the minimum-variance portfolio; empty
 *                           when not computed
 * @param lowestReturn       lowest expected return the mandate allows (−∞ without bounds)
 * @param rejected           requested targets outside {@code [lowestReturn, maxReturn]}, with the reason
 */
public record Frontier(List<Corner> corners, List<Solution> points, MertonScalars unconstrained, double minReturn,
                       double maxReturn, List<Corner> inefficientCorners, double lowestReturn,
                       List<RejectedTarget> rejected) {
    public Frontier {
        corners = List.copyOf(corners);
        points = List.copyOf(points);
        inefficientCorners = List.copyOf(inefficientCorners == null ? List.of() : inefficientCorners);
        rejected = List.copyOf(rejected == null ? List.of() : rejected);
    }

    /** A frontier without an inefficient branch or rejected targets. */
    public Frontier(List<Corner> corners, List<Solution> points, MertonScalars unconstrained, double minReturn,
                    double maxReturn) {
        this(corners, points, unconstrained, minReturn, maxReturn, List.of(), minReturn, List.of());
    }

    /**
     * The frontier portfolio at target return {@code m}, exactly, from the two corners around it: weights and
     * multipliers are affine in the target between corners, and the variance is the quadratic whose slope is the
     * return-target multiplier (envelope theorem), {@code V = (1−t)V_a + tV_b − ½κΔm²t(1−t)} with
     * {@code κ = (λ_b − λ_a)/Δm}. The certificate is the larger residual of the two corners, component by
     * component: every KKT residual is affine (or convex) along a stretch with one active set, so it bounds the
     * residuals of any point between them. Targets below the minimum-variance return use the inefficient corners.
     *
     * @param m target expected return, decimal, annualised
     * @throws NoSolutionException (INFEASIBLE) outside the range the corners cover
     * @throws IllegalStateException when the frontier has no corners (the closed-form frontier)
     */
    public Solution at(double m) {
        if (corners.isEmpty()) {
            throw new IllegalStateException("this frontier has no corner portfolios to interpolate");
        }
        List<Corner> branch = m >= minReturn || inefficientCorners.isEmpty() ? corners : inefficientCorners;
        double lo = branch.get(0).expectedReturn();
        double hi = branch.get(branch.size() - 1).expectedReturn();
        double tol = 1e-12 * Math.max(1, Math.abs(m));
        if (m > hi + tol || m < lo - tol) {
            throw new NoSolutionException(NoSolutionException.Reason.INFEASIBLE, String.format(Locale.ROOT,
                    "target return %.2f %% is outside the frontier's corners, which run from %.2f %% to %.2f %%",
                    m * 100, lo * 100, hi * 100), List.of("target_return"));
        }
        if (branch.size() > 1 && branch == corners && m >= hi - tol) {
            // The highest return: corners whose returns equal it up to rounding are one point with a kink between
            // them; as at the solver, report the one nearest the inside (smallest return-target multiplier).
            int j = branch.size() - 1;
            while (j > 0 && branch.get(j - 1).expectedReturn() >= hi - tol) {
                j--;
            }
            return branch.get(j).portfolio();
        }
        if (branch.size() > 1 && branch == inefficientCorners && m <= lo + tol) {
            // The lowest return, likewise from the inside.
            int j = 0;
            while (j + 1 < branch.size() && branch.get(j + 1).expectedReturn() <= lo + tol) {
                j++;
            }
            return branch.get(j).portfolio();
        }
        int k = 0;
        while (k + 2 < branch.size() && branch.get(k + 1).expectedReturn() < m) {
            k++;
        }
        if (branch.size() == 1) {
            return branch.get(0).portfolio();
        }
        Solution a = branch.get(k).portfolio();
        Solution b = branch.get(k + 1).portfolio();
        double dm = b.expectedReturn() - a.expectedReturn();
        double t = dm > 0 ? Math.max(0, Math.min(1, (m - a.expectedReturn()) / dm)) : 0;
        int n = a.assets().size();
        double[] w = new double[n];
        for (int i = 0; i < n; i++) {
            w[i] = (1 - t) * a.weight(i) + t * b.weight(i);
        }
        double la = a.multiplier("target_return").map(Multiplier::variancePerUnit).orElse(0.0);
        double lb = b.multiplier("target_return").map(Multiplier::variancePerUnit).orElse(0.0);
        double kappa = dm > 0 ? (lb - la) / dm : 0;
        double var = (1 - t) * a.variance() + t * b.variance() - 0.5 * kappa * dm * dm * t * (1 - t);
        double vol = Math.sqrt(Math.max(0, var));
        List<Multiplier> mult = new ArrayList<>();
        List<Multiplier> ma = a.multipliers();
        List<Multiplier> mb = b.multipliers();
        for (int j = 0; j < ma.size(); j++) {
            Multiplier x = ma.get(j);
            Multiplier y = mb.get(j);
            if (!x.constraint().equals(y.constraint())) {
                throw new IllegalStateException("corners list different constraints: " + x.constraint() + ", "
                        + y.constraint());
            }
            double v = (1 - t) * x.variancePerUnit() + t * y.variancePerUnit();
            boolean binding = t == 0 ? x.binding() : t == 1 ? y.binding() : x.binding() && y.binding();
            mult.add(new Multiplier(x.constraint(), v, vol > 0 ? v / (2 * vol) : Double.NaN, binding));
        }
        Certificate ca = a.certificate();
        Certificate cb = b.certificate();
        Certificate cert = new Certificate(Math.max(ca.stationarity(), cb.stationarity()),
                Math.max(ca.primal(), cb.primal()), Math.max(ca.dual(), cb.dual()),
                Math.max(ca.complementarity(), cb.complementarity()),
                Math.max(ca.conditionNumber(), cb.conditionNumber()), ca.threshold(), ca.convex() && cb.convex());
        double ret = (1 - t) * a.expectedReturn() + t * b.expectedReturn();
        List<String> notes = new ArrayList<>();
        notes.add(String.format(Locale.ROOT, "Interpolated exactly between the corner portfolios at returns %.2f %% "
                + "and %.2f %%; the certificate is the larger of the two corners' residuals.", a.expectedReturn() * 100,
                b.expectedReturn() * 100));
        if (m < minReturn) {
            notes.add(Branch.INEFFICIENT_NOTE);
        }
        return new Solution(a.method(), a.assets(), w, ret, var, vol, mult, cert, notes);
    }
}

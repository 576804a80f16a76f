package org.isorisk.engine.solve;

import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import org.isorisk.engine.error.NoSolutionException;
import org.isorisk.engine.model.AllocationRequest;
import org.isorisk.engine.model.AssetUniverse;
import org.isorisk.engine.model.Certificate;
import org.isorisk.engine.model.Group;
import org.isorisk.engine.model.LinearConstraint;
import org.isorisk.engine.model.Mandate;
import org.isorisk.engine.model.Method;
import org.isorisk.engine.model.Multiplier;
import org.isorisk.engine.model.Relation;
import org.isorisk.engine.model.Solution;

/**
 * The closed form when nothing binds: solve with the mandate's equalities alone (budget, fixed weights, group
 * equalities, equality rows, the target); when that portfolio lies strictly inside every bound and inequality
 * limit, it satisfies the KKT conditions of the whole mandate with every inequality multiplier zero, and since
 * the problem is convex it is the optimum. Bounded methods would reach the same point one asset at a time; this
 * costs one factorisation.
 */
final class InteriorShortcut {
    private InteriorShortcut() {
    }

    /** Slack below which a bound or limit counts as touching (relative to max(1, |limit|)). */
    static final double STRICT = 1e-9;

    /** The closed-form optimum when it is strictly feasible for the whole mandate, else null. */
    static Solution tryClosedForm(AllocationRequest r) {
        return tryClosedForm(r, null);
    }

    /**
     * As {@link #tryClosedForm(AllocationRequest)}, on a universe already factored.
     *
     * @param prepared the request's universe factored ({@link Factored#fresh()}), or null to factor it here
     */
    static Solution tryClosedForm(AllocationRequest r, Factored prepared) {
        AssetUniverse u = r.universe();
        Mandate m = r.mandate();
        Mandate equalities = equalitiesOf(m);
        Factored f;
        Solution cf;
        try {
            f = prepared != null ? prepared : Factored.ofOverlapped(u, r.settings());
            cf = Allocator.closedForm(f, equalities, r.objective(), r);
        } catch (NoSolutionException e) {
            return null; // let the bounded method diagnose it with the whole mandate in view
        }
        double[] w = cf.weights();
        int n = w.length;
        for (int i = 0; i < n; i++) {
            if (Double.isFinite(m.lower(i)) && !(w[i] - m.lower(i) > STRICT * Math.max(1, Math.abs(m.lower(i))))) {
                return null;
            }
            if (Double.isFinite(m.upper(i)) && !(m.upper(i) - w[i] > STRICT * Math.max(1, Math.abs(m.upper(i))))) {
                return null;
            }
        }
        List<LinearConstraint> rows = new ArrayList<>(m.rows(u.assets()));
        for (LinearConstraint c : rows) {
            if (c.relation() != Relation.EQUAL && (c.violation(w) > 0
                    || !(Math.abs(c.evaluate(w) - c.limit()) > STRICT * Math.max(1, Math.abs(c.limit()))))) {
                return null;
            }
        }
        // Every constraint of the mandate with its shadow price: equalities from the closed form, inequalities 0.
        List<Multiplier> mult = new ArrayList<>();
        double[] prices = new double[rows.size() + (cf.multiplier("target_return").isPresent() ? 1 : 0)];
        List<LinearConstraint> certRows = new ArrayList<>(rows);
        if (cf.multiplier("target_return").isPresent()) {
            certRows.add(new LinearConstraint("target_return", u.expectedReturns(), Relation.EQUAL, cf.expectedReturn()));
        }
        for (int k = 0; k < certRows.size(); k++) {
            LinearConstraint c = certRows.get(k);
            Multiplier fromCf = c.relation() == Relation.EQUAL ? cf.multiplier(c.name()).orElse(null) : null;
            if (fromCf != null) {
                prices[k] = fromCf.variancePerUnit();
                mult.add(fromCf);
            } else {
                mult.add(new Multiplier(c.name(), 0, 0, false));
            }
        }
        for (int i = 0; i < n; i++) {
            if (Double.isFinite(m.lower(i))) {
                mult.add(new Multiplier("lower:" + u.assets().get(i), 0, 0, false));
            }
            if (Double.isFinite(m.upper(i))) {
                mult.add(new Multiplier("upper:" + u.assets().get(i), 0, 0, false));
            }
        }
        Certificate cert = Kkt.certifyProduct(f.sigmaTimes(w), w, certRows, prices, m.lower(), m.upper(), new double[n],
                new double[n], cf.certificate().conditionNumber(), r.settings().closedFormTolerance(), true);
        List<String> notes = new ArrayList<>();
        for (String note : cf.notes()) {
            if (!note.equals(Allocator.SHORTS_NOTE)) {
                notes.add(note);
            }
        }
        notes.add(0, "No bound or inequality limit of the mandate binds at this portfolio, so the closed form on the "
                + "equalities alone is the optimum of the whole mandate: every inequality multiplier is zero.");
        return new Solution(Method.CLOSED_FORM, u.assets(), w, cf.expectedReturn(), cf.variance(), cf.volatility(),
                mult, cert, notes);
    }

    /** The mandate's equalities only: no bounds, group limits kept only where min = max, equality rows kept. */
    private static Mandate equalitiesOf(Mandate m) {
        int n = m.size();
        double[] lo = new double[n];
        double[] hi = new double[n];
        java.util.Arrays.fill(lo, Double.NEGATIVE_INFINITY);
        java.util.Arrays.fill(hi, Double.POSITIVE_INFINITY);
        List<Group> groups = new ArrayList<>();
        for (Group g : m.groups()) {
            if (g.min() == g.max()) {
                groups.add(g);
            }
        }
        List<LinearConstraint> eq = new ArrayList<>();
        for (LinearConstraint c : m.constraints()) {
            if (c.relation() == Relation.EQUAL) {
                eq.add(c);
            }
        }
        return new Mandate(m.budget(), lo, hi, Map.copyOf(m.fixed()), groups, eq);
    }
}

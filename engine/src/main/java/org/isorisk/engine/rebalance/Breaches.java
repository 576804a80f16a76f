package org.isorisk.engine.rebalance;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import org.isorisk.engine.model.AssetUniverse;
import org.isorisk.engine.model.Group;
import org.isorisk.engine.model.LinearConstraint;
import org.isorisk.engine.model.Mandate;

/** Finds the limits of the policy that today's holdings break, and the proposed trades that cure each. */
final class Breaches {
    private Breaches() {
    }

    /** A weight or sum counts as breaking its limit when beyond it by more than this (1e-9, round-off). */
    static final double TOLERANCE = 1e-9;

    /**
     * @param w0     today's weights
     * @param w      proposed weights; null when there is no proposal (the breaches of today alone)
     * @param trades the trade list, in asset order; null when there is no proposal
     */
    static List<Breach> find(AssetUniverse u, Mandate m, double[] w0, double[] w, List<Trade> trades) {
        List<Breach> out = new ArrayList<>();
        List<String> names = u.assets();
        int n = u.size();
        for (int i = 0; i < n; i++) {
            if (m.fixed().containsKey(i)) {
                continue;
            }
            if (w0[i] > m.upper(i) + TOLERANCE) {
                out.add(make("upper:" + names.get(i), names.get(i), w0[i], m.upper(i), at(w, i), List.of(i), -1, trades,
                        "above its maximum"));
            }
            if (w0[i] < m.lower(i) - TOLERANCE) {
                out.add(make("lower:" + names.get(i), names.get(i), w0[i], m.lower(i), at(w, i), List.of(i), 1, trades,
                        "below its minimum"));
            }
        }
        for (Map.Entry<Integer, Double> e : m.fixed().entrySet()) {
            int i = e.getKey();
            double f = e.getValue();
            if (Math.abs(w0[i] - f) > TOLERANCE) {
                out.add(make("fixed:" + names.get(i), names.get(i), w0[i], f, at(w, i), List.of(i), w0[i] > f ? -1 : 1,
                        trades, "away from its fixed weight"));
            }
        }
        for (Group g : m.groups()) {
            double s0 = sum(g.members(), w0);
            double s1 = w == null ? Double.NaN : sum(g.members(), w);
            String who = "group " + g.name();
            if (s0 > g.max() + TOLERANCE) {
                out.add(make(g.min() == g.max() ? "group:" + g.name() : g.maxName(), who, s0, g.max(), s1,
                        g.members(), -1, trades, "above its maximum"));
            } else if (s0 < g.min() - TOLERANCE) {
                out.add(make(g.min() == g.max() ? "group:" + g.name() : g.minName(), who, s0, g.min(), s1,
                        g.members(), 1, trades, "below its minimum"));
            }
        }
        for (LinearConstraint c : m.constraints()) {
            double v = c.violation(w0);
            if (v > TOLERANCE) {
                List<Integer> involved = new ArrayList<>();
                double[] coef = new double[n];
                for (int i = 0; i < n; i++) {
                    coef[i] = c.coefficient(i);
                    if (coef[i] != 0) {
                        involved.add(i);
                    }
                }
                double now = c.evaluate(w0);
                int dir = now > c.limit() ? -1 : 1;
                out.add(make(c.name(), "constraint " + c.name(), now, c.limit(),
                        w == null ? Double.NaN : c.evaluate(w), involved, coef, dir, trades,
                        dir < 0 ? "above its limit" : "below its limit"));
            }
        }
        return out;
    }

    private static Breach make(String constraint, String who, double now, double limit, double proposed,
                               List<Integer> members, int direction, List<Trade> trades, String how) {
        return make(constraint, who, now, limit, proposed, members, null, direction, trades, how);
    }

    /** A breach of a weighted sum (coefficients null: all 1) with the trades that move it back. */
    private static Breach make(String constraint, String who, double now, double limit, double proposed,
                               List<Integer> members, double[] coef, int direction, List<Trade> trades, String how) {
        List<Trade> cures = new ArrayList<>();
        StringBuilder moves = new StringBuilder();
        for (int i : trades == null ? List.<Integer>of() : members) {
            Trade t = trades.get(i);
            double a = coef == null ? 1 : coef[i];
            if (Math.signum(t.trade() * a) == direction) {
                cures.add(t);
                if (moves.length() > 0) {
                    moves.append(", ");
                }
                moves.append(t.side().label()).append(' ').append(pct(Math.abs(t.trade()))).append(members.size() > 1
                        ? " of " + t.asset() : "");
            }
        }
        String cure = trades == null ? "" : cures.isEmpty() ? "; the proposal trades nothing here (check the trading "
                + "limits)" : "; the proposal trades: " + moves + ", to " + pct(proposed);
        String d = String.format(Locale.ROOT, "%s is at %s today, %s %s by %s%s.", capitalise(who), pct(now), how,
                pct(limit), pct(Math.abs(now - limit)), cure);
        return new Breach(constraint, now, limit, Math.abs(now - limit), proposed, cures, d);
    }

    private static double at(double[] w, int i) {
        return w == null ? Double.NaN : w[i];
    }

    private static double sum(List<Integer> members, double[] w) {
        double s = 0;
        for (int i : members) {
            s += w[i];
        }
        return s;
    }

    private static String capitalise(String s) {
        return s.isEmpty() ? s : Character.toUpperCase(s.charAt(0)) + s.substring(1);
    }

    static String pct(double x) {
        return String.format(Locale.ROOT, "%.2f %%", x * 100);
    }
}

package org.isorisk.engine.views;

import java.util.Collections;
import java.util.HashSet;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Set;
import org.isorisk.engine.error.InputException;

/**
 * View portfolios on groups of assets: a group weighted by reference (e.g. market-capitalisation) weights within
 * the group, and the difference of two sides for a relative view. He &amp; Litterman (1999) weight "the rest of
 * Europe" (France and the UK) this way: France 5.2 / (5.2 + 12.4) ≈ 0.295, the UK ≈ 0.705.
 */
public final class ViewPortfolios {
    private ViewPortfolios() {
    }

    /**
     * The group's members weighted in proportion to their reference weights, summing to 1:
     * {@code p_i = w_i / Σ_{j in group} w_j}.
     *
     * @param view    the view's name, for messages
     * @param members the group's assets, at least one, each once
     * @param weights reference weights by asset; every member must have one (other entries are ignored)
     * @throws InputException when a member has no weight, is listed twice, or the group's weights do not sum
     *                        to a positive number
     */
    public static Map<String, Double> weightedGroup(String view, List<String> members, Map<String, Double> weights) {
        if (members == null || members.isEmpty()) {
            throw View.error(view, "names a group without members").key("portfolio")
                    .fix("list at least one asset in the group").build();
        }
        Set<String> seen = new HashSet<>();
        double total = 0;
        for (String m : members) {
            if (!seen.add(m)) {
                throw View.error(view, "lists an asset twice in one group").key("portfolio").asset(m)
                        .fix("list each member once").build();
            }
            Double w = weights.get(m);
            if (w == null || !Double.isFinite(w)) {
                throw View.error(view, "needs a reference weight for every member of its group").key("portfolio")
                        .asset(m).fix("give a reference weight for " + m).build();
            }
            total += w;
        }
        if (!(total > 0)) {
            throw View.error(view, "weights a group whose reference weights do not sum to a positive number")
                    .key("portfolio").value(total).fix("check the reference weights of the group's members").build();
        }
        Map<String, Double> p = new LinkedHashMap<>();
        for (String m : members) {
            p.put(m, weights.get(m) / total);
        }
        return Collections.unmodifiableMap(p);
    }

    /**
     * The portfolio of "{@code outperformer} beats {@code underperformer}": outperformer minus underperformer,
     * asset by asset, zero coefficients left out.
     *
     * @throws InputException when the two sides are the same (every coefficient cancels)
     */
    public static Map<String, Double> difference(String view, Map<String, Double> outperformer,
                                                 Map<String, Double> underperformer) {
        Map<String, Double> p = new LinkedHashMap<>(outperformer);
        underperformer.forEach((a, v) -> p.merge(a, -v, Double::sum));
        p.values().removeIf(v -> v == 0);
        if (p.isEmpty()) {
            throw View.error(view, "compares a portfolio with itself: its two sides are the same").key("portfolio")
                    .fix("give two different assets or groups").build();
        }
        return Collections.unmodifiableMap(p);
    }
}

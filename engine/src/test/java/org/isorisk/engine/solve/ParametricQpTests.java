package org.isorisk.engine.solve;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.ArrayList;
import java.util.HashSet;
import java.util.List;
import java.util.Set;
import java.util.TreeSet;
import org.isorisk.engine.TestUniverses;
import org.isorisk.engine.model.AssetUniverse;
import org.isorisk.engine.model.Corner;
import org.isorisk.engine.model.Mandate;
import org.isorisk.engine.model.SolverSettings;
import org.isorisk.engine.synthetic.FactorModels;
import org.junit.jupiter.api.Test;

/**
 * The parametric active-set method ({@link ParametricQp}) against the project's critical line method where both
 * apply (budget and bounds, no linear term).
 */
class ParametricQpTests {

    static ParametricPath walk(AssetUniverse u, Mandate m, double[] q, boolean inefficient) {
        return ParametricQp.walk(ParametricProblem.of(u, m, q), inefficient, SolverSettings.defaults());
    }

    static Set<Integer> free(byte[] state) {
        Set<Integer> out = new TreeSet<>();
        for (int i = 0; i < state.length; i++) {
            if (state[i] == ParametricQp.FREE) {
                out.add(i);
            }
        }
        return out;
    }

    private static Set<Integer> assets(List<ParametricPath.Change> changes) {
        Set<Integer> out = new TreeSet<>();
        for (ParametricPath.Change c : changes) {
            assertTrue(c.constraint().kind() == ParametricPath.Kind.LOWER
                    || c.constraint().kind() == ParametricPath.Kind.UPPER, c.toString());
            out.add(c.constraint().index());
        }
        return out;
    }

    private static Set<Integer> symmetricDifference(Set<Integer> a, Set<Integer> b) {
        Set<Integer> out = new TreeSet<>(a);
        out.addAll(b);
        Set<Integer> both = new HashSet<>(a);
        both.retainAll(b);
        out.removeAll(both);
        return out;
    }

    @Test
    void budgetAndBoundsGiveTheCriticalLinesCornersWeightsAndChanges() {
        // Reference: the project's critical line method (CriticalLine/MandateSweep; Markowitz 1956, Niedermayer &
        // Niedermayer 2010), an independent algorithm (a walk in the risk-aversion parameter over free sets) on the
        // same problems: every corner's target and weights, and the free set of every piece between corners.
        int checked = 0;
        for (int n : new int[] {10, 25, 50, 100, 200}) {
            List<Object[]> problems = List.of(
                    new Object[] {"market", FactorModels.universe(n, FactorModels.DEFAULT_SEED + n),
                        FactorModels.longOnlyCapped(n)},
                    new Object[] {"signed", FactorModels.signedUniverse(n, 7 + n), FactorModels.longOnlyCapped(n)},
                    new Object[] {"random", TestUniverses.random(n, 11 + n),
                        FactorModels.boxed(n, -0.02, Math.max(0.1, 2.0 / n))});
            for (Object[] pr : problems) {
                String what = pr[0] + " n=" + n;
                AssetUniverse u = (AssetUniverse) pr[1];
                Mandate m = (Mandate) pr[2];
                ParametricPath path = walk(u, m, null, true);
                MandateSweep cl = MandateSweep.of(u, m, SolverSettings.defaults());
                List<ParametricPath.Corner> mine = path.corners();
                List<ParametricPath.Piece> pieces = path.pieces();
                int k = path.minimum();
                compare(u, m, cl.efficientCorners(), mine.subList(k, mine.size()), pieces.subList(k, pieces.size()), true,
                        what + " efficient");
                compare(u, m, cl.inefficientCorners(), mine.subList(0, k + 1), pieces.subList(0, k), false,
                        what + " inefficient");
                checked += mine.size();
            }
        }
        assertTrue(checked > 500, "corners compared: " + checked);
    }

    /**
     * CL's corners (increasing target; several at one target at a kink) against ours on one branch; CL's free set
     * of a corner is that of the stretch towards the minimum-variance portfolio.
     */
    private static void compare(AssetUniverse u, Mandate m, List<Corner> cl, List<ParametricPath.Corner> mine,
                                List<ParametricPath.Piece> pieces, boolean efficient, String what) {
        List<List<Corner>> groups = new ArrayList<>();
        for (Corner c : cl) {
            if (!groups.isEmpty()) {
                List<Corner> g = groups.get(groups.size() - 1);
                if (Math.abs(g.get(0).expectedReturn() - c.expectedReturn()) <= 1e-12) {
                    g.add(c);
                    continue;
                }
            }
            groups.add(new ArrayList<>(List.of(c)));
        }
        assertEquals(groups.size(), mine.size(), what + ": number of corners");
        int n = u.size();
        for (int g = 0; g < groups.size(); g++) {
            ParametricPath.Corner c = mine.get(g);
            Corner ref = groups.get(g).get(0);
            assertEquals(ref.expectedReturn(), c.target(), 1e-12, what + ": target of corner " + g);
            for (int i = 0; i < n; i++) {
                assertEquals(ref.portfolio().weight(i), c.weights()[i], 1e-10, what + ": corner " + g + " asset " + i);
            }
            assertTrue(c.certificate().worst() <= 1e-9, what + ": certificate " + c.certificate());
        }
        List<Set<Integer>> freeSets = new ArrayList<>();
        for (int j = 0; j < pieces.size(); j++) {
            List<Corner> side = efficient ? groups.get(j + 1) : groups.get(j);
            Corner ref = efficient ? side.get(0) : side.get(side.size() - 1);
            Set<Integer> theirs = new TreeSet<>();
            for (String a : ref.free()) {
                theirs.add(u.indexOf(a).orElseThrow());
            }
            Set<Integer> ours = free(pieces.get(j).state());
            assertEquals(theirs, ours, what + ": free set of piece " + j);
            freeSets.add(ours);
        }
        int end = efficient ? groups.size() - 1 : 0;
        int minimum = efficient ? 0 : groups.size() - 1;
        for (int g = 0; g < groups.size(); g++) {
            Set<Integer> theirs = new TreeSet<>();
            for (Corner c : groups.get(g)) {
                if (c.asset() != null) {
                    for (String a : c.asset().split(", ")) {
                        theirs.add(u.indexOf(a).orElseThrow());
                    }
                }
            }
            Set<Integer> ours = assets(mine.get(g).changes());
            if (g == minimum) {
                assertEquals(Set.of(), ours, what + ": changes at the minimum");
            } else if (g == end) {
                // At the end of the range our changes are the assets free on the last piece that reach a bound
                // there. The critical line method names the events of its walk's first corner (it starts at this
                // end): at a degenerate end vertex that may be one of several such assets, or include assets that
                // change twice there; it must name at least one of ours.
                Set<Integer> endPiece = efficient ? freeSets.get(freeSets.size() - 1) : freeSets.get(0);
                Set<Integer> reached = new TreeSet<>();
                double[] w = mine.get(g).weights();
                for (int i : endPiece) {
                    if (Math.abs(w[i] - m.lower(i)) <= 1e-12 || Math.abs(w[i] - m.upper(i)) <= 1e-12) {
                        reached.add(i);
                    }
                }
                assertEquals(reached, ours, what + ": changes at the end");
                Set<Integer> common = new TreeSet<>(theirs);
                common.retainAll(ours);
                assertTrue(!common.isEmpty(), what + ": critical line's end changes " + theirs + " vs ours " + ours);
            } else {
                Set<Integer> expected = symmetricDifference(freeSets.get(g - 1), freeSets.get(g));
                assertEquals(expected, ours, what + ": changes at corner " + g);
                // The critical line method names every event of a merged corner, also an asset that enters and
                // leaves again there (no net change); the net changes must be among them.
                assertTrue(theirs.containsAll(expected), what + ": critical line changes at corner " + g + " "
                        + theirs + " vs " + expected);
            }
        }
    }
}

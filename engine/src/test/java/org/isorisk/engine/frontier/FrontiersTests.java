package org.isorisk.engine.frontier;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import org.isorisk.engine.Tolerances;
import org.isorisk.engine.error.NoSolutionException;
import org.isorisk.engine.model.AllocationRequest;
import org.isorisk.engine.model.AssetUniverse;
import org.isorisk.engine.model.Corner;
import org.isorisk.engine.model.Frontier;
import org.isorisk.engine.model.Mandate;
import org.isorisk.engine.model.MertonScalars;
import org.isorisk.engine.model.Method;
import org.isorisk.engine.model.Multiplier;
import org.isorisk.engine.model.Objective;
import org.isorisk.engine.model.RejectedTarget;
import org.isorisk.engine.model.Solution;
import org.isorisk.engine.solve.Allocator;
import org.isorisk.engine.support.OjAlgoReference;
import java.nio.file.Path;
import org.isorisk.engine.io.UniverseFiles;
import org.isorisk.engine.io.UniverseLoader;
import org.isorisk.engine.synthetic.FactorModels;
import org.junit.jupiter.api.Test;

class FrontiersTests {

    /** The invented sample fund shipped in {@code sample-data/} (fictional, illustrative assumptions). */
    private static AssetUniverse sampleFund() {
        Path data = Path.of("..", "sample-data");
        return UniverseLoader.load(UniverseFiles.of(data.resolve("expected_returns.csv"),
                data.resolve("covariance.csv"))).universe();
    }

    /** Fully invested, long-only, every asset at most {@code max}. */
    private static Mandate longOnly(int n, double max) {
        return FactorModels.boxed(n, 0.0, max);
    }

    private static Solution solve(AssetUniverse u, Mandate m, double t) {
        return Allocator.solve(new AllocationRequest(u, m, Objective.targetReturn(t), Method.CRITICAL_LINE, null));
    }

    @Test
    void pointsAreSpacedEvenlyFromTheMinimumVarianceToTheMaximumReturnEnd() {
        AssetUniverse u = FactorModels.universe(20, 8);
        Mandate m = FactorModels.boxed(20, 0, 0.2);
        Frontier fr = Frontiers.mandate(u, m, Grid.points(5), null);
        List<Solution> p = fr.points();
        assertEquals(5, p.size());
        assertEquals(fr.minReturn(), p.get(0).expectedReturn(), Tolerances.TIGHT);
        assertEquals(fr.maxReturn(), p.get(4).expectedReturn(), Tolerances.TIGHT);
        double step = (fr.maxReturn() - fr.minReturn()) / 4;
        for (int k = 1; k < 5; k++) {
            assertEquals(step, p.get(k).expectedReturn() - p.get(k - 1).expectedReturn(), Tolerances.TIGHT);
        }
        assertEquals(fr.minReturn(), fr.corners().get(0).expectedReturn(), 0.0);
        assertEquals(fr.maxReturn(), fr.corners().get(fr.corners().size() - 1).expectedReturn(), 0.0);
        assertEquals("min-variance", fr.corners().get(0).change());
        assertEquals("max-return", fr.corners().get(fr.corners().size() - 1).change());
    }

    @Test
    void targetsOutsideTheAchievableRangeAreReportedNotDropped() {
        AssetUniverse u = sampleFund();
        Mandate m = longOnly(12, 0.35);
        Frontier fr = Frontiers.mandate(u, m, Grid.parse("0.00:0.10:0.01"), null);
        assertEquals(11, fr.points().size() + fr.rejected().size(), "every target accounted for");
        List<Double> rejected = fr.rejected().stream().map(RejectedTarget::target).toList();
        // Worked by hand from the sample fund's expected returns: returns run from 2.95 % to 7.43 %.
        assertEquals(6, rejected.size(), rejected.toString());
        for (double t : new double[] {0.00, 0.01, 0.02, 0.08, 0.09, 0.10}) {
            assertTrue(rejected.stream().anyMatch(r -> Math.abs(r - t) < 1e-12), "rejected " + t);
        }
        assertTrue(fr.rejected().get(0).reason().startsWith("target return 0.00 % is below the lowest return the "
                + "mandate allows, 2.95 %"), fr.rejected().get(0).reason());
        for (Solution s : fr.points()) {
            assertTrue(s.certificate().worst() <= 1e-9);
        }
    }

    @Test
    void theSampleFundLongOnlyAtMostThirtyFivePercentAgreesWithOjAlgo() {
        // The shipped (invented) sample fund; independent reference: ojAlgo's active-set QP (weights only).
        AssetUniverse u = sampleFund();
        Mandate m = longOnly(12, 0.35);
        Frontier fr = Frontiers.mandate(u, m, Grid.points(9), null);
        // By hand: Emerging Equity and Domestic Equity full, Foreign Developed Equity the rest; and at the bottom
        // Cash and Government Bonds full, Inflation-Linked Bonds the rest.
        assertEquals(0.35 * 0.083 + 0.35 * 0.071 + 0.30 * 0.068, fr.maxReturn(), Tolerances.TIGHT, "by hand");
        assertEquals(0.35 * 0.025 + 0.35 * 0.031 + 0.30 * 0.033, fr.lowestReturn(), Tolerances.TIGHT, "by hand");
        for (Solution s : fr.points()) {
            double[] ref = OjAlgoReference.weights(u, m, s.expectedReturn());
            assertNotNull(ref);
            for (int i = 0; i < 12; i++) {
                assertEquals(ref[i], s.weight(i), Tolerances.NUMERICAL, u.assets().get(i) + " at " + s.expectedReturn());
            }
        }
        Solution mv = Allocator.solve(AllocationRequest.of(u, m, Objective.minimumVariance()));
        double[] ref = OjAlgoReference.weights(u, m, Double.NaN);
        assertNotNull(ref);
        for (int i = 0; i < 12; i++) {
            assertEquals(ref[i], mv.weight(i), Tolerances.NUMERICAL, "minimum variance, " + u.assets().get(i));
        }
        assertEquals(0.35, mv.weight(0), Tolerances.TIGHT, "cash is the least risky asset and fills its cap");
        NoSolutionException e = assertThrows(NoSolutionException.class, () -> solve(u, m, 0.09));
        assertEquals("target return 9.00 % is above the highest return the mandate allows, 7.43 % (Domestic Equity "
                + "at its upper bound 35.00 %, Emerging Equity at its upper bound 35.00 %, Foreign Developed Equity "
                + "30.00 %, every other asset at its lower bound); achievable returns run from 2.95 % to 7.43 %; fix: "
                + "choose a target of at most 7.43 % or loosen the upper bounds", e.getMessage());
        for (Corner c : fr.corners()) {
            assertTrue(c.description().length() > 20, c.description());
        }
    }

    @Test
    void aFrontierEvaluatesAnyTargetExactlyFromItsCorners() {
        AssetUniverse u = FactorModels.universe(40, 12);
        Mandate m = FactorModels.boxed(40, 0, 0.1);
        Frontier fr = Frontiers.mandate(u, m, Grid.none(), true, null);
        for (double f : new double[] {-0.7, -0.2, 0.0, 0.13, 0.5, 0.77, 1.0}) {
            double t = f >= 0 ? fr.minReturn() + f * (fr.maxReturn() - fr.minReturn())
                    : fr.minReturn() + f * (fr.minReturn() - fr.lowestReturn());
            Solution a = fr.at(t);
            Solution b = solve(u, m, t);
            assertEquals(b.expectedReturn(), a.expectedReturn(), Tolerances.TIGHT);
            assertEquals(b.variance(), a.variance(), Tolerances.TIGHT, "variance from the corners at " + t);
            for (int i = 0; i < 40; i++) {
                assertEquals(b.weight(i), a.weight(i), Tolerances.CLOSED_FORM, "weight " + i + " at " + t);
            }
            for (Multiplier x : b.multipliers()) {
                double y = a.multiplier(x.constraint()).orElseThrow().variancePerUnit();
                assertEquals(x.variancePerUnit(), y, Tolerances.CLOSED_FORM * Math.max(1, Math.abs(y)), x.constraint() + " at f=" + f + " " + b.notes());
            }
            assertTrue(a.certificate().worst() <= 1e-9);
        }
        assertThrows(NoSolutionException.class, () -> fr.at(fr.maxReturn() + 0.01));
    }

    @Test
    void theUnconstrainedFrontierIsMertonsHyperbola() {
        // Merton (1972): V*(m) = (C m² − 2 A b m + B b²)/D.
        AssetUniverse u = FactorModels.universe(15, 6);
        Frontier fr = Frontiers.unconstrained(u, 1.0, Grid.points(7), null);
        MertonScalars ms = fr.unconstrained();
        assertNotNull(ms);
        assertEquals(7, fr.points().size());
        assertTrue(fr.corners().isEmpty());
        for (Solution s : fr.points()) {
            assertEquals(ms.variance(s.expectedReturn()), s.variance(), Tolerances.CLOSED_FORM);
            assertEquals(Method.CLOSED_FORM, s.method());
        }
        assertEquals(ms.minimumVarianceReturn(), fr.minReturn(), Tolerances.TIGHT);
        Frontier mandate = Frontiers.mandate(u, FactorModels.boxed(15, 0, 0.3), Grid.none(), null);
        assertEquals(ms.a(), mandate.unconstrained().a(), Tolerances.TIGHT * Math.abs(ms.a()));
        assertEquals(ms.d(), mandate.unconstrained().d(), Tolerances.CLOSED_FORM * Math.abs(ms.d()));
        for (Solution s : fr.points()) {
            assertTrue(mandate.points().isEmpty());
            if (s.expectedReturn() <= mandate.maxReturn() && s.expectedReturn() >= mandate.minReturn()) {
                // A mandate can only cost risk (common practice, no source): its frontier lies to the right.
                assertTrue(mandate.at(s.expectedReturn()).variance() >= s.variance() - Tolerances.TIGHT);
            }
        }
    }
}

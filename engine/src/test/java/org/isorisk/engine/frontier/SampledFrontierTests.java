package org.isorisk.engine.frontier;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Path;
import org.isorisk.engine.Tolerances;
import org.isorisk.engine.io.PolicyReader;
import org.isorisk.engine.io.UniverseFiles;
import org.isorisk.engine.io.UniverseLoader;
import org.isorisk.engine.model.AssetUniverse;
import org.isorisk.engine.model.Frontier;
import org.isorisk.engine.model.Mandate;
import org.isorisk.engine.model.Method;
import org.isorisk.engine.model.Solution;
import org.isorisk.engine.synthetic.FactorModels;
import org.junit.jupiter.api.Test;

class SampledFrontierTests {

    @Test
    void onABoundsOnlyMandateTheSampledFrontierMatchesTheCriticalLineMethod() {
        // Two independent methods on the same problem: the numerical active-set QP at each target against the
        // critical line method's exact frontier (Markowitz 1956; Niedermayer & Niedermayer 2010).
        AssetUniverse u = FactorModels.universe(15, 4);
        Mandate m = FactorModels.boxed(15, 0.0, 0.25);
        Frontier exact = Frontiers.mandate(u, m, Grid.points(9), null);
        Frontier qp = Frontiers.sampled(u, m, Grid.points(9), null);
        assertEquals(exact.minReturn(), qp.minReturn(), Tolerances.NUMERICAL);
        assertEquals(exact.maxReturn(), qp.maxReturn(), Tolerances.NUMERICAL);
        assertEquals(9, qp.points().size());
        for (int k = 1; k < 9; k++) {
            Solution a = exact.points().get(k);
            Solution b = qp.points().get(k);
            assertEquals(a.expectedReturn(), b.expectedReturn(), Tolerances.NUMERICAL);
            assertEquals(a.volatility(), b.volatility(), Tolerances.NUMERICAL);
            double va = a.multiplier("target_return").orElseThrow().volatilityPerUnit();
            double vb = b.multiplier("target_return").orElseThrow().volatilityPerUnit();
            assertEquals(va, vb, Tolerances.NUMERICAL * Math.max(1, Math.abs(va)));
        }
        assertTrue(qp.corners().isEmpty());
    }

    @Test
    void theSamplePolicyWithGroupsIsSampledWithCertifiedPoints() {
        Path data = Path.of("..", "sample-data");
        AssetUniverse u = UniverseLoader.load(UniverseFiles.of(data.resolve("expected_returns.csv"),
                data.resolve("covariance.csv"))).universe();
        Mandate policy = PolicyReader.read(data.resolve("policy.yaml"), u.assets()).mandate();
        Frontier f = Frontiers.sampled(u, policy, Grid.points(12), null);
        assertTrue(f.corners().isEmpty(), "groups: no corner portfolios");
        assertEquals(12, f.points().size());
        Solution first = f.points().get(0);
        assertEquals(f.minReturn(), first.expectedReturn(), Tolerances.TIGHT);
        double previous = -1;
        for (Solution s : f.points()) {
            assertEquals(Method.NUMERICAL, s.method());
            assertTrue(s.certificate().passes(), s.toString());
            assertTrue(s.volatility() >= previous - Tolerances.NUMERICAL, "volatility rises along the frontier");
            previous = s.volatility();
        }
        assertEquals(f.maxReturn(), f.points().get(11).expectedReturn(), Tolerances.NUMERICAL);
    }
}

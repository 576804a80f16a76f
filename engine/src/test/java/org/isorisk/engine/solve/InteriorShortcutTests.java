package org.isorisk.engine.solve;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.isorisk.engine.Tolerances;
import org.isorisk.engine.model.AllocationRequest;
import org.isorisk.engine.model.AssetUniverse;
import org.isorisk.engine.model.Mandate;
import org.isorisk.engine.model.Method;
import org.isorisk.engine.model.Multiplier;
import org.isorisk.engine.model.Objective;
import org.isorisk.engine.model.Solution;
import org.isorisk.engine.model.SolverSettings;
import org.isorisk.engine.synthetic.FactorModels;
import org.junit.jupiter.api.Test;

/** AUTO takes the closed form when no bound or limit binds, and only then. */
class InteriorShortcutTests {

    private static final AssetUniverse U = FactorModels.universe(60, FactorModels.DEFAULT_SEED);

    private static Solution solve(Mandate m, Objective o, Method method) {
        return Allocator.solve(new AllocationRequest(U, m, o, method, SolverSettings.defaults()));
    }

    @Test
    void looseBoundsGiveTheClosedFormWithEveryBoundMultiplierZero() {
        Mandate loose = FactorModels.boxed(60, -5.0, 5.0);
        for (Objective o : new Objective[] {Objective.minimumVariance(), Objective.targetReturn(0.06)}) {
            Solution auto = solve(loose, o, Method.AUTO);
            assertEquals(Method.CLOSED_FORM, auto.method());
            assertTrue(auto.certificate().passes(), auto.certificate().toString());
            // independent paths: the critical line method and the active-set QP, forced, reach the same point
            Solution cla = solve(loose, o, Method.CRITICAL_LINE);
            Solution qp = solve(loose, o, Method.NUMERICAL);
            for (int i = 0; i < 60; i++) {
                assertEquals(cla.weight(i), auto.weight(i), Tolerances.GENERAL);
                assertEquals(qp.weight(i), auto.weight(i), Tolerances.GENERAL);
            }
            for (Multiplier mu : auto.multipliers()) {
                if (mu.constraint().startsWith("lower:") || mu.constraint().startsWith("upper:")) {
                    assertEquals(0.0, mu.variancePerUnit());
                    assertFalse(mu.binding());
                } else {
                    // budget and target: the same shadow prices as the bounded method's
                    double other = qp.multiplier(mu.constraint()).orElseThrow().variancePerUnit();
                    assertEquals(other, mu.variancePerUnit(), Tolerances.NUMERICAL * Math.max(1, Math.abs(other)));
                }
            }
            assertEquals(2 * 60 + (o instanceof Objective.TargetReturn ? 2 : 1), auto.multipliers().size());
        }
    }

    @Test
    void bindingBoundsLeaveItToTheBoundedMethods() {
        Mandate longOnly = FactorModels.boxed(60, 0.0, 0.04);
        Solution auto = solve(longOnly, Objective.minimumVariance(), Method.AUTO);
        assertEquals(Method.CRITICAL_LINE, auto.method());
        assertTrue(auto.binding().stream().anyMatch(m -> m.constraint().startsWith("upper:")
                || m.constraint().startsWith("lower:")));
    }
}

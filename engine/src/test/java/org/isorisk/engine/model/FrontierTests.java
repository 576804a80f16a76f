package org.isorisk.engine.model;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import org.junit.jupiter.api.Test;

class FrontierTests {

    @Test
    void theShortConstructorsKeepTheirMeaning() {
        Frontier f = new Frontier(List.of(), List.of(), null, 0.02, 0.07);
        assertTrue(f.inefficientCorners().isEmpty());
        assertTrue(f.rejected().isEmpty());
        assertEquals(0.02, f.lowestReturn(), 0.0);
        assertThrows(IllegalStateException.class, () -> f.at(0.03));
        Solution s = new Solution(Method.CRITICAL_LINE, List.of("A"), new double[] {1}, 0.05, 0.04, 0.2, List.of(),
                new Certificate(0, 0, 0, 0, 1, 1e-7, true), List.of());
        Corner c = new Corner(s, null, "min-variance", "Minimum-variance portfolio.");
        assertTrue(c.free().isEmpty());
        assertEquals(0.0, c.returnMultiplier(), 0.0);
        assertThrows(IllegalArgumentException.class, () -> new RejectedTarget(0.1, " "));
    }
}

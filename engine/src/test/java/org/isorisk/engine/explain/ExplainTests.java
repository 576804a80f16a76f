package org.isorisk.engine.explain;

import static org.junit.jupiter.api.Assertions.assertEquals;

import org.isorisk.engine.model.Multiplier;
import org.junit.jupiter.api.Test;

class ExplainTests {

    @Test
    void aGroupLimitReadsAsTheGroupsMinimumOrMaximum() {
        // ∂σ*/∂h = 5 per unit: a 1 % step (0.01) moves volatility by 0.05 = 5.00 %, to first order.
        assertEquals("Raising the minimum of group Equity by 1.00 % raises volatility by 5.00 %.",
                Explain.sentence(new Multiplier("group:Equity:min", 0.5, 5.0, true)));
        assertEquals("Raising the maximum of group Fixed Income by 1.00 % lowers volatility by 0.02 %.",
                Explain.sentence(new Multiplier("group:Fixed Income:max", -0.001, -0.02, true)));
    }

    @Test
    void theReturnTargetSentenceNamesTheMarginalRisk() {
        assertEquals("Raising the return target by 0.10 % raises volatility by 0.26 % (the marginal risk of "
                + "tightening the return target).", Explain.sentence(new Multiplier("target_return", 0.34, 2.6, true)));
    }

    @Test
    void aSlackLimitSaysSo() {
        assertEquals("The upper limit of Cash is not binding: moving it a little changes nothing.",
                Explain.sentence(new Multiplier("upper:Cash", 0, 0, false)));
    }

    @Test
    void aTinyButNonZeroEffectIsNotShownAsZero() {
        // 0.002 volatility per unit × a 1 % step = 0.002 %: printed as "less than 0.01 %", never as "0.00 %".
        assertEquals("Raising the upper limit of Cash by 1.00 % lowers volatility by less than 0.01 %.",
                Explain.sentence(new Multiplier("upper:Cash", -0.0001, -0.002, true)));
    }
}

package org.isorisk.engine.explain;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.util.List;
import java.util.Map;
import org.isorisk.engine.model.Group;
import org.isorisk.engine.model.LinearConstraint;
import org.isorisk.engine.model.Mandate;
import org.isorisk.engine.model.Relation;
import org.junit.jupiter.api.Test;

class MandateWordsTests {

    private static final List<String> ASSETS = List.of("Cash", "Government Bonds", "Domestic Equity", "Emerging Equity");

    @Test
    void theBudgetAloneSaysShortPositionsAreAllowed() {
        assertEquals(List.of("Fully invested: the weights add up to 100.00 %.",
                        "No limits on single assets: short positions (negative weights) are allowed."),
                MandateWords.describe(Mandate.fullyInvested(4), ASSETS));
    }

    @Test
    void theMostCommonLimitsAreStatedOnceAndTheExceptionsByName() {
        double[] lo = {0, 0.10, 0, 0};
        double[] hi = {0.35, 0.60, 0.35, 0.35};
        Mandate m = new Mandate(1.0, lo, hi, Map.of(), List.of(new Group("Equity", List.of(2, 3), 0.30, 0.60)), List.of());
        assertEquals(List.of("Fully invested: the weights add up to 100.00 %.",
                "Each asset not named below: between 0.00 % and 35.00 %.",
                "Government Bonds: between 10.00 % and 60.00 %.",
                "Group Equity (Domestic Equity, Emerging Equity): between 30.00 % and 60.00 % in total."),
                MandateWords.describe(m, ASSETS));
    }

    @Test
    void fixedWeightsOneSidedLimitsAndFurtherLimitsAreSpelledOut() {
        double[] lo = {Double.NEGATIVE_INFINITY, -0.05, 0.02, 0.02};
        double[] hi = {0.5, Double.POSITIVE_INFINITY, Double.POSITIVE_INFINITY, Double.POSITIVE_INFINITY};
        LinearConstraint c = new LinearConstraint("risky", new double[]{0, 0, 1, 0.5}, Relation.AT_MOST, 0.4);
        Mandate m = new Mandate(0.98, lo, hi, Map.of(0, 0.02), List.of(), List.of(c));
        assertEquals(List.of("The weights add up to 98.00 %.",
                "Each asset not named below: at least 2.00 %.",
                "Government Bonds: at least -5.00 %.",
                "Assets with a negative lower limit may be held short down to that limit.",
                "Cash is held at exactly 2.00 %.",
                "Further limit risky: Domestic Equity + 0.5 × Emerging Equity is at most 40.00 %."),
                MandateWords.describe(m, ASSETS));
    }
}

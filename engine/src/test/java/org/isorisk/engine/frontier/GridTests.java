package org.isorisk.engine.frontier;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;

import org.isorisk.engine.Tolerances;
import org.isorisk.engine.error.InputException;
import org.junit.jupiter.api.Test;

class GridTests {

    @Test
    void explicitTargetsIncludeBothEndsWhenTheStepLandsOnThem() {
        assertArrayEquals(new double[] {0.03, 0.035, 0.04, 0.045, 0.05}, Grid.parse("0.03:0.05:0.005").targets(0, 1),
                Tolerances.TIGHT);
        assertArrayEquals(new double[] {0.03, 0.05}, Grid.parse("0.03:0.06:0.02").targets(0, 1), Tolerances.TIGHT);
    }

    @Test
    void evenlySpacedPointsRunBetweenTheGivenEnds() {
        assertArrayEquals(new double[] {0.02, 0.03, 0.04}, Grid.points(3).targets(0.02, 0.04), Tolerances.TIGHT);
        assertArrayEquals(new double[] {0.02}, Grid.points(1).targets(0.02, 0.04), 0.0);
        assertEquals(0, Grid.none().targets(0.02, 0.04).length);
    }

    @Test
    void badTargetTextIsRefusedWithAFix() {
        InputException e = assertThrows(InputException.class, () -> Grid.parse("0.03-0.05"));
        assertEquals("targets must be written from:to:step (value '0.03-0.05'); fix: e.g. 0.03:0.07:0.005 for 3 % to "
                + "7 % in steps of 0.5 %", e.getMessage());
        e = assertThrows(InputException.class, () -> Grid.parse("0.05:0.03:0.01"));
        assertEquals("the targets' end is below their start (value '0.05:0.03:0.01'); fix: write from:to:step with "
                + "from at most to", e.getMessage());
        e = assertThrows(InputException.class, () -> Grid.parse("0.03:0.05:0"));
        assertEquals("targets need a finite start and end and a positive step (value '0.03:0.05:0.0'); fix: write "
                + "targets as from:to:step, e.g. 0.03:0.07:0.005", e.getMessage());
        assertThrows(InputException.class, () -> Grid.parse("a:b:c"));
        assertThrows(InputException.class, () -> Grid.points(-1));
    }
}

package org.isorisk.cli.render;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.PrintWriter;
import java.io.StringWriter;
import java.time.Duration;
import java.util.List;
import org.isorisk.engine.stress.StressProgress;
import org.junit.jupiter.api.Test;

/** Progress of the pack's steps on stderr: what is printed, and when. */
class StepProgressTests {

    @Test
    void offATerminalEachUpdateIsOnePlainLine() {
        StringWriter err = new StringWriter();
        try (StepProgress p = new StepProgress(new PrintWriter(err, true), false, "pack", Duration.ZERO, false)) {
            p.step("sampling the frontier");
            StressProgress s = p.counted("stress scenarios at the targets");
            for (int d = 1; d <= 20; d++) {
                s.step(d, 20, "ignored");
            }
            s.step(20, 20, "late count of the same step is harmless");
            p.step("drawing the charts");
        }
        List<String> lines = err.toString().lines().toList();
        assertEquals("pack: sampling the frontier ...", lines.get(0));
        assertTrue(lines.get(1).matches("pack: sampling the frontier done in \\d+\\.\\d s"), lines.get(1));
        assertEquals("pack: stress scenarios at the targets ...", lines.get(2));
        // then one line at each tenth of the solves: 2 of 20 (10 %) ... 20 of 20 (100 %)
        for (int k = 1; k <= 10; k++) {
            assertEquals("pack: stress scenarios at the targets: " + 2 * k + " of 20 solves done (" + 10 * k + " %)",
                    lines.get(2 + k));
        }
        assertTrue(lines.get(13).startsWith("pack: stress scenarios at the targets done in "), lines.get(13));
        assertEquals("pack: drawing the charts ...", lines.get(14));
        assertTrue(lines.get(15).startsWith("pack: drawing the charts done in "), lines.get(15));
        assertEquals(16, lines.size());
        assertFalse(err.toString().contains("\r"), "no control characters in a log");
    }

    @Test
    void aStepShorterThanTheThresholdPrintsNothing() {
        StringWriter err = new StringWriter();
        try (StepProgress p = new StepProgress(new PrintWriter(err, true), false, "pack", Duration.ofHours(1), false)) {
            p.step("solving the portfolios");
            p.counted("stress scenarios along the frontier").step(5, 10, "x");
            p.step("drawing the charts");
        }
        assertEquals("", err.toString());
    }

    @Test
    void aSilentLongStepIsAnnouncedByTheTimerThread() throws InterruptedException {
        StringWriter err = new StringWriter();
        try (StepProgress p = new StepProgress(new PrintWriter(err, true), false, "pack", Duration.ofMillis(50), true)) {
            p.step("drawing the charts");
            for (int k = 0; k < 100 && !err.toString().contains("drawing the charts ..."); k++) {
                Thread.sleep(20); // waits for the timer (at most 2 s), no timing asserted
            }
        }
        assertTrue(err.toString().startsWith("pack: drawing the charts ...\npack: drawing the charts done in "),
                err.toString());
    }

    @Test
    void onATerminalTheLineIsRedrawnInPlaceAndEndsOnAFreshLine() {
        StringWriter err = new StringWriter();
        try (StepProgress p = new StepProgress(new PrintWriter(err, true), true, "demo", Duration.ZERO, false)) {
            p.step("writing the pack folder");
        }
        String s = err.toString();
        // drawn with the time so far, cleared, then the step's time on a line of its own
        assertTrue(s.matches("\\rdemo: writing the pack folder, \\d+\\.\\d s *\\r *\\r"
                + "demo: writing the pack folder done in \\d+\\.\\d s\\n"), s);
    }
}

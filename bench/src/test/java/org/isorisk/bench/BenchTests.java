package org.isorisk.bench;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.ByteArrayOutputStream;
import java.io.PrintStream;
import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** Fast checks of the benchmark harness (the benchmark itself is run by bench/run, never by the build). */
class BenchTests {

    @Test
    void listNamesEveryRegisteredCase() {
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        ByteArrayOutputStream err = new ByteArrayOutputStream();
        int code = Bench.run(new String[] {"list"}, print(out), print(err));
        assertEquals(0, code);
        String text = out.toString(StandardCharsets.UTF_8);
        for (String name : Cases.all().keySet()) {
            assertTrue(text.contains(name), text);
        }
        assertTrue(text.startsWith("closed-form "), text);
    }

    @Test
    void unknownCasesAndOptionsAreUsageErrors() {
        ByteArrayOutputStream err = new ByteArrayOutputStream();
        assertEquals(2, Bench.run(new String[] {"no-such-case"}, print(new ByteArrayOutputStream()), print(err)));
        assertEquals("bench: unknown case 'no-such-case' (bench/run list shows the cases)\n",
                err.toString(StandardCharsets.UTF_8));
        ByteArrayOutputStream err2 = new ByteArrayOutputStream();
        assertEquals(2, Bench.run(new String[] {"closed-form", "--sizes", "ten"}, print(new ByteArrayOutputStream()),
                print(err2)));
        assertTrue(err2.toString(StandardCharsets.UTF_8).startsWith("bench: --sizes takes a whole number, not 'ten'"));
    }

    @Test
    void aTinyRunOfTheClosedFormCasePrintsItsTable() {
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        int code = Bench.run(new String[] {"closed-form", "--sizes", "20", "--reps", "1", "--warmup", "0",
                "--no-reference"}, print(out), print(new ByteArrayOutputStream()));
        assertEquals(0, code);
        String text = out.toString(StandardCharsets.UTF_8);
        assertTrue(text.contains("java ms"), text);
        assertTrue(text.lines().anyMatch(l -> l.trim().startsWith("20 ")), text);
        assertTrue(!text.contains("WARNING"), text);
    }

    @Test
    void aTinyRunOfTheCriticalLineCasePrintsItsTable() {
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        int code = Bench.run(new String[] {"critical-line", "--sizes", "30", "--reps", "1", "--warmup", "0",
                "--no-reference"}, print(out), print(new ByteArrayOutputStream()));
        assertEquals(0, code);
        String text = out.toString(StandardCharsets.UTF_8);
        assertTrue(text.contains("frontier ms"), text);
        assertTrue(text.lines().anyMatch(l -> l.trim().startsWith("30 ")), text);
        assertTrue(!text.contains("WARNING"), text);
    }

    @Test
    void aTinyRunOfTheParametricCasePrintsItsTable() {
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        int code = Bench.run(new String[] {"parametric", "--sizes", "12", "--reps", "1", "--warmup", "0",
            "--no-reference"}, print(out), print(new ByteArrayOutputStream()));
        assertEquals(0, code);
        String text = out.toString(StandardCharsets.UTF_8);
        assertTrue(text.contains("exact ms"), text);
        assertTrue(text.lines().anyMatch(l -> l.trim().startsWith("12 bench")), text);
        assertTrue(text.lines().anyMatch(l -> l.trim().startsWith("12 market")), text);
        assertTrue(!text.contains("WARNING"), text);
    }

    @Test
    void aTinyRunOfTheQpCasePrintsItsTable() {
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        int code = Bench.run(new String[] {"qp", "--sizes", "40", "--reps", "1", "--warmup", "0", "--no-reference"},
                print(out), print(new ByteArrayOutputStream()));
        assertEquals(0, code);
        String text = out.toString(StandardCharsets.UTF_8);
        assertTrue(text.contains("minvar ms"), text);
        assertTrue(text.lines().anyMatch(l -> l.trim().startsWith("40 ")), text);
        assertTrue(!text.contains("WARNING"), text);
    }

    @Test
    void aTinyRunOfTheEstimateCasePrintsItsTableWithTheReadEstimateSplit() {
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        int code = Bench.run(new String[] {"estimate", "--sizes", "5", "--reps", "1", "--warmup", "0"}, print(out),
                print(new ByteArrayOutputStream()));
        assertEquals(0, code);
        String text = out.toString(StandardCharsets.UTF_8);
        assertTrue(text.contains("read ms") && text.contains("lw-id ms") && text.contains("read%"), text);
        // 2,600 dates for 5 assets
        assertTrue(text.lines().anyMatch(l -> l.trim().startsWith(EstimateCase.ROWS + " ") && l.contains(" 5 ")),
                text);
    }

    @Test
    void theInventedHistoryIsReproducibleAndOnWeekdaysOnly(@TempDir Path dir) throws Exception {
        Path a = dir.resolve("a.csv");
        Path b = dir.resolve("b.csv");
        EstimateCase.writeHistory(a, 30, 3, 7);
        EstimateCase.writeHistory(b, 30, 3, 7);
        assertEquals(Files.readString(a), Files.readString(b));
        var lines = Files.readAllLines(a);
        assertEquals("date,Asset 1,Asset 2,Asset 3", lines.get(0));
        assertEquals(31, lines.size());
        for (String l : lines.subList(1, lines.size())) {
            java.time.DayOfWeek d = java.time.LocalDate.parse(l.substring(0, 10)).getDayOfWeek();
            assertTrue(d != java.time.DayOfWeek.SATURDAY && d != java.time.DayOfWeek.SUNDAY, l);
        }
    }

    @Test
    void qpTargetsLieStrictlyBetweenTheMinimumVarianceReturnAndTheHighest() {
        double[] t = QpCase.targets(new org.isorisk.engine.model.ReturnRange(0.01, 0.09, new double[] {1, 0},
                new double[] {0, 1}), 0.03);
        assertEquals(QpCase.TARGETS, t.length);
        for (int k = 0; k < t.length; k++) {
            assertTrue(t[k] > 0.03 && t[k] < 0.09, "target " + k + " = " + t[k]);
            assertTrue(k == 0 || t[k] > t[k - 1]);
        }
    }

    @Test
    void theCriticalLineVerdictAppliesIssueThreesBudgetsAtFiveHundredAndTwoThousandOnly() {
        HeapProbe.Report fits = new HeapProbe.Report(true, (2L << 30) - 1, 1L << 28, 40, 0, 3.0, "");
        HeapProbe.Report full = new HeapProbe.Report(true, 2L << 30, 1L << 30, 40, 2, 3.0, "");
        HeapProbe.Report failed = new HeapProbe.Report(false, 0, 0, 0, 0, Double.NaN, "OutOfMemoryError");
        assertEquals("met", CriticalLineCase.verdict(500, 0.19, null, 1e-12));
        assertEquals("MISSED", CriticalLineCase.verdict(500, 0.21, null, 1e-12));
        assertEquals("MISSED", CriticalLineCase.verdict(500, 0.1, null, 1e-8));
        assertEquals("met", CriticalLineCase.verdict(2000, 4.9, fits, 1e-12));
        assertEquals("MISSED", CriticalLineCase.verdict(2000, 4.9, full, 1e-12));
        assertEquals("MISSED", CriticalLineCase.verdict(2000, 4.9, failed, 1e-12));
        assertEquals("MISSED", CriticalLineCase.verdict(2000, 4.9, null, 1e-12));
        assertEquals("MISSED", CriticalLineCase.verdict(2000, 5.1, fits, 1e-12));
        assertEquals("-", CriticalLineCase.verdict(1000, 100, failed, 1));
    }

    @Test
    void theStressTargetsRunEvenlyFromTenToNinetyFivePercentOfTheReturnRange() {
        double[] t = RebalanceStressCase.targets(new double[] {0.01, 0.11});
        assertEquals(RebalanceStressCase.TARGETS, t.length);
        assertEquals(0.02, t[0], 1e-15); // 0.01 + 10 % of the 0.10 range
        assertEquals(0.105, t[t.length - 1], 1e-15); // 0.11 - 5 % of the range
        for (int k = 1; k < t.length; k++) {
            assertEquals(0.085 / (t.length - 1), t[k] - t[k - 1], 1e-15);
        }
        assertEquals(5, RebalanceStressCase.scenarios(10).size());
    }

    @Test
    void matricesAreWrittenAsLittleEndianRowMajorDoubles(@TempDir Path dir) throws Exception {
        double[][] m = {{1.5, -2.0}, {3.25, 1e-300}};
        Path f = dir.resolve("m.f8");
        NumpyReference.writeMatrix(f, m);
        ByteBuffer b = ByteBuffer.wrap(Files.readAllBytes(f)).order(ByteOrder.LITTLE_ENDIAN);
        assertEquals(32, b.capacity());
        assertEquals(1.5, b.getDouble(0));
        assertEquals(-2.0, b.getDouble(8));
        assertEquals(3.25, b.getDouble(16));
        assertEquals(1e-300, b.getDouble(24));
    }

    private static PrintStream print(ByteArrayOutputStream o) {
        return new PrintStream(o, true, StandardCharsets.UTF_8);
    }
}

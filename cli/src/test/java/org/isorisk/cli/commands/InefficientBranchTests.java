package org.isorisk.cli.commands;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import java.util.ArrayList;
import java.util.List;
import org.isorisk.cli.Endowment;
import org.isorisk.cli.Run;
import org.isorisk.engine.model.Branch;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * Targets below the minimum-variance return lie on the inefficient branch, where the return target's shadow price is
 * negative; under group limits (solved by the active-set QP, not the critical line method) {@code frontier} and
 * {@code stress} say so, as they do under bounds alone. The invented endowment's policy has five groups; its
 * minimum-variance return is 4.91 %, so 4.75 % lies below it.
 */
class InefficientBranchTests {

    @TempDir
    java.nio.file.Path dir;

    private static List<String> inputs(String command, String... more) {
        List<String> a = new ArrayList<>(List.of(command, "--expected-returns",
                Endowment.file("expected_returns.csv").toString(), "--covariance",
                Endowment.file("covariance.csv").toString(), "--policy", Endowment.file("policy.yaml").toString()));
        a.addAll(List.of(more));
        return a;
    }

    private static List<String> notes(JsonNode o) {
        List<String> out = new ArrayList<>();
        o.get("notes").forEach(n -> out.add(n.asText()));
        return out;
    }

    @Test
    void theFrontierUnderGroupLimitsSaysWhichTargetsAreOnTheInefficientBranch() {
        Run r = Run.of(inputs("frontier", "--targets", "0.0475:0.0575:0.005", "--format", "json")
                .toArray(String[]::new));
        assertEquals(0, r.code(), r.toString());
        JsonNode o = r.json();
        assertEquals("numerical", o.get("method").asText());
        JsonNode points = o.get("points");
        assertEquals(3, points.size());
        // the return target's price: negative below the minimum-variance return, positive above (envelope theorem)
        assertTrue(points.get(0).at("/return_multiplier/volatility_per_unit").asDouble() < 0);
        assertTrue(points.get(1).at("/return_multiplier/volatility_per_unit").asDouble() > 0);
        assertTrue(notes(points.get(0)).contains(Branch.INEFFICIENT_NOTE), notes(points.get(0)).toString());
        assertFalse(notes(points.get(1)).contains(Branch.INEFFICIENT_NOTE));
        assertFalse(notes(points.get(2)).contains(Branch.INEFFICIENT_NOTE));
        Run table = Run.of(inputs("frontier", "--targets", "0.0475:0.0575:0.005").toArray(String[]::new));
        assertTrue(table.out().replaceAll("\\s+", " ").contains("At 4.75 %: " + Branch.INEFFICIENT_NOTE), table.out());
        assertFalse(table.out().contains("At 5.25 %: This portfolio is on the inefficient"), table.out());
    }

    @Test
    void oneSolveUnderGroupLimitsSaysItToo() {
        Run low = Run.of(inputs("solve", "--target-return", "0.0475", "--format", "json").toArray(String[]::new));
        assertEquals(0, low.code(), low.toString());
        assertTrue(notes(low.json()).contains(Branch.INEFFICIENT_NOTE), notes(low.json()).toString());
        Run high = Run.of(inputs("solve", "--target-return", "0.06", "--format", "json").toArray(String[]::new));
        assertFalse(notes(high.json()).contains(Branch.INEFFICIENT_NOTE));
    }

    @Test
    void theStressSweepUnderGroupLimitsSaysWhichTargetsAreOnTheInefficientBranch() {
        String scenarios = Run.file(dir, "up.yaml", """
                scenarios:
                  - name: all-returns-up
                    description: every expected return half a point higher (invented)
                    shocks:
                      - return: {scope: all, shift: 0.005}
                """);
        Run r = Run.of(inputs("stress", "--targets", "0.0475:0.0575:0.005", "--scenarios", scenarios, "--quiet")
                .toArray(String[]::new));
        assertEquals(0, r.code(), r.toString());
        String base = "Under today's assumptions, the target 4.75 % lies below the minimum-variance return, on the "
                + "inefficient branch of the frontier: the marginal risk is negative there (raising the target lowers "
                + "the least risk), and another portfolio of the mandate has the same risk with a higher expected "
                + "return.";
        assertTrue(r.out().replaceAll("\\s+", " ").contains(base), r.out());
        assertTrue(r.out().contains("(inefficient branch)"), "the negative marginal risk is marked in the table");
        // under the scenario the returns run from 5.14 % and the minimum-variance return is 5.41 %: 4.75 % is out of
        // reach, 5.25 % on the inefficient branch, 5.75 % efficient
        assertTrue(r.out().replaceAll("\\s+", " ").contains("Under scenario all-returns-up, the target 5.25 % lies "
                + "below the minimum-variance return"), r.out());
        Run json = Run.of(inputs("stress", "--targets", "0.0475:0.0575:0.005", "--scenarios", scenarios, "--quiet",
                "--format", "json").toArray(String[]::new));
        JsonNode o = json.json();
        assertTrue(notes(o).contains(base), notes(o).toString());
        Run csv = Run.of(inputs("stress", "--targets", "0.0475:0.0575:0.005", "--quiet", "--format", "csv")
                .toArray(String[]::new));
        assertTrue(csv.out().contains("# note: " + base), csv.out());
        // above the minimum-variance return nothing is said
        Run above = Run.of(inputs("stress", "--targets", "0.05:0.06:0.005", "--quiet").toArray(String[]::new));
        assertFalse(above.out().contains("inefficient"), above.out());
    }
}

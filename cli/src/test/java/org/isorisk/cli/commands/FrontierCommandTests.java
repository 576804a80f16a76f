package org.isorisk.cli.commands;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import org.isorisk.cli.Run;
import org.isorisk.engine.explain.Caution;
import org.isorisk.engine.frontier.Frontiers;
import org.isorisk.engine.frontier.Grid;
import org.isorisk.engine.io.Csv;
import org.isorisk.engine.io.CsvTable;
import org.isorisk.engine.io.LoadedUniverse;
import org.isorisk.engine.io.PolicyReader;
import org.isorisk.engine.io.UniverseFiles;
import org.isorisk.engine.io.UniverseLoader;
import org.isorisk.engine.model.Corner;
import org.isorisk.engine.model.Frontier;
import org.isorisk.engine.model.Mandate;
import org.isorisk.engine.model.Solution;
import org.isorisk.engine.solve.Allocator;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** {@code isorisk frontier}: the JSON parsed back against the engine's frontier, the table, the CSV and errors. */
class FrontierCommandTests {

    @TempDir
    Path dir;

    String mu;
    String cov;
    String bounds;
    String policy;

    @BeforeEach
    void sample() throws IOException {
        Run.sample(dir);
        Files.copy(Run.SAMPLE.resolve("policy.yaml"), dir.resolve("policy.yaml"));
        mu = dir.resolve("expected_returns.csv").toString();
        cov = dir.resolve("covariance.csv").toString();
        policy = dir.resolve("policy.yaml").toString();
        bounds = Run.file(dir, "bounds.yaml", "bounds:\n  default: {min: 0.0, max: 0.35}\n");
    }

    private LoadedUniverse universe() {
        return UniverseLoader.load(UniverseFiles.of(Path.of(mu), Path.of(cov)));
    }

    private Mandate mandate(String file) {
        return PolicyReader.read(Path.of(file), universe().assets()).mandate();
    }

    private static void sameSolution(Solution s, JsonNode j) {
        assertEquals(s.method().label(), j.get("method").asText());
        assertEquals(s.expectedReturn(), j.get("expected_return").doubleValue());
        assertEquals(s.variance(), j.get("variance").doubleValue());
        assertEquals(s.volatility(), j.get("volatility").doubleValue());
        for (int i = 0; i < s.assets().size(); i++) {
            assertEquals(s.weight(i), j.get("weights").get(s.assets().get(i)).doubleValue(), s.assets().get(i));
        }
        double price = s.multiplier("target_return").map(m -> m.variancePerUnit()).orElse(0.0);
        assertEquals(price, j.get("return_multiplier").get("variance_per_unit").doubleValue());
        assertEquals(s.multipliers().size(), j.get("multipliers").size());
        assertTrue(j.get("certificate").get("passes").asBoolean());
    }

    /** Volatility strictly increasing in the target above the minimum-variance return (Markowitz 1956). */
    private static void increasingAboveMinimumVariance(JsonNode points, double mvReturn) {
        double last = Double.NEGATIVE_INFINITY;
        double lastVol = Double.NEGATIVE_INFINITY;
        int seen = 0;
        for (JsonNode p : points) {
            double m = p.get("expected_return").doubleValue();
            double v = p.get("volatility").doubleValue();
            if (m < mvReturn - 1e-12) {
                continue;
            }
            assertTrue(m > last, "targets increase");
            if (seen > 0) {
                assertTrue(v > lastVol, "volatility " + v + " at " + m + " after " + lastVol);
            }
            last = m;
            lastVol = v;
            seen++;
        }
        assertTrue(seen >= 3, "at least three efficient points");
    }

    @Test
    void theJsonCarriesTheEnginesExactMandateFrontier() {
        Run r = Run.of("frontier", "--expected-returns", mu, "--covariance", cov, "--policy", bounds, "--points", "9",
                "--format", "json");
        assertEquals(0, r.code(), r.toString());
        assertEquals("", r.err());
        JsonNode j = r.json();
        Frontier f = Allocator.mandateFrontier(universe().universe(), mandate(bounds),
                range -> Grid.points(9).targets(range[1], range[2]), false, null);
        assertEquals("optimal", j.get("status").asText());
        assertEquals("critical-line", j.get("method").asText());
        assertTrue(j.get("corners_exact").asBoolean());
        assertEquals(f.corners().size(), j.get("corners").size());
        for (int k = 0; k < f.corners().size(); k++) {
            Corner c = f.corners().get(k);
            JsonNode e = j.get("corners").get(k);
            sameSolution(c.portfolio(), e);
            assertEquals(c.change(), e.get("change").asText());
            assertEquals(c.description(), e.get("description").asText());
            assertEquals(c.asset() == null ? "null" : c.asset(), e.get("asset").asText());
        }
        assertEquals(9, j.get("points").size());
        for (int k = 0; k < 9; k++) {
            sameSolution(f.points().get(k), j.get("points").get(k));
            double m = f.points().get(k).expectedReturn();
            assertEquals(f.unconstrained().volatility(m), j.get("points").get(k).get("unconstrained_volatility")
                    .doubleValue());
            assertEquals(f.unconstrained().volatility(m), j.get("unconstrained").get("points").get(k)
                    .get("volatility").doubleValue());
        }
        assertEquals(f.minReturn(), j.get("range").get("minimum_variance").doubleValue());
        assertEquals(f.maxReturn(), j.get("range").get("highest").doubleValue());
        assertEquals(f.lowestReturn(), j.get("range").get("lowest").doubleValue());
        assertEquals(f.unconstrained().a(), j.get("unconstrained").get("a").doubleValue());
        assertEquals(0, j.get("rejected").size());
        assertTrue(j.get("timing_ms").get("frontier").isNumber());
        assertTrue(j.get("timing_ms").get("total").isNumber());
        assertEquals(Caution.TEXT, j.get("caution").asText());
        increasingAboveMinimumVariance(j.get("points"), f.minReturn());
        increasingAboveMinimumVariance(j.get("corners"), f.minReturn());
    }

    @Test
    void theUnconstrainedFrontierIsNeverRiskierThanTheMandatesAtTheSameReturn() {
        Run r = Run.of("frontier", "--expected-returns", mu, "--covariance", cov, "--policy", bounds, "--format", "json");
        assertEquals(0, r.code(), r.toString());
        assertEquals(FrontierCommand.DEFAULT_POINTS, r.json().get("points").size());
        // dropping constraints cannot raise the minimum (a relaxation); a hand-checkable consequence of optimality
        for (JsonNode p : r.json().get("points")) {
            assertTrue(p.get("unconstrained_volatility").doubleValue() <= p.get("volatility").doubleValue() + 1e-12);
        }
    }

    @Test
    void targetsOutsideTheRangeAreListedAsRefusedWithTheReason() {
        Run r = Run.of("frontier", "--expected-returns", mu, "--covariance", cov, "--policy", bounds, "--targets",
                "0.03:0.09:0.01", "--format", "json");
        assertEquals(0, r.code(), r.toString());
        JsonNode j = r.json();
        assertEquals(5, j.get("points").size());
        assertEquals(2, j.get("rejected").size());
        assertEquals(0.08, j.get("rejected").get(0).get("target").doubleValue(), 1e-15);
        assertEquals("target return 8.00 % is above the highest return the mandate allows, 7.43 % (Domestic Equity "
                + "at its upper bound 35.00 %, Emerging Equity at its upper bound 35.00 %, Foreign Developed Equity "
                + "30.00 %, every other asset at its lower bound); achievable returns run from 2.95 % to 7.43 %; fix: "
                + "choose a target of at most 7.43 % or loosen the upper bounds",
                j.get("rejected").get(0).get("reason").asText());
        // 3 % lies below the minimum-variance return: solved on the inefficient branch, with a negative price
        JsonNode low = j.get("points").get(0);
        assertEquals(0.03, low.get("expected_return").doubleValue(), 1e-12);
        assertTrue(low.get("return_multiplier").get("variance_per_unit").doubleValue() < 0);
        Run table = Run.of("frontier", "--expected-returns", mu, "--covariance", cov, "--policy", bounds, "--targets",
                "0.03:0.09:0.01");
        String flat = table.out().replaceAll("\\s+", " ");
        assertTrue(flat.contains("Targets refused (outside what the mandate allows): - 8.00 %: target return 8.00 % "
                + "is above the highest return"), table.out());
        assertTrue(flat.contains("As the target falls below"), table.out());
        assertTrue(flat.contains("Caution: " + Caution.TEXT), table.out());
    }

    @Test
    void aMandateWithGroupsIsSampledByTheWarmStartedQpAndSaysThatCornersAreNotExact() {
        Run r = Run.of("frontier", "--expected-returns", mu, "--covariance", cov, "--policy", policy, "--points", "7",
                "--format", "json");
        assertEquals(0, r.code(), r.toString());
        JsonNode j = r.json();
        Frontier f = Frontiers.sampled(universe().universe(), mandate(policy), Grid.points(7), null);
        assertEquals("numerical", j.get("method").asText());
        assertFalse(j.get("corners_exact").asBoolean());
        assertEquals(0, j.get("corners").size());
        assertEquals(7, j.get("points").size());
        for (int k = 0; k < 7; k++) {
            sameSolution(f.points().get(k), j.get("points").get(k));
        }
        assertTrue(j.get("notes").toString().contains("Corner portfolios are not computed for this mandate"));
        increasingAboveMinimumVariance(j.get("points"), f.minReturn());
        // each point agrees with a cold-started solve of the same target (NUMERICAL: the QP's tolerance)
        Solution cold = Allocator.solve(org.isorisk.engine.model.AllocationRequest.of(universe().universe(),
                mandate(policy), org.isorisk.engine.model.Objective.targetReturn(f.points().get(3).expectedReturn())));
        for (int i = 0; i < cold.assets().size(); i++) {
            assertEquals(cold.weight(i), f.points().get(3).weight(i), 1e-7);
        }
    }

    @Test
    void withoutAPolicyTheFrontierIsTheClosedFormHyperbola() {
        Run r = Run.of("frontier", "--expected-returns", mu, "--covariance", cov, "--points", "5", "--format", "json");
        assertEquals(0, r.code(), r.toString());
        JsonNode j = r.json();
        assertEquals("closed-form", j.get("method").asText());
        assertEquals(0, j.get("corners").size());
        for (JsonNode p : j.get("points")) {
            // the mandate is the budget alone: the frontier is the unconstrained one (Merton 1972)
            assertEquals(p.get("unconstrained_volatility").doubleValue(), p.get("volatility").doubleValue(), 1e-10);
        }
        assertTrue(j.get("notes").toString().contains(Allocator.SHORTS_NOTE));
    }

    @Test
    void theCsvHasOneRowPerCornerAndPointAndReadsBack() throws IOException {
        Path out = dir.resolve("f.csv");
        Run r = Run.of("frontier", "--expected-returns", mu, "--covariance", cov, "--policy", bounds, "--points", "4",
                "--format", "csv", "--out", out.toString());
        assertEquals(0, r.code(), r.toString());
        assertEquals("isorisk: wrote " + out + "\n", r.err());
        CsvTable t = Csv.read(out, "frontier");
        Frontier f = Allocator.mandateFrontier(universe().universe(), mandate(bounds),
                range -> Grid.points(4).targets(range[1], range[2]), false, null);
        assertEquals(f.corners().size() + 4, t.rows().size());
        assertEquals(Caution.TEXT, t.meta("caution").orElseThrow().value());
        List<String> header = t.header();
        assertEquals(List.of("kind", "expected_return", "volatility"), header.subList(0, 3));
        assertEquals(universe().assets(), header.subList(9, header.size()));
        int last = t.rows().size() - 1;
        assertEquals("point", t.rows().get(last).cell(0));
        assertEquals(f.points().get(3).volatility(), Double.parseDouble(t.rows().get(last).cell(2)));
    }

    @Test
    void pointsAndTargetsTogetherAreAUsageError() {
        Run r = Run.of("frontier", "--expected-returns", mu, "--covariance", cov, "--points", "3", "--targets",
                "0:1:0.1", "--format", "json");
        assertEquals(2, r.code(), r.toString());
        assertEquals("isorisk: error: give --points N or --targets FROM:TO:STEP, not both (see 'isorisk frontier "
                + "--help')\n", r.err());
        assertEquals("invalid-input", r.json().get("status").asText());
    }

    @Test
    void anInfeasibleMandateExitsThreeWithTheConstraintsInvolved() {
        String p = Run.file(dir, "tight.yaml", "bounds:\n  default: {min: 0.0, max: 0.05}\n");
        Run r = Run.of("frontier", "--expected-returns", mu, "--covariance", cov, "--policy", p, "--format", "json");
        assertEquals(3, r.code(), r.toString());
        assertEquals("infeasible", r.json().get("status").asText());
        assertTrue(r.json().get("constraints").toString().contains("budget"), r.toString());
    }
}

package org.isorisk.cli.commands;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import org.isorisk.cli.Run;
import org.isorisk.engine.explain.Caution;
import org.isorisk.engine.explain.Explain;
import org.isorisk.engine.io.LoadedUniverse;
import org.isorisk.engine.io.PolicyReader;
import org.isorisk.engine.io.UniverseFiles;
import org.isorisk.engine.io.UniverseLoader;
import org.isorisk.engine.model.AllocationRequest;
import org.isorisk.engine.model.Mandate;
import org.isorisk.engine.model.Multiplier;
import org.isorisk.engine.model.Objective;
import org.isorisk.engine.model.ReturnRange;
import org.isorisk.engine.model.Solution;
import org.isorisk.engine.solve.Allocator;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** {@code solve --policy} and {@code --method}: the JSON contract with every constraint, errors and exit codes. */
class SolvePolicyTests {

    @TempDir
    Path dir;

    String mu;
    String cov;
    String policy;

    @BeforeEach
    void sample() throws IOException {
        Run.sample(dir);
        Files.copy(Run.SAMPLE.resolve("policy.yaml"), dir.resolve("policy.yaml"));
        mu = dir.resolve("expected_returns.csv").toString();
        cov = dir.resolve("covariance.csv").toString();
        policy = dir.resolve("policy.yaml").toString();
    }

    private LoadedUniverse universe() {
        return UniverseLoader.load(UniverseFiles.of(Path.of(mu), Path.of(cov)));
    }

    private Mandate mandate(String file) {
        return PolicyReader.read(Path.of(file), universe().assets()).mandate();
    }

    private static List<String> names(JsonNode multipliers) {
        List<String> out = new ArrayList<>();
        multipliers.forEach(m -> out.add(m.get("constraint").asText()));
        return out;
    }

    @Test
    void theSamplePolicyGivesEveryConstraintWithItsShadowPriceAsTheEngineDoes() {
        Run r = Run.of("solve", "--expected-returns", mu, "--covariance", cov, "--policy", policy, "--target-return",
                "0.05", "--format", "json");
        assertEquals(0, r.code(), r.toString());
        JsonNode j = r.json();
        Solution s = Allocator.solve(AllocationRequest.of(universe().universe(), mandate(policy),
                Objective.targetReturn(0.05)));
        assertEquals("optimal", j.get("status").asText());
        assertEquals("numerical", j.get("method").asText()); // groups and a linear limit: the QP
        assertEquals("policy.yaml", j.get("policy").asText());
        JsonNode ms = j.get("multipliers");
        assertEquals(s.multipliers().size(), ms.size());
        for (int k = 0; k < ms.size(); k++) {
            Multiplier m = s.multipliers().get(k);
            assertEquals(m.constraint(), ms.get(k).get("constraint").asText());
            assertEquals(m.variancePerUnit(), ms.get(k).get("variance_per_unit").doubleValue());
            assertEquals(m.binding(), ms.get(k).get("binding").asBoolean());
            assertEquals(Explain.sentence(m), ms.get(k).get("sentence").asText());
        }
        List<String> listed = names(ms);
        for (String c : List.of("budget", "target_return", "lower:Cash", "upper:Cash", "group:Equity:min",
                "group:Equity:max", "group:Real Assets:max", "credit_and_emerging_risk")) {
            assertTrue(listed.contains(c), c + " in " + listed);
        }
        for (int i = 0; i < s.assets().size(); i++) {
            assertEquals(s.weight(i), j.get("weights").get(s.assets().get(i)).doubleValue());
        }
        assertTrue(j.get("certificate").get("passes").asBoolean());
        assertTrue(j.get("inputs").get("files").toString().contains("\"role\":\"policy\""), j.toString());
        assertEquals(Caution.TEXT, j.get("caution").asText());
    }

    @Test
    void theTableListsTheBindingConstraintsWithTheirSentencesAndNamesTheSlackOnes() {
        Run r = Run.of("solve", "--expected-returns", mu, "--covariance", cov, "--policy", policy, "--target-return",
                "0.05");
        assertEquals(0, r.code(), r.toString());
        Solution s = Allocator.solve(AllocationRequest.of(universe().universe(), mandate(policy),
                Objective.targetReturn(0.05)));
        String flat = r.out().replaceAll("\\s+", " ");
        assertTrue(flat.contains("(method: numerical)"), r.out());
        assertTrue(flat.contains("Mandate: policy policy.yaml"), r.out());
        for (Multiplier m : s.multipliers()) {
            if (m.binding()) {
                assertTrue(flat.contains(Explain.sentence(m)), m.constraint());
            } else {
                assertTrue(!flat.contains(Explain.sentence(m)), m.constraint());
            }
        }
        assertTrue(flat.contains("Not binding (shadow price 0, moving their limits a little changes nothing): "
                + "group:Equity:min"), r.out());
        assertTrue(flat.contains("Caution: " + Caution.TEXT), r.out());
    }

    @Test
    void boundsAloneAreSolvedByTheCriticalLineMethodAndMethodForcesTheQp() {
        String bounds = Run.file(dir, "bounds.yaml", "bounds:\n  default: {min: 0.0, max: 0.35}\n");
        Run auto = Run.of("solve", "--expected-returns", mu, "--covariance", cov, "--policy", bounds,
                "--target-return", "0.06", "--format", "json");
        assertEquals(0, auto.code(), auto.toString());
        assertEquals("critical-line", auto.json().get("method").asText());
        Run qp = Run.of("solve", "--expected-returns", mu, "--covariance", cov, "--policy", bounds,
                "--target-return", "0.06", "--method", "numerical", "--format", "json");
        assertEquals(0, qp.code(), qp.toString());
        assertEquals("numerical", qp.json().get("method").asText());
        // the two methods agree on the unique weights (strictly convex problem); NUMERICAL is the QP's tolerance
        for (String a : universe().assets()) {
            assertEquals(auto.json().get("weights").get(a).doubleValue(), qp.json().get("weights").get(a).doubleValue(),
                    1e-7, a);
        }
    }

    @Test
    void thePolicysTargetRuleIsUsedWhenNoTargetIsGivenAndTheOutputSaysSo() {
        String text = "bounds:\n  default: {min: 0.0, max: 0.35}\ntarget_return: 0.055\n";
        String p = Run.file(dir, "target.yaml", text);
        Run r = Run.of("solve", "--expected-returns", mu, "--covariance", cov, "--policy", p, "--format", "json");
        assertEquals(0, r.code(), r.toString());
        JsonNode j = r.json();
        assertEquals("target-return", j.get("objective").get("kind").asText());
        assertEquals(0.055, j.get("objective").get("target_return").doubleValue());
        assertEquals(0.055, j.get("expected_return").doubleValue(), 1e-12);
        assertTrue(j.get("notes").toString().contains("The return target 5.50 % comes from the policy's target_return "
                + "(target.yaml); give --target-return to use another."), j.get("notes").toString());
        Run over = Run.of("solve", "--expected-returns", mu, "--covariance", cov, "--policy", p, "--target-return",
                "0.06", "--format", "json");
        assertEquals(0.06, over.json().get("expected_return").doubleValue(), 1e-12);
        assertTrue(over.json().get("notes").toString().contains("it overrides the policy's target_return 5.50 %"));
    }

    @Test
    void withoutAPolicyShortPositionsAreStillAllowedAndSaidSo() {
        Run r = Run.of("solve", "--expected-returns", mu, "--covariance", cov, "--format", "json");
        assertEquals(0, r.code(), r.toString());
        assertEquals("closed-form", r.json().get("method").asText());
        assertTrue(r.json().get("policy").isNull());
        assertTrue(r.json().get("notes").toString().contains(Allocator.SHORTS_NOTE));
    }

    @Test
    void aPolicyNamingAnUnknownAssetIsRefusedWithItsLineAndKey() {
        String p = Run.file(dir, "bad.yaml", "bounds:\n  default: {min: 0.0, max: 0.35}\n  assets:\n"
                + "    Domestic Equty: {max: 0.30}\n");
        Run r = Run.of("solve", "--expected-returns", mu, "--covariance", cov, "--policy", p, "--format", "json");
        assertEquals(2, r.code(), r.toString());
        String msg = p + ", line 4, key 'bounds.assets.Domestic Equty': unknown asset 'Domestic Equty' (value "
                + "'Domestic Equty'); fix: did you mean 'Domestic Equity'? Asset names must match the expected-returns "
                + "file exactly";
        assertEquals("isorisk: error: " + msg + "\n", r.err());
        assertEquals("invalid-input", r.json().get("status").asText());
        assertEquals(msg, r.json().get("error").asText());
    }

    @Test
    void anUnreachableTargetExitsThreeWithTheAchievableRangeAndTheEndPortfolio() {
        Run r = Run.of("solve", "--expected-returns", mu, "--covariance", cov, "--policy", policy, "--target-return",
                "0.09", "--format", "json");
        assertEquals(3, r.code(), r.toString());
        ReturnRange range = Allocator.returnRange(universe().universe(), mandate(policy));
        JsonNode j = r.json();
        assertEquals("infeasible", j.get("status").asText());
        assertEquals("infeasible", j.get("reason").asText());
        assertEquals("[\"target_return\"]", j.get("constraints").toString());
        assertEquals(range.min(), j.get("range").get("min").doubleValue());
        assertEquals(range.max(), j.get("range").get("max").doubleValue());
        double[] end = range.maxPortfolio();
        List<String> assets = universe().assets();
        for (int i = 0; i < assets.size(); i++) {
            assertEquals(end[i], j.get("end_portfolio").get(assets.get(i)).doubleValue(), assets.get(i));
        }
        String msg = "the target return 9.00 % is above the highest expected return the mandate allows, 6.32 % "
                + "(achievable range 4.33 % to 6.32 %); the portfolio at that end holds Domestic Equity 30.00 %, "
                + "Foreign Developed Equity 20.00 %, Investment-Grade Credit 13.00 %, Emerging Equity 10.00 %, Listed "
                + "Real Estate 8.00 %, Emerging Market Debt 6.00 %, Infrastructure 6.00 %, Government Bonds 5.00 %, "
                + "Cash 1.00 %, High Yield 1.00 %; fix: choose a target between 4.33 % and 6.32 %";
        assertEquals(msg, j.get("error").asText());
        assertEquals("isorisk: error: " + msg + "\n", r.err());
    }

    @Test
    void anUnreachableTargetUnderBoundsAloneReportsTheRangeOfTheCriticalLineWalk() {
        String bounds = Run.file(dir, "bounds.yaml", "bounds:\n  default: {min: 0.0, max: 0.35}\n");
        Run r = Run.of("solve", "--expected-returns", mu, "--covariance", cov, "--policy", bounds, "--target-return",
                "0.09", "--format", "json");
        assertEquals(3, r.code(), r.toString());
        JsonNode j = r.json();
        assertEquals("infeasible", j.get("status").asText());
        assertTrue(j.get("constraints").toString().startsWith("[\"target_return\",\"lower:Cash\""), j.toString());
        ReturnRange range = Allocator.returnRange(universe().universe(), mandate(bounds));
        // the walk's ends and the linear program's agree (two independent computations of the same range)
        assertEquals(range.min(), j.get("range").get("min").doubleValue(), 1e-12);
        assertEquals(range.max(), j.get("range").get("max").doubleValue(), 1e-12);
        assertEquals(0.35, j.get("end_portfolio").get("Domestic Equity").doubleValue(), 1e-15);
    }

    @Test
    void closedFormIsRefusedUnderAPolicyWithBounds() {
        Run r = Run.of("solve", "--expected-returns", mu, "--covariance", cov, "--policy", policy, "--method",
                "closed-form");
        assertEquals(2, r.code(), r.toString());
        assertEquals("isorisk: error: the closed form applies only when every constraint is an equality, but the "
                + "policy has bounds or inequality limits; fix: drop --method closed-form (auto picks a bounded "
                + "method) or remove the bounds\n", r.err());
        assertEquals("", r.out());
    }

    @Test
    void theCriticalLineMethodIsRefusedForAMandateWithGroups() {
        Run r = Run.of("solve", "--expected-returns", mu, "--covariance", cov, "--policy", policy, "--method",
                "critical-line", "--format", "json");
        assertEquals(2, r.code(), r.toString());
        String msg = "the critical line method takes only the budget, per-asset bounds and fixed weights, but the "
                + "mandate has group limits; fix: drop --method critical-line (auto picks the numerical method)";
        assertEquals("isorisk: error: " + msg + "\n", r.err());
        assertEquals("invalid-input", r.json().get("status").asText());
        assertEquals(msg, r.json().get("error").asText());
    }

    @Test
    void anUnknownMethodIsAUsageError() {
        Run r = Run.of("solve", "--expected-returns", mu, "--covariance", cov, "--method", "bogus");
        assertEquals(2, r.code(), r.toString());
        assertEquals("isorisk: error: Invalid value for option '--method': 'bogus' is not a method; use auto, "
                + "closed-form, critical-line or numerical (see 'isorisk solve --help')\n", r.err());
    }
}

package org.isorisk.engine.io;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.io.StringReader;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import org.isorisk.engine.SampleFund;
import org.isorisk.engine.Tolerances;
import org.isorisk.engine.error.InputException;
import org.isorisk.engine.model.AllocationRequest;
import org.isorisk.engine.model.Group;
import org.isorisk.engine.model.Mandate;
import org.isorisk.engine.model.Method;
import org.isorisk.engine.model.Objective;
import org.isorisk.engine.model.Policy;
import org.isorisk.engine.model.Relation;
import org.isorisk.engine.model.Solution;
import org.isorisk.engine.solve.Allocator;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class PolicyReaderTests {
    private static final List<String> ASSETS = SampleFund.ASSETS;
    private static final Path SAMPLE = Path.of("..", "sample-data", "policy.yaml");

    private static Policy parse(String yaml) {
        return PolicyReader.read(new StringReader(yaml), "p.yaml", null, ASSETS);
    }

    private static String error(String yaml) {
        return assertThrows(InputException.class, () -> parse(yaml)).getMessage();
    }

    private static int at(String asset) {
        return ASSETS.indexOf(asset);
    }

    @Test
    void theSamplePolicyReadsIntoTheMandateItDescribes() throws IOException {
        byte[] before = Files.readAllBytes(SAMPLE);
        Policy p = PolicyReader.read(SAMPLE, ASSETS);
        assertEquals(before.length, Files.readAllBytes(SAMPLE).length, "input not modified");
        Mandate m = p.mandate();
        assertEquals(1.0, m.budget());
        assertEquals(0.01, m.lower(at("Cash")));
        assertEquals(0.05, m.upper(at("Cash")));
        assertEquals(0.0, m.lower(at("High Yield")));
        assertEquals(0.08, m.upper(at("High Yield")));
        assertEquals(List.of("Equity", "Fixed Income", "Real Assets"), m.groups().stream().map(Group::name).toList());
        Group eq = m.groups().get(0);
        assertEquals(List.of(at("Domestic Equity"), at("Foreign Developed Equity"), at("Emerging Equity")),
                eq.members());
        assertEquals(0.30, eq.min());
        assertEquals(0.60, eq.max());
        assertEquals(Double.NEGATIVE_INFINITY, m.groups().get(2).min());
        assertEquals(1, m.constraints().size());
        assertEquals(Relation.AT_MOST, m.constraints().get(0).relation());
        assertEquals(0.5, m.constraints().get(0).coefficient(at("Emerging Equity")));
        assertEquals(0.20, p.turnoverMax().orElseThrow());
        assertTrue(p.targetReturn().isEmpty());
        assertEquals(25.0, p.costsBps()[at("High Yield")]);
        assertEquals(10.0, p.costsBps()[at("Domestic Equity")]);
    }

    @Test
    void theSampleFundSolvesUnderTheSamplePolicyWithACertificate() {
        Policy p = PolicyReader.read(SAMPLE, ASSETS);
        Solution s = Allocator.solve(new AllocationRequest(SampleFund.universe(), p.mandate(),
                Objective.targetReturn(0.05), Method.AUTO, null));
        assertEquals(Method.NUMERICAL, s.method());
        assertTrue(s.certificate().worst() <= 1e-9, s.certificate().toString());
        assertEquals(0.05, s.expectedReturn(), Tolerances.TIGHT);
    }

    @Test
    void anUnknownKeyNamesLineKeyAndTheKeysAllowed() {
        assertEquals("p.yaml, line 2, key 'bonds': unknown key 'bonds' (value 'bonds'); fix: use one of bounds, "
                + "bounds_file, budget, constraints, costs_bps, fixed, groups, target_return, trading, turnover",
                error("budget: 1.0\nbonds: {default: {min: 0}}\n"));
    }

    @Test
    void anUnknownAssetSuggestsTheNearestName() {
        assertEquals("p.yaml, line 3, key 'bounds.assets.Domestic Equty': unknown asset 'Domestic Equty' (value "
                        + "'Domestic Equty'); fix: did you mean 'Domestic Equity'? Asset names must match the "
                        + "expected-returns file exactly",
                error("bounds:\n  assets:\n    Domestic Equty: {max: 0.3}\n"));
    }

    @Test
    void aGroupMemberThatIsNoAssetIsNamedAtItsLine() {
        assertEquals("p.yaml, line 4, key 'groups.Equity.members': unknown asset 'Gold' (value 'Gold'); fix: use an "
                        + "asset name from the expected-returns file (names match exactly, case included)",
                error("groups:\n  Equity:\n    members:\n      - Gold\n    max: 0.5\n"));
    }

    @Test
    void aGroupNamingNobodyIsRefused() {
        assertEquals("p.yaml, line 2, key 'groups.Equity': group 'Equity' names no member; fix: list its assets under "
                + "members (or in the group column of the bounds file)", error("groups:\n  Equity: {members: [], max: 0.5}\n"));
    }

    @Test
    void minAboveMaxIsRefused() {
        assertEquals("p.yaml, line 3, key 'bounds.assets.Cash': min is above max (value '0.4 > 0.3'); fix: make min "
                + "at most max", error("bounds:\n  assets:\n    Cash: {min: 0.4, max: 0.3}\n"));
        assertEquals("p.yaml, line 2, key 'groups.Equity': min is above max (value '0.7 > 0.6'); fix: make min at most "
                + "max", error("groups:\n  Equity: {members: [Domestic Equity], min: 0.7, max: 0.6}\n"));
    }

    @Test
    void nonNumericValuesAreRefused() {
        assertEquals("p.yaml, line 1, key 'budget': not a number (value 'all'); fix: write a decimal number, e.g. 0.35",
                error("budget: all\n"));
        assertEquals("p.yaml, line 3, key 'bounds.default.max': not a number (value '0,35'); fix: use a decimal "
                + "point, not a comma, e.g. 0.35", error("bounds:\n  default:\n    max: 0,35\n"));
    }

    @Test
    void percentLookingValuesAreRefusedWithTheDecimalToWrite() {
        assertEquals("p.yaml, line 2, key 'bounds.default.max': the value is written as a percent (value '35%'); fix: "
                + "write decimals, e.g. 0.35 for 35 %", error("bounds:\n  default: {max: 35%}\n"));
        assertEquals("p.yaml, line 2, key 'bounds.default.max': the value looks like a percent (value '35'); fix: "
                + "weights are decimals: write 0.35 for 35 %", error("bounds:\n  default: {max: 35}\n"));
        assertEquals("p.yaml, line 1, key 'target_return': the return target looks like a percent (value '5'); fix: "
                + "write it as a decimal, e.g. 0.05 for 5 %", error("target_return: 5\n"));
    }

    @Test
    void aDuplicateKeyIsRefused() {
        assertEquals("p.yaml, line 2, key 'budget': key 'budget' is given twice (value 'budget'); fix: keep one of the "
                + "two", error("budget: 1.0\nbudget: 0.9\n"));
    }

    @Test
    void generalConstraintsAndTheTargetRuleAreRead() {
        Policy p = parse("target_return: 0.045\nconstraints:\n  - name: tilt\n    coefficients: {Cash: 1.0, "
                + "High Yield: -2}\n    relation: \">=\"\n    limit: -0.1\n");
        assertEquals(0.045, p.targetReturn().orElseThrow());
        assertEquals(Relation.AT_LEAST, p.mandate().constraints().get(0).relation());
        assertEquals(-2.0, p.mandate().constraints().get(0).coefficient(at("High Yield")));
        assertEquals("p.yaml, line 5, key 'constraints.tilt.relation': unknown relation '<' (value '<'); fix: use "
                + "\"<=\", \">=\" or \"=\" (in quotes)", error("constraints:\n  - name: tilt\n    coefficients: "
                + "{Cash: 1.0}\n    limit: 0.1\n    relation: \"<\"\n"));
    }

    @Test
    void theBoundsFileAPolicyNamesIsFoundWithoutReadingIt(@TempDir Path dir) throws IOException {
        // callers that must know every file a run reads (no output may replace one) ask before reading the policy
        Path sub = Files.createDirectories(dir.resolve("policies"));
        Path policy = Files.writeString(sub.resolve("p.yaml"), "budget: 1.0\nbounds_file: ../limits.csv\n");
        assertEquals(java.util.Optional.of(sub.resolve("../limits.csv")), PolicyReader.boundsFile(policy));
        Files.writeString(policy, "budget: 1.0\n");
        assertEquals(java.util.Optional.empty(), PolicyReader.boundsFile(policy));
        Files.writeString(policy, "budget: [1.0\n");
        assertEquals(java.util.Optional.empty(), PolicyReader.boundsFile(policy), "invalid YAML: read() reports it");
        assertEquals(java.util.Optional.empty(), PolicyReader.boundsFile(dir.resolve("missing.yaml")));
    }

    @Test
    void aBoundsFileBesideThePolicyGivesLimitsAndGroupMembers(@TempDir Path dir) throws IOException {
        Files.writeString(dir.resolve("limits.csv"), "asset,min,max,group\nCash,0.02,0.04,\nDomestic Equity,,0.3,Equity\n"
                + "Emerging Equity,0,0.1,Equity\n");
        Path policy = dir.resolve("p.yaml");
        Files.writeString(policy, "bounds_file: limits.csv\ngroups:\n  Equity: {min: 0.2, max: 0.5}\n");
        Policy p = PolicyReader.read(policy, ASSETS);
        assertEquals(0.02, p.mandate().lower(at("Cash")));
        assertEquals(0.04, p.mandate().upper(at("Cash")));
        assertEquals(0.0, p.mandate().lower(at("Domestic Equity")));
        assertEquals(List.of(at("Domestic Equity"), at("Emerging Equity")), p.mandate().groups().get(0).members());

        Files.writeString(dir.resolve("limits.csv"), "asset,min,max\nCash,0.02,4%\n");
        InputException e = assertThrows(InputException.class, () -> PolicyReader.read(policy, ASSETS));
        assertEquals("limits.csv, row 2, column 'max': a weight limit is written as a percent (value '4%'); fix: write "
                + "decimals, e.g. 0.04 for 4 %", e.getMessage());

        Files.writeString(dir.resolve("limits.csv"), "asset,min,max,group\nCash,0.02,0.04,Liquidity\n"
                + "Domestic Equity,,0.3,Equity\n");
        e = assertThrows(InputException.class, () -> PolicyReader.read(policy, ASSETS));
        assertEquals("limits.csv, row 2, column 'group': group 'Liquidity' is not defined under 'groups' in "
                + policy + " (value 'Liquidity'); fix: add 'Liquidity' with its min and max under 'groups', or leave "
                + "the group cell empty", e.getMessage());
    }
}

package org.isorisk.cli.commands;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Set;
import org.isorisk.cli.Run;
import org.isorisk.engine.model.AssetUniverse;
import org.isorisk.engine.synthetic.FactorModels;
import org.isorisk.notebooks.PackLayout;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * The degenerate case from the issue: a 40-asset fund in five groups of eight (each asset at most 12 %, each group at
 * most 55 %) with ten group-volatility stress scenarios, the stress chart solving every scenario along the frontier
 * up to its exact top target, where many constraints bind at once and their gradients are dependent. Before the pack
 * reported unsolved points, one scenario point there ("the final working set of the active-set method is singular")
 * made the whole pack exit 3. Now the pack is complete, and every point of the chart's data has its status: solved,
 * or reported in the summary with its status and reason.
 */
class DegeneratePackTests {

    @TempDir
    Path dir;

    /** Seed 38 of the market recipe is one where the active-set method met the singular working set. */
    static final long SEED = 38;

    @Test
    void aScenarioPointAtTheFrontiersTopThatCannotBeSolvedDoesNotFailThePack() throws IOException {
        AssetUniverse u = FactorModels.universe(40, SEED);
        StringBuilder er = new StringBuilder("asset,expected_return\n");
        StringBuilder cov = new StringBuilder("asset");
        u.assets().forEach(a -> cov.append(',').append(a));
        cov.append('\n');
        for (int i = 0; i < 40; i++) {
            er.append(u.assets().get(i)).append(',').append(u.expectedReturn(i)).append('\n');
            cov.append(u.assets().get(i));
            for (int j = 0; j < 40; j++) {
                cov.append(',').append(u.covariance(i, j));
            }
            cov.append('\n');
        }
        StringBuilder policy = new StringBuilder("budget: 1.0\nbounds:\n  default: {min: 0.0, max: 0.12}\ngroups:\n");
        StringBuilder scenarios = new StringBuilder("scenarios:\n");
        for (int g = 0; g < 5; g++) {
            policy.append("  G").append(g + 1).append(": {members: [")
                    .append(String.join(", ", u.assets().subList(8 * g, 8 * g + 8))).append("], max: 0.55}\n");
        }
        for (int s = 0; s < 10; s++) {
            String m = s < 5 ? "1.5" : "2.0";
            scenarios.append("  - name: g").append(s % 5 + 1).append("-vol-x").append(m).append('\n')
                    .append("    description: volatility of group G").append(s % 5 + 1).append(" times ").append(m)
                    .append('\n').append("    shocks:\n      - volatility: {scope: G").append(s % 5 + 1)
                    .append(", multiplier: ").append(m).append("}\n");
        }
        String pack = "fund: {name: Forty Asset Test Fund (invented), currency: CU}\nas_of: 2025-06-30\n"
                + "targets: [0.03]\ncharts: [stress]\nscenarios: scenarios.yaml\n";
        Run.file(dir, "scenarios.yaml", scenarios.toString());
        Path out = dir.resolve("pack");
        Run r = Run.of("pack", "--expected-returns", Run.file(dir, "er.csv", er.toString()), "--covariance",
                Run.file(dir, "cov.csv", cov.toString()), "--policy", Run.file(dir, "policy.yaml", policy.toString()),
                "--pack-file", Run.file(dir, "pack.yaml", pack), "--out", out.toString(), "--quiet");
        assertEquals(0, r.code(), r.toString());
        // the stress chart's data: 11 curves (today's assumptions and ten scenarios) by 25 frontier targets
        List<String> rows = Files.readAllLines(out.resolve(PackLayout.table("stress_frontier")));
        assertEquals("scenario,target,status,volatility,note", rows.get(2));
        assertEquals(3 + 11 * 25, rows.size());
        for (String row : rows.subList(3, rows.size())) {
            String status = row.split(",")[2];
            assertTrue(Set.of("optimal", "infeasible", "not-solved").contains(status), row);
            if (!status.equals("optimal")) {
                // a point without a solution says why, and the summary names it
                assertTrue(row.contains(",not solved: ") || row.contains(",no solution: ")
                        || row.contains(",target out of reach"), row);
                String scenario = row.split(",")[0];
                assertTrue(r.out().contains("Stress points not solved: ATTENTION: ") && r.out().contains(scenario)
                        || row.contains("target out of reach"), r.out());
            }
        }
        assertTrue(Files.isRegularFile(out.resolve(PackLayout.NOTEBOOK)));
        assertTrue(Files.isRegularFile(out.resolve(PackLayout.chart("stress", "png"))), "the chart is drawn");
    }
}

package org.isorisk.cli.usecase;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertSame;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.StringReader;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.OffsetDateTime;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Optional;
import org.isorisk.cli.Endowment;
import org.isorisk.engine.error.NoSolutionException;
import org.isorisk.engine.explain.Explain;
import org.isorisk.engine.io.ScenarioFile;
import org.isorisk.engine.model.AllocationRequest;
import org.isorisk.engine.model.Branch;
import org.isorisk.engine.model.Objective;
import org.isorisk.engine.model.Solution;
import org.isorisk.engine.rebalance.Breach;
import org.isorisk.engine.rebalance.Holdings;
import org.isorisk.engine.rebalance.RebalanceObjective;
import org.isorisk.engine.rebalance.RebalanceRequest;
import org.isorisk.engine.rebalance.RebalanceResult;
import org.isorisk.engine.rebalance.Rebalancer;
import org.isorisk.engine.rebalance.TradingLimits;
import org.isorisk.engine.risk.RiskAnalysis;
import org.isorisk.engine.risk.RiskDecomposition;
import org.isorisk.engine.solve.Allocator;
import org.isorisk.engine.stress.Scenario;
import org.isorisk.engine.stress.ScenarioPoint;
import org.isorisk.engine.stress.ScenarioResult;
import org.isorisk.engine.stress.StressRequest;
import org.isorisk.engine.stress.StressResult;
import org.isorisk.engine.stress.TargetPoint;
import org.isorisk.notebooks.NotebookWriter;
import org.isorisk.notebooks.PackContent;
import org.isorisk.notebooks.pack.ChartMaker;
import org.isorisk.notebooks.pack.PackComposer;
import org.isorisk.notebooks.pack.PackResults;
import org.isorisk.notebooks.pack.PackSpec;
import org.isorisk.notebooks.report.Table;
import org.junit.jupiter.api.Test;

/**
 * One story in the pack, on the invented 25-asset Wrenfield University Endowment ({@link Endowment}): the proposal
 * every section describes is the portfolio the trade list reaches, the target portfolio stands beside it only when
 * the trading limits or costs keep the trades from it, today's breaches are in the summary, targets on the
 * inefficient branch say so, and a stress point the solver cannot solve is reported while the rest of the pack is
 * complete. Checked from the values (PackResults, PackContent) against the engine's own answers.
 */
class PackStoryTests {

    static final Endowment E = Endowment.read();
    static final PackSpec SPEC = PackSpecReader.read(Endowment.file("pack.yaml"));
    static final int N = 25;

    static PackAnalysis.Request request(PackSpec spec, TradingLimits limits, List<Scenario> scenarios) {
        return new PackAnalysis.Request(E.universe(), E.mandate(), spec, E.held(), scenarios, limits);
    }

    static PackContent compose(PackResults r, ChartMaker charts) {
        return PackComposer.compose(r, new PackComposer.Request("", "0.1.0-test",
                OffsetDateTime.parse("2025-06-30T12:00:00Z"), List.of(), List.of(), List.of(), charts));
    }

    static PackContent compose(PackResults r) {
        return compose(r, x -> List.of());
    }

    static int column(Table t, String key) {
        for (int c = 0; c < t.columns().size(); c++) {
            if (t.columns().get(c).key().equals(key)) {
                return c;
            }
        }
        return -1;
    }

    static double number(Table t, int row, String key) {
        int c = column(t, key);
        if (c < 0) {
            throw new AssertionError("no column " + key + " in " + t.name());
        }
        return ((Table.Cell.Number) t.rows().get(row).get(c)).value();
    }

    static String text(Table t, int row, String key) {
        return ((Table.Cell.Text) t.rows().get(row).get(column(t, key))).value();
    }

    static Table table(PackContent c, String name) {
        return c.tables().stream().filter(t -> t.name().equals(name)).findFirst()
                .orElseThrow(() -> new AssertionError("no table " + name));
    }

    static Optional<PackContent.KeyPoint> keyPoint(PackContent c, String label) {
        return c.keyPoints().stream().filter(k -> k.label().equals(label)).findFirst();
    }

    /** The rebalance the pack's trades come from, made directly as 'isorisk rebalance' makes it. */
    static RebalanceResult direct(TradingLimits limits) {
        return Rebalancer.rebalance(new RebalanceRequest(E.universe(), E.mandate(), Holdings.ofWeights(
                E.universe().assets(), E.holdings(), 3_180_000_000.0), limits, new RebalanceObjective.TargetReturn(0.06),
                null));
    }

    @Test
    void theProposalEverySectionDescribesIsThePortfolioTheTradesReach() {
        List<PackResults> drawn = new ArrayList<>();
        PackResults res = PackAnalysis.run(request(SPEC, E.trading(), E.scenarios()));
        PackContent c = compose(res, r -> {
            drawn.add(r);
            return List.of();
        });
        RebalanceResult rb = direct(E.trading());
        // the proposal is the rebalancer's post-trade portfolio (the same request gives the same answer, bit for bit)
        assertArrayEquals(rb.proposal().weights(), res.proposal().weights());
        assertSame(res.rebalance().orElseThrow().proposal(), res.proposal());
        // the case: the full move to the target portfolio trades far more than the 25 % turnover limit
        assertTrue(res.fullMove().orElseThrow().turnover() > 1.0, "full move " + res.fullMove());
        assertTrue(rb.turnover() <= 0.25 + 1e-7, "turnover " + rb.turnover());
        assertTrue(res.proposalDiffersFromTarget());

        // the summary, the portfolios table and the risk section describe it
        PackContent.Portfolio p = c.proposal();
        assertEquals("Proposed (after trading limits and costs)", p.label());
        assertEquals(rb.proposal().expectedReturn(), p.expectedReturn());
        assertEquals(rb.proposal().volatility(), p.volatility());
        PackContent.KeyPoint first = c.keyPoints().get(0);
        assertEquals("Proposed portfolio", first.label());
        assertTrue(first.text().startsWith("expected return " + Explain.percent(rb.proposal().expectedReturn())
                + " a year with volatility " + Explain.percent(rb.proposal().volatility())), first.text());
        RiskDecomposition risk = RiskAnalysis.decompose(E.universe(), rb.proposal().weights());
        for (int i = 0; i < N; i++) {
            assertEquals(rb.proposal().weight(i), number(c.risk(), i, "weight"), 0.0);
            assertEquals(risk.marginal()[i], number(c.risk(), i, "marginal_risk"), 0.0);
            assertEquals(risk.component()[i], number(c.risk(), i, "contribution"), 0.0);
            assertEquals(rb.proposal().weight(i), number(c.weights(), i, "proposed"), 0.0);
            assertEquals(rb.trades().get(i).target(), number(c.trades().orElseThrow(), i, "proposed"), 0.0);
        }
        // the charts are drawn from the same results: their proposal is the traded portfolio
        assertSame(res.proposal(), drawn.get(0).proposal());
        assertSame(res.risk(), drawn.get(0).risk());
        // the target portfolio stands beside it, labelled plainly, with the engine's numbers for the 6 % target
        Solution target = Allocator.solve(AllocationRequest.of(E.universe(), E.mandate(), Objective.targetReturn(0.06)));
        PackContent.Portfolio beside = c.besideProposal().orElseThrow();
        assertEquals("Target 6.00 %", beside.label());
        assertEquals("the proposed target before trading limits and costs: the trades do not reach it",
                beside.remark());
        assertEquals(target.volatility(), beside.volatility(), 1e-12);
        assertTrue(keyPoint(c, "Target portfolio, side by side").orElseThrow().text().contains(
                "volatility " + Explain.percent(target.volatility())));
        assertTrue(column(c.weights(), "target_6") >= 0 && column(c.weights(), "proposed") >= 0);
        Table cmp = c.trading().orElseThrow().comparison();
        assertEquals(p.label(), ((Table.Cell.Text) cmp.rows().get(2).get(0)).value());
        assertEquals(rb.proposedVolatility(), number(cmp, 2, "volatility"), 0.0);
        // the stress section: the proposal under each scenario is the engine's decomposition on its assumptions
        Table under = table(c, "stress_proposal");
        assertEquals(SPEC.proposed(), 0.06);
        assertEquals(risk.volatility(), number(under, 0, "proposal_volatility"), 0.0);
        List<ScenarioResult> sr = res.stress().orElseThrow().scenarios();
        for (int k = 0; k < sr.size(); k++) {
            RiskDecomposition s = RiskAnalysis.decompose(sr.get(k).shocked().universe(), rb.proposal().weights());
            assertEquals(sr.get(k).scenario().name(), text(under, k + 1, "scenario"));
            assertEquals(s.volatility(), number(under, k + 1, "proposal_volatility"), 0.0);
            assertEquals(s.expectedReturn(), number(under, k + 1, "proposal_return"), 0.0);
        }
    }

    @Test
    void theTargetPortfolioIsShownBesideTheProposalOnlyWhenTheyDiffer() {
        PackResults res = PackAnalysis.run(request(SPEC, TradingLimits.none(N), List.of()));
        PackContent c = compose(res);
        RebalanceResult rb = res.rebalance().orElseThrow();
        assertArrayEquals(rb.proposal().weights(), res.proposal().weights());
        double[] target = res.targetPortfolio().weights();
        for (int i = 0; i < N; i++) {
            assertEquals(target[i], res.proposal().weight(i), PackResults.SAME_WEIGHTS, E.universe().assets().get(i));
        }
        assertFalse(res.proposalDiffersFromTarget());
        assertEquals("Target 6.00 %", c.proposal().label());
        assertTrue(c.besideProposal().isEmpty());
        assertEquals(-1, column(c.weights(), "proposed"));
        assertTrue(keyPoint(c, "Target portfolio, side by side").isEmpty());
        assertEquals(PackContent.Trading.Mode.FULL_MOVE, c.trading().orElseThrow().mode());
        // even then, every number of the proposal is the traded portfolio's
        assertEquals(rb.proposal().volatility(), c.proposal().volatility());
        for (int i = 0; i < N; i++) {
            assertEquals(rb.proposal().weight(i), number(c.risk(), i, "weight"), 0.0);
        }
    }

    @Test
    void todaysBreachesOfThePolicyAreInTheSummary() {
        PackResults res = PackAnalysis.run(request(SPEC, E.trading(), List.of()));
        PackContent c = compose(res);
        List<String> engine = direct(E.trading()).breaches().stream().map(Breach::description).toList();
        assertEquals(engine, c.breaches());
        assertEquals(2, c.breaches().size(), c.breaches().toString());
        assertTrue(c.breaches().get(0).startsWith("Cash is at 10.00 % today, above its maximum 8.00 % by 2.00 %; the "
                + "proposal trades: sell 2.00 %"), c.breaches().get(0));
        assertTrue(c.breaches().get(1).startsWith("Group Privates is at 27.00 % today, above its maximum 25.00 % by "
                + "2.00 %; the proposal trades: "), c.breaches().get(1));
        PackContent.KeyPoint k = keyPoint(c, "Policy breaches today").orElseThrow();
        assertTrue(k.attention());
        assertEquals("today's holdings break 2 limits of the policy: " + String.join(" ", engine), k.text());
        assertEquals("breaks 2 limits of the policy", c.current().orElseThrow().remark());
        String summary = notebookCell(c, "summary");
        assertTrue(summary.contains("Cash is at 10.00 % today"), summary);
        assertTrue(summary.contains("Group Privates is at 27.00 % today"), summary);

        // a turnover limit too small to cure them: no trade list, the breaches are still listed (without a cure)
        TradingLimits tight = E.trading().withMaxTurnover(0.005);
        PackResults none = PackAnalysis.run(request(SPEC, tight, List.of()));
        PackContent nc = compose(none);
        assertEquals(PackContent.Trading.Mode.OUT_OF_REACH, nc.trading().orElseThrow().mode());
        assertTrue(nc.trades().isEmpty());
        assertEquals(List.of("Cash is at 10.00 % today, above its maximum 8.00 % by 2.00 %.",
                "Group Privates is at 27.00 % today, above its maximum 25.00 % by 2.00 %."), nc.breaches());
        assertEquals(nc.breaches(), Rebalancer.breaches(E.universe(), E.mandate(), E.holdings()).stream()
                .map(Breach::description).toList());
        assertTrue(keyPoint(nc, "Policy breaches today").orElseThrow().attention());
        assertEquals("Target 6.00 %", nc.proposal().label(), "no move: the pack describes the target portfolio");

        // holdings that keep every limit: the summary says so
        double[] kept = res.targetPortfolio().weights();
        PackResults clean = PackAnalysis.run(new PackAnalysis.Request(E.universe(), E.mandate(), SPEC,
                Optional.of(kept), List.of(), E.trading()));
        assertEquals("none: today's holdings keep every limit of the policy.",
                keyPoint(compose(clean), "Policy breaches today").orElseThrow().text());
    }

    static String notebookCell(PackContent c, String id) {
        var nb = NotebookWriter.build(c);
        for (var cell : nb.get("cells")) {
            if (cell.get("id").asText().equals(id)) {
                StringBuilder b = new StringBuilder();
                cell.get("source").forEach(l -> b.append(l.asText()));
                return b.toString();
            }
        }
        throw new AssertionError("no cell " + id);
    }

    /** A scenario that lifts every expected return by 2 points: its minimum-variance return lies above every target. */
    static List<Scenario> withReturnsUp() {
        List<Scenario> all = new ArrayList<>(E.scenarios());
        all.addAll(ScenarioFile.parse(new StringReader("""
                scenarios:
                  - name: all-returns-up
                    description: Every expected return 2 points higher (invented)
                    shocks:
                      - return: {scope: all, shift: 0.02}
                """), "extra.yaml", Path.of("."), E.universe().assets(), java.util.Map.of(), null));
        return all;
    }

    @Test
    void targetsOnTheInefficientBranchSaySoWhereverTheyAppearInThePack() {
        // 4.75 % lies between the lowest return the mandate allows (4.64 %) and its minimum-variance return (4.91 %)
        PackSpec low = PackSpecReader.read(new StringReader(
                "fund: {name: Wrenfield University Endowment, currency: CU}\nas_of: 2025-06-30\n"
                        + "targets: [0.0475, 0.06, 0.0675]\nproposed: 0.06\n"), "low.yaml");
        PackResults res = PackAnalysis.run(new PackAnalysis.Request(E.universe(), E.mandate(), low, Optional.empty(),
                withReturnsUp(), null));
        assertTrue(res.minimum().expectedReturn() > 0.0475, "min-variance return " + res.minimum().expectedReturn());
        Solution low45 = res.targets().get(0);
        // the envelope theorem: below the minimum-variance return the least variance falls as the target rises
        assertTrue(low45.multiplier("target_return").orElseThrow().variancePerUnit() < 0);
        assertTrue(low45.notes().contains(Branch.INEFFICIENT_NOTE), low45.notes().toString());
        PackContent c = compose(res);
        PackContent.Portfolio p45 = c.portfolios().stream().filter(x -> x.label().equals("Target 4.75 %")).findFirst()
                .orElseThrow();
        assertEquals(PackComposer.INEFFICIENT_BRANCH, p45.remark());
        PackContent.Portfolio p60 = c.portfolios().stream().filter(x -> x.label().equals("Target 6.00 %")).findFirst()
                .orElseThrow();
        assertEquals("", p60.remark());
        PackContent.KeyPoint k = keyPoint(c, "Inefficient branch").orElseThrow();
        assertTrue(k.text().startsWith("Target 4.75 % lies below the minimum-variance return ("
                + Explain.percent(res.minimum().expectedReturn()) + "), on the inefficient branch"), k.text());
        // every return 2 points up moves the mandate's returns to 6.64 % ... 9.50 % and the minimum-variance return
        // to 6.91 %: 6.75 % lies on that scenario's inefficient branch (4.75 % and 6 % are out of reach), and the
        // stress table says so exactly where the engine's shadow price is negative
        Table stress = table(c, "stress");
        StressResult sr = res.stress().orElseThrow();
        int row = 0;
        int marked = 0;
        for (ScenarioResult s : sr.scenarios()) {
            for (int j = 0; j < s.points().size(); j++, row++) {
                TargetPoint tp = s.sweep().points().get(j);
                boolean below = tp.feasible() && tp.solution().multiplier("target_return").orElseThrow()
                        .variancePerUnit() < -Branch.TOLERANCE;
                assertEquals(below, text(stress, row, "note").contains(PackComposer.INEFFICIENT_UNDER_SCENARIO),
                        s.scenario().name() + " at " + tp.target());
                marked += below ? 1 : 0;
                if (s.scenario().name().equals("all-returns-up")) {
                    assertEquals(tp.target() == 0.0675, below, "at " + tp.target());
                    assertEquals(tp.target() == 0.0675, tp.feasible(), "at " + tp.target());
                }
            }
        }
        assertTrue(marked >= 1, "at least 6.75 % under all-returns-up: " + marked);
        assertTrue(k.text().endsWith(marked == 1 ? " 1 point of the stress table lies on the inefficient branch of its "
                + "scenario's frontier (see the Note column)." : " " + marked + " points of the stress table lie on the "
                + "inefficient branch of their scenario's frontier (see the Note column)."), k.text());
    }

    // ------------------------------------------------------------------ stress points the solver cannot solve

    /** The engine's stress run, except that it fails (as a solver failure) on requests {@code fails} picks. */
    static PackStress.Runner failing(java.util.function.Predicate<StressRequest> fails,
                                     NoSolutionException.Reason reason) {
        return (r, p) -> {
            if (fails.test(r)) {
                throw new NoSolutionException(reason, "the final working set of the active-set method is singular "
                        + "(injected)", List.of());
            }
            return PackStress.ENGINE.run(r, p);
        };
    }

    static boolean has(StressRequest r, String scenario, double target) {
        return r.scenarios().stream().anyMatch(s -> s.name().equals(scenario))
                && Arrays.stream(r.targets()).anyMatch(t -> t == target);
    }

    @Test
    void oneScenarioPointThatCannotBeSolvedIsReportedWithItsStatusAndThePackIsComplete() {
        PackAnalysis.Request req = request(SPEC, E.trading(), E.scenarios());
        PackResults normal = PackAnalysis.run(req);
        PackResults res = PackAnalysis.run(req, PackAnalysis.Steps.NONE,
                failing(r -> has(r, "crisis-correlation", 0.055), NoSolutionException.Reason.NOT_CONVERGED));
        String why = "the final working set of the active-set method is singular (injected)";
        assertEquals(List.of(new PackResults.NotSolved(PackResults.StressRun.AT_TARGETS,
                Optional.of("crisis-correlation"), 0.055, PackResults.PointStatus.NOT_SOLVED, why)), res.notSolved());
        // every other point is the one the whole run gives (solved in parts: to the solver's tolerance)
        List<ScenarioResult> a = normal.stress().orElseThrow().scenarios();
        List<ScenarioResult> b = res.stress().orElseThrow().scenarios();
        assertEquals(a.size(), b.size());
        for (int k = 0; k < a.size(); k++) {
            for (int j = 0; j < SPEC.targets().size(); j++) {
                ScenarioPoint x = a.get(k).points().get(j);
                ScenarioPoint y = b.get(k).points().get(j);
                assertEquals(x.target(), y.target());
                if (a.get(k).scenario().name().equals("crisis-correlation") && x.target() == 0.055) {
                    assertFalse(y.feasible());
                    assertEquals(why, y.reason());
                    assertTrue(Double.isNaN(y.volatility()));
                } else {
                    assertEquals(x.feasible(), y.feasible());
                    assertEquals(x.volatility(), y.volatility(), 1e-9, a.get(k).scenario().name() + " " + x.target());
                    assertEquals(x.change(), y.change(), 1e-9);
                    assertEquals(x.baseRisk(), y.baseRisk(), 1e-9);
                }
            }
        }
        PackContent c = compose(res);
        PackContent ok = compose(normal);
        assertEquals(ok.tables().stream().map(Table::name).toList(), c.tables().stream().map(Table::name).toList(),
                "the pack is complete");
        Table stress = table(c, "stress");
        for (int row = 0; row < stress.rows().size(); row++) {
            boolean failed = text(stress, row, "scenario").equals("crisis-correlation")
                    && number(stress, row, "target") == 0.055;
            assertEquals(failed ? "not-solved" : "optimal", text(stress, row, "status"));
            assertEquals(failed ? "not solved: " + why : "", text(stress, row, "note"));
        }
        assertEquals(List.of(new PackContent.NotSolved("stress table", "crisis-correlation", 0.055, "not-solved", why)),
                c.notSolved());
        PackContent.KeyPoint k = keyPoint(c, "Stress points not solved").orElseThrow();
        assertTrue(k.attention());
        assertEquals("1 stress point was not solved and is reported with its status instead: crisis-correlation at "
                + "5.50 % in the stress table (not-solved: " + why + "). The rest of the pack is complete.", k.text());
        assertTrue(notebookCell(c, "stress").contains("crisis-correlation at 5.50 % in the stress table: not-solved"));
        assertTrue(keyPoint(ok, "Stress points not solved").isEmpty());
    }

    @Test
    void aPointOfTheStressChartThatCannotBeSolvedIsInTheChartsDataWithItsStatus() {
        PackAnalysis.Request req = request(SPEC, E.trading(), E.scenarios());
        PackResults normal = PackAnalysis.run(req);
        List<Solution> frontier = normal.frontier().points();
        double top = frontier.get(frontier.size() - 1).expectedReturn();
        PackResults res = PackAnalysis.run(req, PackAnalysis.Steps.NONE,
                failing(r -> has(r, "equity-volatility", top), NoSolutionException.Reason.NOT_CONVERGED));
        assertEquals(1, res.notSolved().size(), res.notSolved().toString());
        assertEquals(PackResults.StressRun.ALONG_FRONTIER, res.notSolved().get(0).run());
        Table data = table(compose(res), "stress_frontier");
        Table usual = table(compose(normal), "stress_frontier");
        int failed = 0;
        for (int row = 0; row < data.rows().size(); row++) {
            if (text(data, row, "status").equals("infeasible")) {
                // targets out of reach under a scenario (lower returns): as in the run without a failure
                assertEquals("infeasible", text(usual, row, "status"));
                assertTrue(text(data, row, "note").startsWith("target out of reach"), text(data, row, "note"));
            } else if (!text(data, row, "status").equals("optimal")) {
                failed++;
                assertEquals("equity-volatility", text(data, row, "scenario"));
                assertEquals(top, number(data, row, "target"));
                assertEquals("not-solved", text(data, row, "status"));
                assertTrue(text(data, row, "note").startsWith("not solved: "));
            }
        }
        assertEquals(1, failed);
        // one row per curve (today's assumptions and five scenarios) and frontier target
        assertEquals(6 * frontier.size(), data.rows().size());
    }

    @Test
    void whenTodaysPointCannotBeSolvedTheScenariosAreSolvedOnTheirOwnAssumptions() {
        PackAnalysis.Request req = request(SPEC, E.trading(), E.scenarios());
        PackResults normal = PackAnalysis.run(req);
        // any request on today's assumptions that includes 6 % fails: today's point there cannot be solved
        PackResults res = PackAnalysis.run(req, PackAnalysis.Steps.NONE, failing(r -> r.universe() == E.universe()
                && Arrays.stream(r.targets()).anyMatch(t -> t == 0.06), NoSolutionException.Reason.NOT_CONVERGED));
        assertEquals(1, res.notSolved().size());
        assertEquals(Optional.empty(), res.notSolved().get(0).scenario());
        StressResult sr = res.stress().orElseThrow();
        assertFalse(sr.base().points().get(2).feasible());
        PackContent c = compose(res);
        Table stress = table(c, "stress");
        List<ScenarioResult> a = normal.stress().orElseThrow().scenarios();
        for (int k = 0; k < sr.scenarios().size(); k++) {
            ScenarioPoint y = sr.scenarios().get(k).points().get(2);
            ScenarioPoint x = a.get(k).points().get(2);
            // the scenario's own least volatility, from its own assumptions; no comparison with today's
            assertEquals(x.volatility(), y.volatility(), 1e-9, sr.scenarios().get(k).scenario().name());
            assertTrue(Double.isNaN(y.change()) && Double.isNaN(y.turnover()));
            int row = k * SPEC.targets().size() + 2;
            assertEquals("optimal", text(stress, row, "status"));
            assertEquals("no comparison with today: today's point at this target was not solved",
                    text(stress, row, "note"));
        }
        assertTrue(keyPoint(c, "Stress points not solved").orElseThrow().text().contains("today's assumptions at 6.00 % "
                + "in the stress table (not-solved: "), keyPoint(c, "Stress points not solved").toString());
    }

    @Test
    void aConstraintQualificationFailureIsReportedAsInfeasibleAsTheContractSays() {
        PackResults res = PackAnalysis.run(request(SPEC, E.trading(), E.scenarios()), PackAnalysis.Steps.NONE,
                failing(r -> has(r, "rates-up", 0.05), NoSolutionException.Reason.CONSTRAINT_QUALIFICATION));
        assertEquals(PackResults.PointStatus.INFEASIBLE, res.notSolved().get(0).status());
        Table stress = table(compose(res), "stress");
        int row = 3 * SPEC.targets().size(); // rates-up is the fourth scenario, 5 % its first target
        assertEquals("rates-up", text(stress, row, "scenario"));
        assertEquals("infeasible", text(stress, row, "status"));
        assertTrue(text(stress, row, "note").startsWith("no solution: "), text(stress, row, "note"));
    }

    @Test
    void badInputInAScenarioStillFailsTheRun() {
        // a shock the assumptions cannot take is the user's to fix: not a point to report
        PackStress.Runner bad = (r, p) -> {
            throw org.isorisk.engine.error.InputException.of("a volatility multiplier must be positive").build();
        };
        org.junit.jupiter.api.Assertions.assertThrows(org.isorisk.engine.error.InputException.class,
                () -> PackAnalysis.run(request(SPEC, E.trading(), E.scenarios()), PackAnalysis.Steps.NONE, bad));
    }

    @Test
    void theEndowmentsFilesAreInventedAndSaySo() throws Exception {
        for (String f : List.of("README.md", "policy.yaml", "scenarios.yaml", "pack.yaml")) {
            assertTrue(Files.readString(Endowment.file(f)).toLowerCase(java.util.Locale.ROOT).contains("invented"), f);
        }
        for (String f : List.of("expected_returns.csv", "covariance.csv", "holdings.csv")) {
            assertTrue(Files.readString(Endowment.file(f)).contains("(fictional), invented"), f);
        }
    }
}

package org.isorisk.engine.book;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import org.isorisk.engine.SampleFund;
import org.isorisk.engine.io.CsvRow;
import org.isorisk.engine.io.CsvTable;
import org.isorisk.engine.io.LoadedUniverse;
import org.isorisk.engine.io.PolicyReader;
import org.isorisk.engine.io.PortfolioFile;
import org.isorisk.engine.io.PortfolioReader;
import org.isorisk.engine.io.ScenarioFile;
import org.isorisk.engine.io.UniverseFiles;
import org.isorisk.engine.io.UniverseLoader;
import org.isorisk.engine.io.Units;
import org.isorisk.engine.model.AllocationRequest;
import org.isorisk.engine.model.Group;
import org.isorisk.engine.model.Mandate;
import org.isorisk.engine.model.Method;
import org.isorisk.engine.model.Objective;
import org.isorisk.engine.model.Policy;
import org.isorisk.engine.model.Solution;
import org.isorisk.engine.model.Status;
import org.isorisk.engine.rebalance.Holdings;
import org.isorisk.engine.rebalance.RebalanceObjective;
import org.isorisk.engine.rebalance.RebalanceRequest;
import org.isorisk.engine.rebalance.RebalanceResult;
import org.isorisk.engine.rebalance.Rebalancer;
import org.isorisk.engine.rebalance.TradingLimits;
import org.isorisk.engine.solve.Allocator;
import org.isorisk.engine.stress.CorrelationRepair;
import org.isorisk.engine.stress.ScenarioPoint;
import org.isorisk.engine.stress.Stress;
import org.isorisk.engine.stress.StressRequest;
import org.isorisk.engine.stress.StressResult;
import org.junit.jupiter.api.AfterAll;
import org.junit.jupiter.api.Test;

/**
 * Every row of the invented sample book against the engine call its single command makes, on the same files
 * (read here independently of the book code: the policy with {@link PolicyReader}, the row's overrides applied by
 * hand): the same figures to the last bit. The single commands themselves are checked against outside references
 * (Merton 1972, ojAlgo, quadprog, CVXOPT) in the solver tests; here the book must not change their answer.
 */
class BookJobTests {

    private static final ExecutorService THREE = Executors.newFixedThreadPool(3);

    @AfterAll
    static void stop() {
        THREE.shutdownNow();
    }

    private static LoadedUniverse set(String name) {
        String mu = name.equals("base") ? "../expected_returns.csv" : "expected_returns_higher_inflation.csv";
        return UniverseLoader.load(new UniverseFiles(BookFixture.SAMPLE.resolve(mu),
                SampleFund.DATA.resolve("covariance.csv"), null, null, Units.DECIMAL, null));
    }

    /** The mandate of a sample row as its single command would solve it: the policy file with the row's overrides. */
    private static Mandate mandate(CsvTable book, CsvRow row, LoadedUniverse u) {
        Policy p = PolicyReader.read(BookFixture.SAMPLE.resolve(row.cell(book.column("policy"))), u.assets());
        Mandate m = p.mandate();
        double[] lo = m.lower();
        double[] hi = m.upper();
        String ex = row.cell(book.column("exclude"));
        if (!ex.isBlank()) {
            for (String a : ex.split(";")) {
                int i = u.assets().indexOf(a.strip());
                lo[i] = 0;
                hi[i] = 0;
            }
        }
        String emMax = row.cell(book.column("max:Emerging Equity"));
        if (!emMax.isBlank()) {
            hi[u.assets().indexOf("Emerging Equity")] = Double.parseDouble(emMax);
        }
        return new Mandate(m.budget(), lo, hi, m.fixed(), m.groups(), m.constraints());
    }

    private static CsvTable sampleBook() {
        return org.isorisk.engine.io.Csv.read(BookFixture.SAMPLE.resolve("book.csv"), "book");
    }

    @Test
    void eachSolveRowIsTheSingleSolveToTheLastBit() {
        BookFixture.Ran ran = BookFixture.run(BookFixture.sample(Job.SOLVE, null), THREE, 3);
        CsvTable book = sampleBook();
        assertEquals(book.rows().size(), ran.rows().size());
        CsvTable results = ran.table();
        for (int k = 0; k < book.rows().size(); k++) {
            CsvRow row = book.rows().get(k);
            LoadedUniverse u = set(row.cell(book.column("assumptions")));
            Mandate m = mandate(book, row, u);
            double target = Double.parseDouble(row.cell(book.column("target_return")));
            Solution s = Allocator.solve(new AllocationRequest(u.universe(), m, Objective.targetReturn(target),
                    Method.AUTO, null));
            PortfolioResult r = ran.row(k);
            assertEquals(Status.OPTIMAL, r.status(), r.message());
            CsvRow out = results.rows().get(k);
            assertEquals(row.cell(0), out.cell(results.column("id")));
            assertEquals(String.valueOf(row.number()), out.cell(results.column("row")));
            assertEquals(s.method().label(), out.cell(results.column("method")));
            assertBits(s.expectedReturn(), out, results, "expected_return");
            assertBits(s.volatility(), out, results, "volatility");
            assertBits(s.variance(), out, results, "variance");
            assertBits(s.multiplier("target_return").orElseThrow().variancePerUnit(), out, results,
                    "target_variance_per_unit");
            assertBits(s.certificate().stationarity(), out, results, "stationarity");
            assertBits(s.certificate().conditionNumber(), out, results, "condition_number");
            assertEquals(String.valueOf(s.certificate().passes()), out.cell(results.column("certified")));
            assertEquals(BookJob.binding(s.multipliers()), out.cell(results.column("binding")));
            double[] w = new double[s.assets().size()];
            for (int i = 0; i < w.length; i++) {
                Object[] v = r.weights().get(i);
                assertEquals(s.assets().get(i), v[1]);
                w[i] = (Double) v[2];
            }
            assertArrayEquals(s.weights(), w, 0.0, row.cell(0));
            // turnover against the row's holdings file, read as the rebalance command reads it
            PortfolioFile held = PortfolioReader.read(BookFixture.SAMPLE.resolve(row.cell(book.column("holdings"))),
                    "holdings", u.assets(), Units.DECIMAL);
            assertBits(TradingLimits.turnover(held.weights(), s.weights()), out, results, "turnover");
        }
        assertEquals(book.rows().size(), ran.outcome().summary().count(Status.OPTIMAL));
        // the weights table is long: one row per portfolio and asset, with the rows' ids
        assertEquals(1 + book.rows().size() * 12L, ran.weights().lines().count());
        assertTrue(ran.weights().startsWith("id,asset,weight\nfernhollow-main,Cash,"));
    }

    @Test
    void eachRebalanceRowIsTheSingleRebalanceToTheLastBit() {
        BookFixture.Ran ran = BookFixture.run(BookFixture.sample(Job.REBALANCE, null), THREE, 3);
        CsvTable book = sampleBook();
        CsvTable results = ran.table();
        for (int k = 0; k < book.rows().size(); k++) {
            CsvRow row = book.rows().get(k);
            LoadedUniverse u = set(row.cell(book.column("assumptions")));
            Policy p = PolicyReader.read(BookFixture.SAMPLE.resolve(row.cell(book.column("policy"))), u.assets());
            Mandate m = mandate(book, row, u);
            PortfolioFile held = PortfolioReader.read(BookFixture.SAMPLE.resolve(row.cell(book.column("holdings"))),
                    "holdings", u.assets(), Units.DECIMAL);
            double size = held.marketValue().orElse(row.cell(book.column("fund_size")).isBlank() ? Double.NaN
                    : Double.parseDouble(row.cell(book.column("fund_size"))));
            TradingLimits limits = TradingLimits.of(p);
            String tau = row.cell(book.column("max_turnover"));
            if (!tau.isBlank()) {
                limits = limits.withMaxTurnover(Double.parseDouble(tau));
            }
            double target = Double.parseDouble(row.cell(book.column("target_return")));
            RebalanceResult expected = Rebalancer.rebalance(new RebalanceRequest(u.universe(), m,
                    Holdings.ofWeights(u.assets(), held.weights(), size), limits,
                    new RebalanceObjective.TargetReturn(target), null));
            CsvRow out = results.rows().get(k);
            assertEquals("optimal", out.cell(results.column("status")), out.cell(results.column("message")));
            assertBits(expected.turnover(), out, results, "turnover");
            assertBits(expected.cost(), out, results, "cost");
            assertBits(expected.proposedNetReturn(), out, results, "net_return");
            assertBits(expected.trackingError(), out, results, "tracking_error");
            assertBits(expected.proposal().certificate().conditionNumber(), out, results, "condition_number");
            assertBits(expected.proposal().certificate().stationarity(), out, results, "stationarity");
            double[] w = new double[u.assets().size()];
            for (int i = 0; i < w.length; i++) {
                w[i] = (Double) ran.row(k).weights().get(i)[2];
            }
            assertArrayEquals(expected.proposal().weights(), w, 0.0, row.cell(0));
            long trades = expected.trades().stream().filter(t -> t.side() != org.isorisk.engine.rebalance.Trade.Side.HOLD)
                    .count();
            assertEquals(String.valueOf(trades), out.cell(results.column("trades")));
            assertEquals(trades, ran.row(k).extra().size());
            assertTrue(expected.turnover() <= limits.maxTurnover() + 1e-9, "turnover within the limit");
        }
    }

    @Test
    void eachStressRowIsTheSingleStressRunAtItsTarget() {
        String scenarios = SampleFund.DATA.resolve("scenarios.yaml").toString();
        BookFixture.Ran ran = BookFixture.run(BookFixture.sample(Job.STRESS, scenarios), THREE, 3);
        CsvTable book = sampleBook();
        CsvTable stress = org.isorisk.engine.io.Csv.parse("stress.csv", "stress", BookTables.STRESS.header() + ran.extra());
        int line = 0;
        for (int k = 0; k < book.rows().size(); k++) {
            CsvRow row = book.rows().get(k);
            LoadedUniverse u = set(row.cell(book.column("assumptions")));
            Policy p = PolicyReader.read(BookFixture.SAMPLE.resolve(row.cell(book.column("policy"))), u.assets());
            Mandate m = mandate(book, row, u);
            Map<String, List<Integer>> groups = new java.util.LinkedHashMap<>();
            for (Group g : p.mandate().groups()) {
                groups.put(g.name(), g.members());
            }
            double target = Double.parseDouble(row.cell(book.column("target_return")));
            StressResult expected = Stress.run(new StressRequest(u.universe(), m, new double[] {target},
                    ScenarioFile.read(Path.of(scenarios), u.assets(), groups, null),
                    CorrelationRepair.higham(u.assets()), null), null);
            assertArrayEquals(expected.base().points().get(0).solution().weights(), weightsOf(ran.row(k)), 0.0);
            for (var sr : expected.scenarios()) {
                ScenarioPoint pt = sr.points().get(0);
                CsvRow out = stress.rows().get(line++);
                assertEquals(row.cell(0), out.cell(0));
                assertEquals(sr.scenario().name(), out.cell(1));
                assertEquals(pt.feasible() ? "optimal" : "infeasible", out.cell(2));
                assertEquals(org.isorisk.engine.book.CsvCells.number(pt.volatility()), out.cell(stress.column("volatility")));
                assertEquals(org.isorisk.engine.book.CsvCells.number(pt.baseRisk()),
                        out.cell(stress.column("base_volatility")));
                assertEquals(pt.reason(), out.cell(stress.column("message")));
            }
        }
        assertEquals(line, stress.rows().size());
    }

    @Test
    void theTablesAreTheSameOnOneThreadAndOnThree() {
        for (Job job : Job.values()) {
            String scenarios = job == Job.STRESS ? SampleFund.DATA.resolve("scenarios.yaml").toString() : null;
            BookFixture.Ran one = BookFixture.run(BookFixture.sample(job, scenarios), null, 1);
            BookFixture.Ran three = BookFixture.run(BookFixture.sample(job, scenarios), THREE, 3);
            assertEquals(one.results(), three.results(), job.label());
            assertEquals(one.weights(), three.weights(), job.label());
            assertEquals(one.extra(), three.extra(), job.label());
        }
    }

    @Test
    void theEnginesResultIsKeptForAJsonRendererOnlyWhenAsked() {
        BookSpec s = BookFixture.sample(Job.SOLVE, null);
        BookSpec withJson = new BookSpec(s.job(), s.book(), null, null, null, null, s.assumptionSets(), null, null,
                Units.DECIMAL, true);
        Object detail = BookFixture.run(withJson, null, 1).row(0).detail();
        assertTrue(detail instanceof Solution, String.valueOf(detail));
        assertNull(BookFixture.run(BookFixture.sample(Job.SOLVE, null), null, 1).row(0).detail());
    }

    private static double[] weightsOf(PortfolioResult r) {
        List<Double> w = new ArrayList<>();
        for (Object[] v : r.weights()) {
            w.add((Double) v[2]);
        }
        return w.stream().mapToDouble(Double::doubleValue).toArray();
    }

    private static void assertBits(double expected, CsvRow out, CsvTable t, String column) {
        String cell = out.cell(t.column(column));
        assertEquals(Double.doubleToLongBits(expected), Double.doubleToLongBits(Double.parseDouble(cell)),
                column + ": " + expected + " vs " + cell);
    }
}

package org.isorisk.notebooks.pack;

import java.math.BigDecimal;
import java.text.Normalizer;
import java.time.OffsetDateTime;
import java.util.ArrayList;
import java.util.HashSet;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Locale;
import java.util.Objects;
import java.util.Optional;
import java.util.Set;
import org.isorisk.engine.error.NoSolutionException;
import org.isorisk.engine.explain.Caution;
import org.isorisk.engine.explain.Explain;
import org.isorisk.engine.explain.MandateWords;
import org.isorisk.engine.model.AssetUniverse;
import org.isorisk.engine.model.Branch;
import org.isorisk.engine.model.Certificate;
import org.isorisk.engine.model.Multiplier;
import org.isorisk.engine.model.Solution;
import org.isorisk.engine.rebalance.Breach;
import org.isorisk.engine.rebalance.RebalanceResult;
import org.isorisk.engine.rebalance.Trade;
import org.isorisk.engine.rebalance.TradingLimits;
import org.isorisk.engine.risk.Correlations;
import org.isorisk.engine.risk.RiskDecomposition;
import org.isorisk.engine.stress.ScenarioPoint;
import org.isorisk.engine.stress.ScenarioResult;
import org.isorisk.engine.stress.StressResult;
import org.isorisk.engine.stress.TargetPoint;
import org.isorisk.notebooks.PackContent;
import org.isorisk.notebooks.report.Table;

/**
 * Lays the results of a committee pack's analyses ({@link PackResults}) out as {@link PackContent}: the summary's
 * key points, the assumptions, the minimum-variance, target and tangency portfolios, the sampled frontier, the risk
 * decomposition of the proposal, the binding constraints with their shadow prices in sentences, the trade list from
 * current holdings (the rebalancer's move toward the proposed target within the policy's trading limits and after
 * its costs), today's breaches of the policy, the stress tables (each point with its status), the charts, the
 * appendix and the run record. One story: the proposal every section describes is the portfolio the trade list
 * reaches ({@link PackResults#proposal()}); when the trading limits or costs keep it from the target portfolio, both
 * are shown side by side with plain labels. It runs no analysis: every number comes from the results it is given;
 * this class only chooses how to show them.
 */
public final class PackComposer {
    private PackComposer() {
    }

    /** Label of the current holdings in the pack's tables. */
    public static final String CURRENT = "Current holdings";

    /** Up to this many assets the correlation matrix's columns carry the names; beyond, numbers. */
    static final int NAMED_CORRELATION_COLUMNS = 6;

    /** Title of the trade table when it is the full move to the target portfolio. */
    public static final String FULL_MOVE_TITLE = "Trades from the current holdings: the full move to the proposal";
    /** Title of the trade table when the trading limits or costs keep the trades from the target portfolio. */
    public static final String WITHIN_LIMITS_TITLE = "Trades from the current holdings to the proposal";
    /** Label of today's assumptions in the stress tables. */
    public static final String TODAY = "Today's assumptions";
    /** The note on a stress point on its scenario's inefficient branch. */
    public static final String INEFFICIENT_UNDER_SCENARIO = "on this scenario's inefficient branch: the target is "
            + "below the scenario's minimum-variance return";

    /**
     * What the pack says besides the results: how the assumptions were made, the run record, the charts.
     *
     * @param estimator   how the assumptions were made, in words; the pack file's {@code assumptions_note} wins
     * @param toolVersion isorisk's version
     * @param created     when the pack is made
     * @param parameters  the run's parameters as given on the command line
     * @param inputs      the input files with their SHA-256
     * @param notes       remarks from reading the inputs (warnings), for the run record
     * @param charts      draws the charts
     */
    public record Request(String estimator, String toolVersion, OffsetDateTime created,
                          List<PackContent.Parameter> parameters, List<PackContent.InputFile> inputs,
                          List<String> notes, ChartMaker charts) {

        public Request {
            estimator = estimator == null ? "" : estimator;
            Objects.requireNonNull(toolVersion, "toolVersion");
            Objects.requireNonNull(created, "created");
            parameters = List.copyOf(parameters);
            inputs = List.copyOf(inputs);
            notes = List.copyOf(notes);
            Objects.requireNonNull(charts, "charts");
        }
    }

    /**
     * Lays out {@code results}: draws the charts the pack file asks for, then the tables and sentences. The run
     * record's notes are the request's, then why there is no tangency portfolio, then the charts' and the stress
     * run's.
     */
    public static PackContent compose(PackResults results, Request r) {
        List<String> notes = new ArrayList<>(r.notes());
        results.noTangency().ifPresent(notes::add);
        List<PackContent.Chart> charts = r.charts().draw(results);
        if (charts.isEmpty() && !results.spec().charts().isEmpty()) {
            notes.add("Charts were asked for but none was drawn.");
        }
        // the proposal under each scenario first (one story: the portfolio the trades reach), then the targets
        List<Table> stress = new ArrayList<>();
        if (!results.underStress().isEmpty()) {
            stress.add(underStressTable(results));
        }
        results.stress().ifPresent(sr -> {
            stress.add(stressTable(sr, notSolved(results, PackResults.StressRun.AT_TARGETS)));
            notes.addAll(sr.notes());
        });
        List<Table> appendix = new ArrayList<>();
        results.stressSweep().ifPresent(sr -> {
            appendix.add(stressSweepTable(sr, notSolved(results, PackResults.StressRun.ALONG_FRONTIER)));
            notes.addAll(sr.notes());
        });
        return layout(r, results, charts, notes, stress, appendix);
    }

    private static List<PackResults.NotSolved> notSolved(PackResults res, PackResults.StressRun run) {
        return res.notSolved().stream().filter(x -> x.run() == run).toList();
    }

    // ------------------------------------------------------------------ layout

    /**
     * One row per scenario and target: the scenario's least risk, its change from today's, today's optimum at the
     * target under the scenario, the turnover to re-optimise, the point's status and a note (why it has no solution;
     * a point on the scenario's inefficient branch).
     */
    private static Table stressTable(StressResult sr, List<PackResults.NotSolved> notSolved) {
        Table.Builder b = Table.builder("stress", "Stress: the targets under each scenario")
                .column(Table.Column.text("scenario", "Scenario"))
                .column(Table.Column.percent("target", "Target"))
                .column(Table.Column.text("status", "Status"))
                .column(Table.Column.percent("volatility", "Least volatility"))
                .column(Table.Column.percent("change", "Change from today's least volatility"))
                .column(Table.Column.percent("base_proposal_risk", "Today's optimum: volatility under the scenario"))
                .column(Table.Column.percent("base_proposal_return", "Today's optimum: return under the scenario"))
                .column(Table.Column.percent("turnover", "Turnover to re-optimise"))
                .column(Table.Column.text("note", "Note"));
        List<TargetPoint> today = sr.base().points();
        for (ScenarioResult s : sr.scenarios()) {
            for (int k = 0; k < s.points().size(); k++) {
                ScenarioPoint p = s.points().get(k);
                PackResults.PointStatus status = status(p.feasible(), notSolved, Optional.of(s.scenario().name()),
                        p.target());
                List<String> note = new ArrayList<>();
                if (!p.feasible()) {
                    note.add(listed(notSolved, Optional.of(s.scenario().name()), p.target())
                            ? unsolvedNote(status, p.reason()) : "target out of reach under this scenario");
                } else if (inefficient(s, k)) {
                    note.add(INEFFICIENT_UNDER_SCENARIO);
                }
                if (k < today.size() && !today.get(k).feasible()
                        && listed(notSolved, Optional.empty(), today.get(k).target())) {
                    note.add("no comparison with today: today's point at this target was not solved");
                }
                b.row(s.scenario().name(), p.target(), status.label(), p.volatility(), p.change(), p.baseRisk(),
                        p.baseReturn(), p.turnover(), String.join("; ", note));
            }
        }
        return b.build();
    }

    /** The proposal, and today's holdings when given, under today's assumptions and under each scenario. */
    private static Table underStressTable(PackResults res) {
        boolean held = res.currentRisk().isPresent();
        Table.Builder b = Table.builder("stress_proposal", "The proposal under each scenario")
                .column(Table.Column.text("scenario", "Assumptions"))
                .column(Table.Column.percent("proposal_return", "Proposal: expected return"))
                .column(Table.Column.percent("proposal_volatility", "Proposal: volatility"));
        if (held) {
            b.column(Table.Column.percent("current_return", CURRENT + ": expected return"))
                    .column(Table.Column.percent("current_volatility", CURRENT + ": volatility"));
        }
        if (held) {
            RiskDecomposition now = res.currentRisk().get();
            b.row(TODAY, res.risk().expectedReturn(), res.risk().volatility(), now.expectedReturn(),
                    now.volatility());
        } else {
            b.row(TODAY, res.risk().expectedReturn(), res.risk().volatility());
        }
        for (PackResults.UnderStress x : res.underStress()) {
            if (held) {
                b.row(x.scenario(), x.proposalReturn(), x.proposalVolatility(), x.currentReturn(),
                        x.currentVolatility());
            } else {
                b.row(x.scenario(), x.proposalReturn(), x.proposalVolatility());
            }
        }
        return b.build();
    }

    /**
     * The data behind the stress chart: one row per curve (today's assumptions, then each scenario) and frontier
     * target, with the point's status, its least volatility and why a point has none.
     */
    private static Table stressSweepTable(StressResult sr, List<PackResults.NotSolved> notSolved) {
        Table.Builder b = Table.builder("stress_frontier", "Data of the stress chart: the frontier under each "
                        + "scenario")
                .column(Table.Column.text("scenario", "Scenario"))
                .column(Table.Column.percent("target", "Target"))
                .column(Table.Column.text("status", "Status"))
                .column(Table.Column.percent("volatility", "Least volatility"))
                .column(Table.Column.text("note", "Note"));
        for (TargetPoint p : sr.base().points()) {
            PackResults.PointStatus st = status(p.feasible(), notSolved, Optional.empty(), p.target());
            b.row(TODAY, p.target(), st.label(), p.volatility(), sweepNote(p, st, notSolved, Optional.empty(), ""));
        }
        for (ScenarioResult s : sr.scenarios()) {
            Optional<String> name = Optional.of(s.scenario().name());
            for (TargetPoint p : s.sweep().points()) {
                PackResults.PointStatus st = status(p.feasible(), notSolved, name, p.target());
                b.row(s.scenario().name(), p.target(), st.label(), p.volatility(),
                        sweepNote(p, st, notSolved, name, INEFFICIENT_UNDER_SCENARIO));
            }
        }
        return b.build();
    }

    private static String sweepNote(TargetPoint p, PackResults.PointStatus st, List<PackResults.NotSolved> notSolved,
                                    Optional<String> scenario, String inefficient) {
        if (p.feasible()) {
            return p.solution() != null && Branch.inefficient(p.solution()) ? (inefficient.isEmpty()
                    ? "on the inefficient branch: the target is below the minimum-variance return" : inefficient) : "";
        }
        return listed(notSolved, scenario, p.target()) ? unsolvedNote(st, p.reason())
                : "target out of reach" + (scenario.isPresent() ? " under this scenario" : "");
    }

    /** The note on a point the solver failed on: its status in words and the solver's message. */
    private static String unsolvedNote(PackResults.PointStatus st, String reason) {
        return (st == PackResults.PointStatus.NOT_SOLVED ? "not solved: " : "no solution: ") + reason;
    }

    /** True when the scenario's point {@code k} solves a target below the scenario's minimum-variance return. */
    private static boolean inefficient(ScenarioResult s, int k) {
        List<TargetPoint> sweep = s.sweep() == null ? List.of() : s.sweep().points();
        return k < sweep.size() && sweep.get(k).solution() != null && Branch.inefficient(sweep.get(k).solution());
    }

    private static boolean listed(List<PackResults.NotSolved> notSolved, Optional<String> scenario, double target) {
        return notSolved.stream().anyMatch(x -> x.scenario().equals(scenario) && x.target() == target);
    }

    /** A point's status: optimal when solved, the reported status when not solved, else infeasible. */
    private static PackResults.PointStatus status(boolean feasible, List<PackResults.NotSolved> notSolved,
                                                  Optional<String> scenario, double target) {
        if (feasible) {
            return PackResults.PointStatus.OPTIMAL;
        }
        return notSolved.stream().filter(x -> x.scenario().equals(scenario) && x.target() == target)
                .map(PackResults.NotSolved::status).findFirst().orElse(PackResults.PointStatus.INFEASIBLE);
    }

    private static PackContent layout(Request r, PackResults res, List<PackContent.Chart> charts, List<String> notes,
                                      List<Table> stress, List<Table> appendix) {
        PackSpec spec = res.spec();
        AssetUniverse u = res.universe();
        List<String> assets = u.assets();
        int n = u.size();

        PackContent.Heading heading = new PackContent.Heading(spec.fund(), spec.currency(), spec.asOf(), spec.note(),
                Caution.TEXT);

        Table.Builder at = Table.builder("assumptions", "Assumptions")
                .column(Table.Column.text("asset", "Asset"))
                .column(Table.Column.percent("expected_return", "Expected return"))
                .column(Table.Column.percent("volatility", "Volatility"));
        for (int i = 0; i < n; i++) {
            at.row(assets.get(i), u.expectedReturn(i), Math.sqrt(u.covariance(i, i)));
        }
        Correlations corr = res.correlations();
        List<String> keys = columnKeys(assets);
        // Many assets: columns headed by number (the "No." column says which), so the matrix fits a page.
        boolean numbered = n > NAMED_CORRELATION_COLUMNS;
        Table.Builder ct = Table.builder("correlation", "Correlations").column(Table.Column.text("asset", "Asset"));
        if (numbered) {
            ct.column(Table.Column.text("no", "No."));
        }
        for (int j = 0; j < n; j++) {
            ct.column(Table.Column.decimal(keys.get(j), numbered ? Integer.toString(j + 1) : assets.get(j)));
        }
        for (int i = 0; i < n; i++) {
            List<Object> row = new ArrayList<>();
            row.add(assets.get(i));
            if (numbered) {
                row.add(Integer.toString(i + 1));
            }
            for (int j = 0; j < n; j++) {
                row.add(corr.get(i, j));
            }
            ct.row(row.toArray());
        }
        String estimator = !spec.assumptionsNote().isBlank() ? spec.assumptionsNote()
                : !r.estimator().isBlank() ? r.estimator() : "Expected returns and covariance as given in the input tables.";
        PackContent.Assumptions assumptions = new PackContent.Assumptions(at.build(), ct.build(), pair(corr.lowest()),
                pair(corr.highest()), corr.average(), res.conditionNumber(), estimator);

        // portfolios, in order: minimum variance, targets, tangency, the proposal when it is not a target portfolio
        boolean differs = res.proposalDiffersFromTarget();
        Solution target = res.targetPortfolio();
        String why = qualifier(res);
        String proposalLabel = differs ? "Proposed (after " + why + ")" : null;
        List<Solution> sols = new ArrayList<>();
        List<String> labels = new ArrayList<>();
        List<String> columns = new ArrayList<>();
        List<String> remarks = new ArrayList<>();
        sols.add(res.minimum());
        labels.add("Minimum variance");
        columns.add("minimum_variance");
        remarks.add("");
        for (int k = 0; k < res.targets().size(); k++) {
            double t = spec.targets().get(k);
            Solution s = res.targets().get(k);
            String remark = "";
            if (s == target && differs) {
                remark = PackContent.Portfolio.BEFORE_TRADING + why + ": the trades do not reach it";
            } else if (s == target) {
                s = res.proposal(); // the portfolio the trades reach (the same, to 1e-6 in every weight)
            }
            if (Branch.inefficient(s)) {
                remark = (remark.isEmpty() ? "" : remark + "; ") + INEFFICIENT_BRANCH;
            }
            sols.add(s);
            labels.add("Target " + Explain.percent(t));
            columns.add("target_" + BigDecimal.valueOf(t).movePointRight(2).stripTrailingZeros().toPlainString()
                    .replace('.', '_').replace("-", "minus_"));
            remarks.add(remark);
        }
        res.tangency().ifPresent(s -> {
            sols.add(s);
            labels.add("Tangency (risk-free " + Explain.percent(spec.riskFree().orElseThrow()) + ")");
            columns.add("tangency");
            remarks.add("");
        });
        if (differs) {
            sols.add(res.proposal());
            labels.add(proposalLabel);
            columns.add("proposed");
            remarks.add("the portfolio the trade list reaches");
        }
        String shownAsProposal = differs ? proposalLabel : labels.get(1 + spec.targets().indexOf(spec.proposed()));
        List<PackContent.Portfolio> portfolios = new ArrayList<>();
        List<PackContent.Binding> binding = new ArrayList<>();
        Table.Builder cons = Table.builder("constraints", "Binding constraints and shadow prices")
                .column(Table.Column.text("portfolio", "Portfolio"))
                .column(Table.Column.text("constraint", "Constraint"))
                .column(Table.Column.number("variance_per_unit", "∂V*/∂limit"))
                .column(Table.Column.number("volatility_per_unit", "∂σ*/∂limit"));
        Set<String> runNotes = new LinkedHashSet<>(notes);
        for (int k = 0; k < sols.size(); k++) {
            Solution s = sols.get(k);
            Certificate c = s.certificate();
            portfolios.add(new PackContent.Portfolio(labels.get(k), labels.get(k).equals(shownAsProposal),
                    s.expectedReturn(), s.volatility(), s.method().label(), certificateLine(c), c.passes(),
                    remarks.get(k)));
            for (Multiplier m : s.binding()) {
                String sentence = Explain.sentence(m);
                binding.add(new PackContent.Binding(labels.get(k), m.constraint(), m.variancePerUnit(),
                        m.volatilityPerUnit(), sentence));
                cons.row(labels.get(k), m.constraint(), m.variancePerUnit(), m.volatilityPerUnit());
            }
            boolean move = res.rebalance().isPresent() && s == res.proposal();
            if (!move) { // the move's notes are listed once below, as the trades' notes
                runNotes.addAll(s.notes());
            }
            if (!c.passes()) {
                runNotes.add(labels.get(k) + ": the KKT certificate is above its tolerance (" + certificateLine(c)
                        + "); treat this portfolio with caution.");
            }
        }

        res.currentRisk().ifPresent(c -> portfolios.add(new PackContent.Portfolio(CURRENT, false, c.expectedReturn(),
                c.volatility(), PackContent.GIVEN, "given, not optimised", true,
                res.breaches().isEmpty() ? "" : breachCount(res.breaches().size()))));
        Table.Builder wt = Table.builder("weights", "Weights").column(Table.Column.text("asset", "Asset"));
        for (int k = 0; k < sols.size(); k++) {
            wt.column(Table.Column.percent(columns.get(k), labels.get(k)));
        }
        Optional<double[]> held = res.holdings();
        held.ifPresent(h -> wt.column(Table.Column.percent("current", CURRENT)));
        for (int i = 0; i < n; i++) {
            List<Object> row = new ArrayList<>();
            row.add(assets.get(i));
            for (Solution s : sols) {
                row.add(s.weight(i));
            }
            if (held.isPresent()) {
                row.add(held.get()[i]);
            }
            wt.row(row.toArray());
        }

        Optional<Table> frontier = Optional.empty();
        if (!res.frontier().points().isEmpty()) {
            Table.Builder ft = Table.builder("frontier", "Efficient frontier (sampled)")
                    .column(Table.Column.text("point", "Point"))
                    .column(Table.Column.percent("expected_return", "Expected return"))
                    .column(Table.Column.percent("volatility", "Volatility"));
            spec.riskFree().ifPresent(rf -> ft.column(Table.Column.decimal("sharpe_ratio", "Sharpe ratio")));
            int k = 1;
            for (Solution s : res.frontier().points()) {
                if (spec.riskFree().isPresent()) {
                    double rf = spec.riskFree().get();
                    ft.row(Integer.toString(k++), s.expectedReturn(), s.volatility(),
                            s.volatility() > 0 ? (s.expectedReturn() - rf) / s.volatility() : Double.NaN);
                } else {
                    ft.row(Integer.toString(k++), s.expectedReturn(), s.volatility());
                }
            }
            frontier = Optional.of(ft.build());
        }

        // the risk of the proposal: the portfolio the trades reach
        double[] w = res.proposal().weights();
        double[] marginal = res.risk().marginal();
        double[] contribution = res.risk().component();
        double vol = res.risk().volatility();
        Table.Builder rt = Table.builder("risk", "Risk of the proposal")
                .column(Table.Column.text("asset", "Asset"))
                .column(Table.Column.percent("weight", "Weight"))
                .column(Table.Column.percent("marginal_risk", "Marginal risk"))
                .column(Table.Column.percent("contribution", "Contribution to volatility"))
                .column(Table.Column.percent("share", "Share of volatility"));
        for (int i = 0; i < n; i++) {
            rt.row(assets.get(i), w[i], marginal[i], contribution[i], vol > 0 ? contribution[i] / vol : Double.NaN);
        }

        Optional<Table> trades = Optional.empty();
        Optional<PackContent.Trading> trading = Optional.empty();
        if (held.isPresent()) {
            res.rebalance().ifPresent(rb -> {
                for (String note : rb.notes()) {
                    // the conventions are printed in the Trades section itself
                    if (!note.equals(RebalanceResult.TURNOVER_CONVENTION)
                            && !note.equals(RebalanceResult.COST_CONVENTION)) {
                        runNotes.add("Trades: " + note);
                    }
                }
            });
            trades = res.rebalance().map(rb -> trades(rb, spec, differs));
            trading = Optional.of(trading(res, differs, proposalLabel));
        }
        List<String> breaches = res.breaches().stream().map(Breach::description).toList();

        List<PackContent.Parameter> parameters = new ArrayList<>(r.parameters());
        parameters.add(new PackContent.Parameter("Targets", String.join(", ",
                spec.targets().stream().map(Explain::percent).toList())));
        parameters.add(new PackContent.Parameter("Proposed target", Explain.percent(spec.proposed())));
        spec.riskFree().ifPresent(rf -> parameters.add(new PackContent.Parameter("Risk-free rate", Explain.percent(rf))));
        parameters.add(new PackContent.Parameter("Frontier points", Integer.toString(spec.frontierPoints())));

        List<PackContent.NotSolved> notSolved = res.notSolved().stream().map(x -> new PackContent.NotSolved(
                x.run() == PackResults.StressRun.AT_TARGETS ? "stress table" : "stress chart",
                x.scenario().orElse(TODAY.toLowerCase(Locale.ROOT)), x.target(), x.status().label(), x.reason()))
                .toList();
        PackContent.RunRecord run = new PackContent.RunRecord(r.toolVersion(), r.created(), parameters, r.inputs(),
                new ArrayList<>(runNotes));
        List<PackContent.KeyPoint> keyPoints = keyPoints(res, portfolios, binding, trading, breaches, notSolved,
                stress);
        return new PackContent(heading, assumptions, MandateWords.describe(res.mandate(), assets), portfolios, frontier,
                wt.build(), rt.build(), binding, cons.build(), charts, trades, stress, run, trading, keyPoints,
                breaches, notSolved, appendix);
    }

    /** The remark on a target portfolio below the minimum-variance return. */
    public static final String INEFFICIENT_BRANCH = "on the inefficient branch: its return is below the "
            + "minimum-variance portfolio's, which has less risk";

    /**
     * What keeps the trades from the target portfolio, in words: "trading limits and costs", "trading limits" or
     * "trading costs". With a move, the limits count when the full move to the target portfolio would break one or
     * one of them binds the move (its shadow price is not zero); without a move, whatever the policy sets.
     */
    static String qualifier(PackResults res) {
        TradingLimits lim = res.trading();
        boolean broken = res.fullMove().map(f -> !f.breaks().isEmpty()).orElse(false);
        boolean limits = res.rebalance().map(x -> broken || tradingLimitBinds(x)).orElse(lim.restrictsTrading());
        return limits && lim.hasCosts() ? "trading limits and costs" : limits ? "trading limits"
                : lim.hasCosts() ? "trading costs" : applies(lim);
    }

    /** What the policy sets, in words: "trading limits and costs", "trading limits" or "trading costs". */
    static String applies(TradingLimits lim) {
        return lim.restrictsTrading() && lim.hasCosts() ? "trading limits and costs"
                : lim.restrictsTrading() ? "trading limits" : "trading costs";
    }

    /** True when a trading limit (turnover, a trade limit, the no-trade list, the minimum trade) binds the move. */
    static boolean tradingLimitBinds(RebalanceResult x) {
        return x.binding().stream().map(Multiplier::constraint).anyMatch(c -> c.equals("turnover")
                || c.startsWith("trade_limit:") || c.startsWith("no_trade:") || c.startsWith("min_trade:"));
    }

    private static String breachCount(int k) {
        return k == 1 ? "breaks one limit of the policy" : "breaks " + k + " limits of the policy";
    }

    /**
     * The summary's lines: the proposal (and the target portfolio beside it when they differ), the minimum-variance
     * portfolio, today's holdings and their breaches of the policy, the trades, targets on the inefficient branch,
     * stress points not solved, the binding constraints and the certificates.
     */
    private static List<PackContent.KeyPoint> keyPoints(PackResults res, List<PackContent.Portfolio> portfolios,
                                                        List<PackContent.Binding> binding,
                                                        Optional<PackContent.Trading> trading, List<String> breaches,
                                                        List<PackContent.NotSolved> notSolved, List<Table> stress) {
        List<PackContent.KeyPoint> out = new ArrayList<>();
        PackContent.Portfolio p = portfolios.stream().filter(PackContent.Portfolio::proposed).findFirst()
                .orElseThrow();
        String target = Explain.percent(res.spec().proposed());
        boolean differs = res.proposalDiffersFromTarget();
        out.add(new PackContent.KeyPoint("Proposed portfolio", (differs ? "" : p.label() + ": ") + "expected return "
                + Explain.percent(p.expectedReturn()) + " a year with volatility " + Explain.percent(p.volatility())
                + (differs ? " (\"" + p.label() + "\" in the tables)" : "")
                + (res.rebalance().isPresent() ? "; the trade list below reaches it from today's holdings" : "")
                + (res.outOfReach().isPresent() ? "; no trade list reaches it within the trading limits" : "")
                + ". The risk section, the charts and the stress tables describe this portfolio.", false));
        if (differs) {
            Solution t = res.targetPortfolio();
            out.add(new PackContent.KeyPoint("Target portfolio, side by side", "the least-risk portfolio at the "
                    + target + " target before " + qualifier(res) + " has expected return "
                    + Explain.percent(t.expectedReturn()) + " and volatility " + Explain.percent(t.volatility())
                    + res.fullMove().map(f -> "; reaching it would need turnover " + Explain.percent(f.turnover()))
                    .orElse("") + ". The " + qualifier(res) + " keep the trades from it; the Portfolios "
                    + "and Weights tables show both.", false));
        }
        PackContent.Portfolio first = portfolios.get(0);
        out.add(new PackContent.KeyPoint(first.label(), "expected return " + Explain.percent(first.expectedReturn())
                + ", volatility " + Explain.percent(first.volatility()) + ": the least risk the mandate allows.", false));
        res.currentRisk().ifPresent(c -> out.add(new PackContent.KeyPoint(CURRENT, "expected return "
                + Explain.percent(c.expectedReturn()) + ", volatility " + Explain.percent(c.volatility()) + ".",
                false)));
        if (res.holdings().isPresent()) {
            if (breaches.isEmpty()) {
                out.add(new PackContent.KeyPoint("Policy breaches today", "none: today's holdings keep every limit of "
                        + "the policy.", false));
            } else {
                out.add(new PackContent.KeyPoint("Policy breaches today", "today's holdings break "
                        + (breaches.size() == 1 ? "one limit" : breaches.size() + " limits") + " of the policy: "
                        + String.join(" ", breaches), true));
            }
        }
        trading.ifPresent(t -> out.add(new PackContent.KeyPoint("Trades", t.headline(), false)));
        List<String> low = new ArrayList<>();
        for (PackContent.Portfolio x : portfolios) {
            if (x.remark().contains(INEFFICIENT_BRANCH)) {
                low.add(x.label());
            }
        }
        long lowUnderStress = stress.stream().filter(t -> t.name().equals("stress")).flatMap(t -> t.rows().stream())
                .filter(row -> row.get(row.size() - 1) instanceof Table.Cell.Text c
                        && c.value().contains(INEFFICIENT_UNDER_SCENARIO)).count();
        if (!low.isEmpty() || lowUnderStress > 0) {
            List<String> parts = new ArrayList<>();
            if (!low.isEmpty()) {
                parts.add(String.join(", ", low) + (low.size() == 1 ? " lies" : " lie") + " below the minimum-variance "
                        + "return (" + Explain.percent(res.minimum().expectedReturn()) + "), on the inefficient branch "
                        + "of the frontier: the minimum-variance portfolio has more return for less risk, and raising "
                        + "the target would lower the risk.");
            }
            if (lowUnderStress > 0) {
                parts.add(lowUnderStress == 1 ? "1 point of the stress table lies on the inefficient branch of its "
                        + "scenario's frontier (see the Note column)." : lowUnderStress + " points of the stress table "
                        + "lie on the inefficient branch of their scenario's frontier (see the Note column).");
            }
            out.add(new PackContent.KeyPoint("Inefficient branch", String.join(" ", parts), true));
        }
        if (!notSolved.isEmpty()) {
            List<String> each = new ArrayList<>();
            for (PackContent.NotSolved x : notSolved) {
                each.add(x.scenario() + " at " + Explain.percent(x.target()) + " in the " + x.where() + " ("
                        + x.status() + ": " + x.reason() + ")");
            }
            out.add(new PackContent.KeyPoint("Stress points not solved", notSolved.size() + " stress point"
                    + (notSolved.size() == 1 ? " was" : "s were") + " not solved and "
                    + (notSolved.size() == 1 ? "is" : "are") + " reported with its status instead: "
                    + String.join("; ", each) + ". The rest of the pack is complete.", true));
        }
        long bindingHere = binding.stream().filter(b -> b.portfolio().equals(p.label())).count();
        out.add(new PackContent.KeyPoint("Binding constraints of the proposal", bindingHere
                + " (each with its shadow price below).", false));
        boolean allPass = portfolios.stream().allMatch(PackContent.Portfolio::passes);
        // (the current holdings were given, not solved: they carry no certificate and count as passing)
        out.add(new PackContent.KeyPoint("Certificates", allPass
                ? "every portfolio satisfies its optimality (KKT) conditions within tolerance."
                : "at least one portfolio's KKT certificate is above its tolerance: read the run record.", !allPass));
        return out;
    }

    /** The trade list: the rebalancer's move, one row per asset in the universe's order. */
    private static Table trades(RebalanceResult rb, PackSpec spec, boolean differs) {
        boolean money = spec.fundSize().isPresent();
        Table.Builder b = Table.builder("trades", differs ? WITHIN_LIMITS_TITLE : FULL_MOVE_TITLE)
                .column(Table.Column.text("asset", "Asset"))
                .column(Table.Column.percent("current", "Current"))
                .column(Table.Column.percent("proposed", "Proposed"))
                .column(Table.Column.percent("change", "Change"));
        if (money) {
            b.column(Table.Column.amount("amount", "Amount (" + spec.currency() + ")"))
                    .column(Table.Column.amount("cost", "Cost (" + spec.currency() + ")"));
        } else {
            b.column(Table.Column.percent("cost", "Cost"));
        }
        b.column(Table.Column.text("side", "Side")).column(Table.Column.text("note", "Note"));
        double size = spec.fundSize().orElse(Double.NaN);
        for (Trade t : rb.trades()) {
            String note = t.frozen() == null ? "" : t.frozen().equals("no-trade") ? "on the no-trade list"
                    : "trade below the minimum size dropped";
            if (money) {
                b.row(t.asset(), t.current(), t.target(), t.trade(), t.amount(), t.cost() * size, t.side().label(),
                        note);
            } else {
                b.row(t.asset(), t.current(), t.target(), t.trade(), t.cost(), t.side().label(), note);
            }
        }
        return b.build();
    }

    /**
     * How the trade list was made: which of the three it is, the limits in words, the full move to the target
     * portfolio beside the proposal, today's breaches, the engine's shadow-price sentences, the conventions.
     */
    private static PackContent.Trading trading(PackResults res, boolean differs, String proposalLabel) {
        AssetUniverse u = res.universe();
        TradingLimits lim = res.trading();
        Solution t = res.targetPortfolio();
        RiskDecomposition now = res.currentRisk().orElseThrow();
        PackResults.FullMove full = res.fullMove().orElseThrow();
        double fullTurnover = full.turnover();
        double fullCost = full.cost();
        String target = Explain.percent(res.spec().proposed());
        Optional<RebalanceResult> rb = res.rebalance();

        PackContent.Trading.Mode mode;
        String headline;
        if (rb.isEmpty()) {
            mode = PackContent.Trading.Mode.OUT_OF_REACH;
            NoSolutionException e = res.outOfReach().orElseThrow();
            headline = (e.reason() == NoSolutionException.Reason.INFEASIBLE
                    ? "The proposal's target " + target + " cannot be reached within the policy's trading limits, "
                    + "so the pack proposes no trade list: "
                    : "No trade list within the policy's trading limits was found, so the pack proposes none: ")
                    + e.getMessage() + " (here the target is the pack file's proposed target). The full move to the "
                    + "target portfolio would need turnover " + Explain.percent(fullTurnover) + ".";
        } else if (!differs) {
            mode = PackContent.Trading.Mode.FULL_MOVE;
            RebalanceResult x = rb.get();
            headline = (lim.restrictsTrading() || lim.hasCosts()
                    ? "The policy's " + applies(lim) + " do not change the answer here, so the trade list is the "
                    : "No trading limit or cost applies (the policy sets none), so the trade list is the ")
                    + "full move from the current holdings to the least-risk portfolio at the " + target
                    + " target: turnover " + Explain.percent(x.turnover()) + ".";
        } else {
            mode = PackContent.Trading.Mode.WITHIN_LIMITS;
            RebalanceResult x = rb.get();
            headline = "The trade list is the least-risk move from the current holdings that reaches the " + target
                    + " target after costs" + (lim.restrictsTrading() ? " within the policy's trading limits" : "")
                    + ", with turnover " + Explain.percent(x.turnover())
                    + (Double.isFinite(lim.maxTurnover()) ? " (limit " + Explain.percent(lim.maxTurnover()) + ")" : "")
                    + "; the proposal is the portfolio it reaches. The full move to the target portfolio before "
                    + qualifier(res) + " would need turnover " + Explain.percent(fullTurnover) + ".";
        }

        String fullLabel = "Full move to the target portfolio (" + target + ")";
        Table.Builder cmp = Table.builder("trade_summary", mode == PackContent.Trading.Mode.WITHIN_LIMITS
                        ? "The full move to the target portfolio beside the proposal" : "The full move to the proposal")
                .column(Table.Column.text("portfolio", "Portfolio"))
                .column(Table.Column.percent("expected_return", "Expected return"))
                .column(Table.Column.percent("return_after_costs", "Return after costs"))
                .column(Table.Column.percent("volatility", "Volatility"))
                .column(Table.Column.percent("turnover", "Turnover (two-way)"))
                .column(Table.Column.percent("cost", "Cost"))
                .column(Table.Column.percent("tracking_error", "Tracking error against today"));
        cmp.row(CURRENT, now.expectedReturn(), now.expectedReturn(), now.volatility(), 0.0, 0.0, 0.0);
        if (mode == PackContent.Trading.Mode.FULL_MOVE) {
            RebalanceResult x = rb.get();
            cmp.row("Full move to the proposal", x.proposedReturn(), x.proposedNetReturn(), x.proposedVolatility(),
                    x.turnover(), x.cost(), x.trackingError());
        } else {
            cmp.row(fullLabel, t.expectedReturn(), t.expectedReturn() - fullCost, t.volatility(), fullTurnover,
                    fullCost, full.trackingError());
            rb.ifPresent(x -> cmp.row(proposalLabel, x.proposedReturn(), x.proposedNetReturn(),
                    x.proposedVolatility(), x.turnover(), x.cost(), x.trackingError()));
        }

        String reading = "";
        if (mode == PackContent.Trading.Mode.WITHIN_LIMITS) {
            RebalanceResult x = rb.get();
            boolean binds = tradingLimitBinds(x);
            double fullNet = t.expectedReturn() - fullCost;
            if (binds) {
                reading = "The trading limits bind: keeping to them" + (lim.hasCosts() ? " and paying the costs" : "")
                        + " moves the volatility from " + Explain.percent(t.volatility()) + " (the target portfolio) "
                        + "to " + Explain.percent(x.proposedVolatility()) + " (the proposal); what each binding limit "
                        + "costs at the margin is below.";
            } else if (lim.hasCosts() && fullNet < res.spec().proposed()) {
                reading = "No trading limit binds here: the proposal differs from the target portfolio because "
                        + "trading costs are deducted from the return the target must reach; the full move would "
                        + "return " + Explain.percent(fullNet) + " after costs, short of the " + target + " target.";
            } else {
                reading = "No trading limit binds here: the proposal differs from the target portfolio only through "
                        + "the trading costs.";
            }
        }
        List<String> tradingNotes = new ArrayList<>();
        tradingNotes.add(RebalanceResult.TURNOVER_CONVENTION);
        if (lim.hasCosts()) {
            tradingNotes.add(RebalanceResult.COST_CONVENTION);
        }
        rb.ifPresent(x -> tradingNotes.add("The move: " + certificateLine(x.proposal().certificate())
                + " (the KKT certificate of the rebalance problem)."));
        return new PackContent.Trading(mode, headline, limitWords(lim, u.assets()), cmp.build(), reading,
                res.breaches().stream().map(Breach::description).toList(),
                mode == PackContent.Trading.Mode.WITHIN_LIMITS ? rb.get().sentences() : List.of(), tradingNotes);
    }

    /** The trading limits in words, one per rule; empty when none applies. */
    static List<String> limitWords(TradingLimits lim, List<String> assets) {
        List<String> out = new ArrayList<>();
        if (Double.isFinite(lim.maxTurnover())) {
            out.add("Turnover (two-way: buys plus sells) at most " + Explain.percent(lim.maxTurnover())
                    + " of the fund.");
        }
        double[] t = lim.maxTrade();
        List<String> capped = new ArrayList<>();
        boolean same = true;
        for (int i = 0; i < t.length; i++) {
            if (Double.isFinite(t[i])) {
                capped.add(assets.get(i) + " at most " + Explain.percent(t[i]));
            }
            same &= t[i] == t[0];
        }
        if (!capped.isEmpty()) {
            out.add(same ? "No asset trades more than " + Explain.percent(t[0]) + " of the fund."
                    : "Largest trade per asset: " + String.join("; ", capped) + ".");
        }
        if (lim.minTrade() > 0) {
            out.add("Trades smaller than " + Explain.percent(lim.minTrade()) + " of the fund are dropped (the asset "
                    + "stays at today's weight).");
        }
        if (!lim.noTrade().isEmpty()) {
            out.add("Not traded: " + String.join(", ", lim.noTrade().stream().map(assets::get).toList()) + ".");
        }
        if (lim.hasCosts()) {
            double lo = Double.POSITIVE_INFINITY;
            double hi = 0;
            for (double c : lim.costBps()) {
                lo = Math.min(lo, c);
                hi = Math.max(hi, c);
            }
            out.add("Trading costs: " + (lo == hi ? bps(lo) : bps(lo) + " to " + bps(hi))
                    + " basis points of the amount traded.");
        }
        return out;
    }

    private static String bps(double v) {
        return BigDecimal.valueOf(v).stripTrailingZeros().toPlainString();
    }

    private static PackContent.Pair pair(Correlations.Pair p) {
        return p == null ? null : new PackContent.Pair(p.first(), p.second(), p.correlation());
    }

    /** One line on a certificate, e.g. "largest KKT residual 2.1e-16 (tolerance 1e-10): passes". */
    static String certificateLine(Certificate c) {
        return String.format(Locale.ROOT, "largest KKT residual %.1e (tolerance %.0e)%s: %s", c.worst(), c.threshold(),
                c.convex() ? "" : ", covariance not positive semi-definite", c.passes() ? "passes" : "ABOVE TOLERANCE");
    }

    /** Python-friendly, unique column keys from asset names: "Government Bonds" → "government_bonds". */
    static List<String> columnKeys(List<String> names) {
        List<String> out = new ArrayList<>();
        Set<String> seen = new HashSet<>(Set.of("asset"));
        for (int i = 0; i < names.size(); i++) {
            String k = Normalizer.normalize(names.get(i), Normalizer.Form.NFKD).toLowerCase(Locale.ROOT)
                    .replaceAll("[^a-z0-9]+", "_").replaceAll("^_+|_+$", "");
            if (k.isEmpty() || !Character.isLetter(k.charAt(0))) {
                k = "asset_" + (i + 1) + (k.isEmpty() ? "" : "_" + k);
            }
            if (k.length() > 50) {
                k = k.substring(0, 50);
            }
            String base = k;
            for (int d = 2; !seen.add(k); d++) {
                k = base + "_" + d;
            }
            out.add(k);
        }
        return out;
    }
}

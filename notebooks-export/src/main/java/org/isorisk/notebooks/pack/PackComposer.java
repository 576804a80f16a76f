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
import org.isorisk.notebooks.PackContent;
import org.isorisk.notebooks.report.Table;

/**
 * Lays the results of a committee pack's analyses ({@link PackResults}) out as {@link PackContent}: the
 * assumptions, the minimum-variance, target and tangency portfolios, the sampled frontier, the risk decomposition
 * of the proposal, the binding constraints with their shadow prices in sentences, the trade list from current
 * holdings (the rebalancer's move within the policy's trading limits when it sets any, else the full move), the
 * stress table, the charts and the run record. It runs no analysis: every number comes from the results it is
 * given; this class only chooses how to show them.
 */
public final class PackComposer {
    private PackComposer() {
    }

    /** Label of the current holdings in the pack's tables. */
    public static final String CURRENT = "Current holdings";

    /** Up to this many assets the correlation matrix's columns carry the names; beyond, numbers. */
    static final int NAMED_CORRELATION_COLUMNS = 6;

    /** Title of the trade table when it is the full move to the proposal. */
    public static final String FULL_MOVE_TITLE = "Trades from the current holdings: the full move to the proposal";
    /** Title of the trade table when it is the rebalancer's move within the trading limits. */
    public static final String WITHIN_LIMITS_TITLE =
            "Trades from the current holdings within the policy's trading limits";

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
        List<Table> stress = new ArrayList<>();
        results.stress().ifPresent(sr -> {
            stress.add(stressTable(sr));
            notes.addAll(sr.notes());
        });
        return layout(r, results, charts, notes, stress);
    }

    // ------------------------------------------------------------------ layout

    /** One row per scenario and target: the scenario's minimum risk, its change, and the base proposal under it. */
    private static Table stressTable(StressResult sr) {
        Table.Builder b = Table.builder("stress", "Stress: the targets under each scenario")
                .column(Table.Column.text("scenario", "Scenario"))
                .column(Table.Column.percent("target", "Target"))
                .column(Table.Column.percent("volatility", "Least volatility"))
                .column(Table.Column.percent("change", "Change from base"))
                .column(Table.Column.percent("base_proposal_risk", "Base proposal's volatility"))
                .column(Table.Column.percent("base_proposal_return", "Base proposal's return"))
                .column(Table.Column.percent("turnover", "Turnover to re-optimise"))
                .column(Table.Column.text("note", "Note"));
        for (ScenarioResult s : sr.scenarios()) {
            for (ScenarioPoint p : s.points()) {
                b.row(s.scenario().name(), p.target(), p.volatility(), p.change(), p.baseRisk(), p.baseReturn(),
                        p.turnover(), p.feasible() ? "" : "target out of reach under this scenario");
            }
        }
        return b.build();
    }

    private static PackContent layout(Request r, PackResults res, List<PackContent.Chart> charts, List<String> notes,
                                      List<Table> stress) {
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

        // portfolios, in order: minimum variance, targets, tangency
        List<Solution> sols = new ArrayList<>();
        List<String> labels = new ArrayList<>();
        List<String> columns = new ArrayList<>();
        sols.add(res.minimum());
        labels.add("Minimum variance");
        columns.add("minimum_variance");
        for (int k = 0; k < res.targets().size(); k++) {
            double t = spec.targets().get(k);
            sols.add(res.targets().get(k));
            labels.add("Target " + Explain.percent(t));
            columns.add("target_" + BigDecimal.valueOf(t).movePointRight(2).stripTrailingZeros().toPlainString()
                    .replace('.', '_').replace("-", "minus_"));
        }
        res.tangency().ifPresent(s -> {
            sols.add(s);
            labels.add("Tangency (risk-free " + Explain.percent(spec.riskFree().orElseThrow()) + ")");
            columns.add("tangency");
        });
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
            portfolios.add(new PackContent.Portfolio(labels.get(k), s == res.proposal(), s.expectedReturn(),
                    s.volatility(), s.method().label(), certificateLine(c), c.passes()));
            for (Multiplier m : s.binding()) {
                String sentence = Explain.sentence(m);
                binding.add(new PackContent.Binding(labels.get(k), m.constraint(), m.variancePerUnit(),
                        m.volatilityPerUnit(), sentence));
                cons.row(labels.get(k), m.constraint(), m.variancePerUnit(), m.volatilityPerUnit());
            }
            runNotes.addAll(s.notes());
            if (!c.passes()) {
                runNotes.add(labels.get(k) + ": the KKT certificate is above its tolerance (" + certificateLine(c)
                        + "); treat this portfolio with caution.");
            }
        }

        res.currentRisk().ifPresent(c -> portfolios.add(new PackContent.Portfolio(CURRENT, false, c.expectedReturn(),
                c.volatility(), PackContent.GIVEN, "given, not optimised", true)));
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

        double[] w = res.proposal().weights();
        double[] marginal = res.risk().marginal();
        double[] contribution = res.risk().component();
        double vol = res.proposal().volatility();
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
            double[] h = held.get();
            if (res.rebalance().isPresent()) {
                RebalanceResult rb = res.rebalance().get();
                trades = Optional.of(trades(rb, spec));
                for (String note : rb.notes()) {
                    // the conventions are printed in the Trades section itself
                    if (!note.equals(RebalanceResult.TURNOVER_CONVENTION)
                            && !note.equals(RebalanceResult.COST_CONVENTION)) {
                        runNotes.add("Trades within the trading limits: " + note);
                    }
                }
                if (!rb.proposal().certificate().passes()) {
                    runNotes.add("Trades within the trading limits: the KKT certificate is above its tolerance ("
                            + certificateLine(rb.proposal().certificate()) + "); treat the trade list with caution.");
                }
            } else if (res.outOfReach().isEmpty()) {
                trades = Optional.of(trades(assets, h, w, spec));
            }
            trading = Optional.of(trading(res));
        }

        List<PackContent.Parameter> parameters = new ArrayList<>(r.parameters());
        parameters.add(new PackContent.Parameter("Targets", String.join(", ",
                spec.targets().stream().map(Explain::percent).toList())));
        parameters.add(new PackContent.Parameter("Proposed target", Explain.percent(spec.proposed())));
        spec.riskFree().ifPresent(rf -> parameters.add(new PackContent.Parameter("Risk-free rate", Explain.percent(rf))));
        parameters.add(new PackContent.Parameter("Frontier points", Integer.toString(spec.frontierPoints())));

        PackContent.RunRecord run = new PackContent.RunRecord(r.toolVersion(), r.created(), parameters, r.inputs(),
                new ArrayList<>(runNotes));
        return new PackContent(heading, assumptions, MandateWords.describe(res.mandate(), assets), portfolios, frontier,
                wt.build(), rt.build(), binding, cons.build(), charts, trades, stress, run, trading);
    }

    /** The full move from the holdings to the proposal. */
    private static Table trades(List<String> assets, double[] current, double[] proposed, PackSpec spec) {
        Table.Builder b = Table.builder("trades", FULL_MOVE_TITLE)
                .column(Table.Column.text("asset", "Asset"))
                .column(Table.Column.percent("current", "Current"))
                .column(Table.Column.percent("proposed", "Proposed"))
                .column(Table.Column.percent("change", "Change"));
        spec.fundSize().ifPresent(f -> b.column(Table.Column.amount("amount", "Amount (" + spec.currency() + ")")));
        for (int i = 0; i < assets.size(); i++) {
            double change = proposed[i] - current[i];
            if (spec.fundSize().isPresent()) {
                b.row(assets.get(i), current[i], proposed[i], change, change * spec.fundSize().get());
            } else {
                b.row(assets.get(i), current[i], proposed[i], change);
            }
        }
        return b.build();
    }

    /** The rebalancer's move within the trading limits, one row per asset in the universe's order. */
    private static Table trades(RebalanceResult rb, PackSpec spec) {
        boolean money = spec.fundSize().isPresent();
        Table.Builder b = Table.builder("trades", WITHIN_LIMITS_TITLE)
                .column(Table.Column.text("asset", "Asset"))
                .column(Table.Column.percent("current", "Current"))
                .column(Table.Column.percent("proposed", "Within the limits"))
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
     * How the trade list was made: which of the two it is, the limits in words, the full move beside the move
     * within the limits, today's breaches, the engine's shadow-price sentences, the conventions.
     */
    private static PackContent.Trading trading(PackResults res) {
        AssetUniverse u = res.universe();
        TradingLimits lim = res.trading();
        Solution p = res.proposal();
        RiskDecomposition now = res.currentRisk().orElseThrow();
        PackResults.FullMove full = res.fullMove().orElseThrow();
        double fullTurnover = full.turnover();
        double fullCost = full.cost();
        String target = Explain.percent(res.spec().proposed());
        Optional<RebalanceResult> rb = res.rebalance();

        PackContent.Trading.Mode mode;
        String headline;
        if (!lim.restrictsTrading()) {
            mode = PackContent.Trading.Mode.FULL_MOVE;
            headline = "No trading limit applies (the policy sets none), so the trade list is the full move from the "
                    + "current holdings to the proposal: turnover " + Explain.percent(fullTurnover) + ".";
        } else if (rb.isPresent()) {
            mode = PackContent.Trading.Mode.WITHIN_LIMITS;
            RebalanceResult x = rb.get();
            headline = "The trade list keeps to the policy's trading limits: the least-risk move from the current "
                    + "holdings that reaches the proposal's target " + target + " after costs, with turnover "
                    + Explain.percent(x.turnover())
                    + (Double.isFinite(lim.maxTurnover()) ? " (limit " + Explain.percent(lim.maxTurnover()) + ")" : "")
                    + "; the full move to the proposal would need turnover " + Explain.percent(fullTurnover) + ".";
        } else {
            mode = PackContent.Trading.Mode.OUT_OF_REACH;
            NoSolutionException e = res.outOfReach().orElseThrow();
            headline = (e.reason() == NoSolutionException.Reason.INFEASIBLE
                    ? "The proposal's target " + target + " cannot be reached within the policy's trading limits, "
                    + "so the pack proposes no trade list: "
                    : "No trade list within the policy's trading limits was found, so the pack proposes none: ")
                    + e.getMessage() + " (here the target is the pack file's proposed target). The full move to the "
                    + "proposal would need turnover " + Explain.percent(fullTurnover) + ".";
        }

        Table.Builder cmp = Table.builder("trade_summary", mode == PackContent.Trading.Mode.WITHIN_LIMITS
                        ? "The full move beside the move within the trading limits" : "The full move to the proposal")
                .column(Table.Column.text("portfolio", "Portfolio"))
                .column(Table.Column.percent("expected_return", "Expected return"))
                .column(Table.Column.percent("return_after_costs", "Return after costs"))
                .column(Table.Column.percent("volatility", "Volatility"))
                .column(Table.Column.percent("turnover", "Turnover (two-way)"))
                .column(Table.Column.percent("cost", "Cost"))
                .column(Table.Column.percent("tracking_error", "Tracking error against today"));
        cmp.row(CURRENT, now.expectedReturn(), now.expectedReturn(), now.volatility(), 0.0, 0.0, 0.0);
        cmp.row("Full move to the proposal", p.expectedReturn(), p.expectedReturn() - fullCost, p.volatility(),
                fullTurnover, fullCost, full.trackingError());
        rb.ifPresent(x -> cmp.row("Within the trading limits", x.proposedReturn(), x.proposedNetReturn(),
                x.proposedVolatility(), x.turnover(), x.cost(), x.trackingError()));

        String reading = "";
        if (rb.isPresent()) {
            RebalanceResult x = rb.get();
            boolean binds = x.binding().stream().map(Multiplier::constraint).anyMatch(c -> c.equals("turnover")
                    || c.startsWith("trade_limit:") || c.startsWith("no_trade:") || c.startsWith("min_trade:"));
            double fullNet = p.expectedReturn() - fullCost;
            if (binds) {
                reading = "The trading limits bind: keeping to them" + (lim.hasCosts() ? " and paying the costs" : "")
                        + " moves the volatility from " + Explain.percent(p.volatility()) + " (the full move) to "
                        + Explain.percent(x.proposedVolatility()) + "; what each binding limit costs at the margin "
                        + "is below.";
            } else if (lim.hasCosts() && fullNet < res.spec().proposed()) {
                reading = "No trading limit binds here: the move differs from the full move because trading costs "
                        + "are deducted from the return the target must reach; the full move would return "
                        + Explain.percent(fullNet) + " after costs, short of the " + target + " target.";
            } else if (lim.hasCosts()) {
                reading = "No trading limit binds here: the move differs from the full move only through the trading "
                        + "costs.";
            } else {
                reading = "No trading limit binds here, so the move within the limits is the full move (to the "
                        + "solver's tolerance).";
            }
        }
        List<String> tradingNotes = new ArrayList<>();
        tradingNotes.add(RebalanceResult.TURNOVER_CONVENTION);
        if (lim.hasCosts()) {
            tradingNotes.add(mode == PackContent.Trading.Mode.FULL_MOVE
                    ? "The costs shown are the policy's trading costs (basis points of the amount traded) of the full "
                    + "move; the proposal was not chosen with them."
                    : RebalanceResult.COST_CONVENTION);
        }
        rb.ifPresent(x -> tradingNotes.add("The move within the limits: " + certificateLine(x.proposal().certificate())
                + " (the KKT certificate of the rebalance problem)."));
        return new PackContent.Trading(mode, headline, limitWords(lim, u.assets()), cmp.build(), reading,
                rb.map(x -> x.breaches().stream().map(Breach::description).toList()).orElse(List.of()),
                rb.map(RebalanceResult::sentences).orElse(List.of()), tradingNotes);
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

package org.isorisk.notebooks;

import java.time.LocalDate;
import java.time.OffsetDateTime;
import java.util.List;
import java.util.Objects;
import java.util.Optional;
import org.isorisk.notebooks.report.Table;

/**
 * Everything the committee notebook says, as plain values: text as given (the exporter escapes it), numbers
 * as decimals, tables as {@link Table}s, charts as image bytes. Built by {@code notebooks.pack.PackComposer} from
 * engine results; the notebook writer only lays it out.
 *
 * @param heading     fund, currency, as-of date, caution
 * @param assumptions the capital-market assumptions and how they were made
 * @param mandate     the mandate in plain sentences, one per rule
 * @param portfolios  the minimum-variance portfolio first, then the target portfolios, the tangency portfolio, the
 *                    proposal when it is not one of the target portfolios (the portfolio the trades reach, when the
 *                    trading limits or costs keep them from the target portfolio: both are then shown side by side),
 *                    and the current holdings; exactly one is the proposal
 * @param frontier    sampled frontier points (target, return, volatility), when the pack draws a frontier
 * @param weights     weights table: one row per asset, one column per portfolio
 * @param risk        risk table of the proposed portfolio (the one the trades reach): weight, marginal risk,
 *                    contribution, share
 * @param binding     every binding constraint of every portfolio, with its shadow price in a sentence
 * @param constraints the shadow-price table behind {@code binding} (CSV for the analyst)
 * @param charts      chart images, placed by kind
 * @param trades      the trade list when the pack has current holdings (absent when the proposal's target is out of
 *                    reach within the trading limits: see {@code trading})
 * @param stress      stress tables, when scenarios ran: the targets under each scenario (with each point's status),
 *                    and the proposal (and today's holdings) under each scenario
 * @param run         the run record: tool version, inputs and their hashes, parameters, certificates
 * @param trading     how the trade list was made (the full move, or within the policy's trading limits) and what
 *                    the limits cost, when the pack has current holdings
 * @param keyPoints   what the summary says, in order: the proposal (and the target portfolio beside it when they
 *                    differ), the minimum-variance portfolio, today's holdings, today's breaches of the policy, the
 *                    trades, targets on the inefficient branch, stress points not solved, the certificates. Every
 *                    reader of the pack (notebook, terminal, HTML/PDF) shows these lines first
 * @param breaches    the limits of the policy today's holdings break, in sentences (empty without holdings)
 * @param notSolved   stress points reported instead of solved (with their status and the solver's message); the
 *                    rest of the pack is complete
 * @param appendix    further tables for the analyst, shown in the appendix after the correlations, the frontier
 *                    and the shadow prices (e.g. the data behind the stress chart, one row per scenario and target
 *                    with its status)
 */
public record PackContent(Heading heading, Assumptions assumptions, List<String> mandate, List<Portfolio> portfolios,
                          Optional<Table> frontier, Table weights, Table risk, List<Binding> binding, Table constraints,
                          List<Chart> charts, Optional<Table> trades, List<Table> stress, RunRecord run,
                          Optional<Trading> trading, List<KeyPoint> keyPoints, List<String> breaches,
                          List<NotSolved> notSolved, List<Table> appendix) {

    /** A pack without key points, breaches, unsolved points or appendix tables of its own. */
    public PackContent(Heading heading, Assumptions assumptions, List<String> mandate, List<Portfolio> portfolios,
                       Optional<Table> frontier, Table weights, Table risk, List<Binding> binding, Table constraints,
                       List<Chart> charts, Optional<Table> trades, List<Table> stress, RunRecord run,
                       Optional<Trading> trading) {
        this(heading, assumptions, mandate, portfolios, frontier, weights, risk, binding, constraints, charts, trades,
                stress, run, trading, List.of(), List.of(), List.of(), List.of());
    }

    /** A pack without the account of how its trade list was made. */
    public PackContent(Heading heading, Assumptions assumptions, List<String> mandate, List<Portfolio> portfolios,
                       Optional<Table> frontier, Table weights, Table risk, List<Binding> binding, Table constraints,
                       List<Chart> charts, Optional<Table> trades, List<Table> stress, RunRecord run) {
        this(heading, assumptions, mandate, portfolios, frontier, weights, risk, binding, constraints, charts, trades,
                stress, run, Optional.empty(), List.of(), List.of(), List.of(), List.of());
    }

    public PackContent {
        Objects.requireNonNull(heading, "heading");
        Objects.requireNonNull(assumptions, "assumptions");
        Objects.requireNonNull(weights, "weights");
        Objects.requireNonNull(risk, "risk");
        Objects.requireNonNull(constraints, "constraints");
        Objects.requireNonNull(run, "run");
        mandate = List.copyOf(mandate);
        portfolios = List.copyOf(portfolios);
        if (portfolios.isEmpty()) {
            throw new IllegalArgumentException("a pack shows at least one portfolio");
        }
        if (portfolios.stream().filter(Portfolio::proposed).count() != 1) {
            throw new IllegalArgumentException("exactly one portfolio is the proposal");
        }
        frontier = frontier == null ? Optional.empty() : frontier;
        binding = List.copyOf(binding);
        charts = List.copyOf(charts);
        trades = trades == null ? Optional.empty() : trades;
        stress = List.copyOf(stress);
        trading = trading == null ? Optional.empty() : trading;
        keyPoints = keyPoints == null ? List.of() : List.copyOf(keyPoints);
        breaches = breaches == null ? List.of() : List.copyOf(breaches);
        notSolved = notSolved == null ? List.of() : List.copyOf(notSolved);
        appendix = appendix == null ? List.of() : List.copyOf(appendix);
        if (trading.isPresent() && (trading.get().mode() == Trading.Mode.OUT_OF_REACH) == trades.isPresent()) {
            throw new IllegalArgumentException("a trade list goes with every trading account but one whose target is "
                    + "out of reach");
        }
        java.util.Set<String> names = new java.util.HashSet<>();
        for (Table t : tablesOf(assumptions, portfolios, weights, frontier, risk, constraints, stress, trades, trading,
                appendix)) {
            if (!names.add(t.name())) {
                throw new IllegalArgumentException("two tables are named " + t.name());
            }
        }
        java.util.Set<String> chartNames = new java.util.HashSet<>();
        for (Chart c : charts) {
            if (!chartNames.add(c.name())) {
                throw new IllegalArgumentException("two charts are named " + c.name());
            }
        }
    }

    /** Every table of the pack, in notebook order; each is also written as CSV next to the notebook. */
    public List<Table> tables() {
        return tablesOf(assumptions, portfolios, weights, frontier, risk, constraints, stress, trades, trading,
                appendix);
    }

    private static List<Table> tablesOf(Assumptions assumptions, List<Portfolio> portfolios, Table weights,
                                        Optional<Table> frontier, Table risk, Table constraints, List<Table> stress,
                                        Optional<Table> trades, Optional<Trading> trading, List<Table> appendix) {
        List<Table> all = new java.util.ArrayList<>();
        all.add(assumptions.table());
        all.add(assumptions.correlation());
        all.add(summary(portfolios));
        all.add(weights);
        frontier.ifPresent(all::add);
        all.add(risk);
        all.add(constraints);
        stress.forEach(all::add);
        trading.ifPresent(t -> all.add(t.comparison()));
        trades.ifPresent(all::add);
        appendix.forEach(all::add);
        return all;
    }

    /** The portfolios as a table: label, role, expected return, volatility, method, certificate, note. */
    public Table summary() {
        return summary(portfolios);
    }

    private static Table summary(List<Portfolio> portfolios) {
        Table.Builder b = Table.builder("portfolios", "Portfolios")
                .column(Table.Column.text("portfolio", "Portfolio"))
                .column(Table.Column.text("role", "Role"))
                .column(Table.Column.percent("expected_return", "Expected return"))
                .column(Table.Column.percent("volatility", "Volatility"))
                .column(Table.Column.text("method", "Method"))
                .column(Table.Column.text("certificate", "KKT certificate"))
                .column(Table.Column.text("note", "Note"));
        for (Portfolio p : portfolios) {
            b.row(p.label(), p.proposed() ? "proposed" : "", p.expectedReturn(), p.volatility(), p.method(),
                    p.certificate(), p.remark());
        }
        return b.build();
    }

    /** Method label of a portfolio that was given (the current holdings), not solved. */
    public static final String GIVEN = "given";

    /** The current holdings, when the pack has them. */
    public Optional<Portfolio> current() {
        return portfolios.stream().filter(p -> p.method().equals(GIVEN)).findFirst();
    }

    /** The target portfolio shown beside the proposal, when the trading limits or costs keep the trades from it. */
    public Optional<Portfolio> besideProposal() {
        return portfolios.stream().filter(Portfolio::besideProposal).findFirst();
    }

    /** The proposed portfolio. */
    public Portfolio proposal() {
        return portfolios.stream().filter(Portfolio::proposed).findFirst().orElseThrow();
    }

    /** Charts of one kind, in the order given. */
    public List<Chart> charts(ChartKind kind) {
        return charts.stream().filter(c -> c.kind() == kind).toList();
    }

    /**
     * The title block.
     *
     * @param fund     fund name as given in the pack file
     * @param currency currency code or name, e.g. GBP
     * @param asOf     the date the assumptions and holdings refer to
     * @param note     a line under the title, e.g. "Invented fund; all figures illustrative" (may be empty)
     * @param caution  the caution text ({@code explain.Caution.TEXT})
     */
    public record Heading(String fund, String currency, LocalDate asOf, String note, String caution) {
        public Heading {
            Objects.requireNonNull(fund, "fund");
            Objects.requireNonNull(currency, "currency");
            Objects.requireNonNull(asOf, "asOf");
            note = note == null ? "" : note;
            if (caution == null || caution.isBlank()) {
                throw new IllegalArgumentException("every pack carries the caution");
            }
        }
    }

    /**
     * The capital-market assumptions.
     *
     * @param table           asset, expected return, volatility
     * @param correlation     the correlation matrix as a table
     * @param lowest          the least correlated pair
     * @param highest         the most correlated pair
     * @param average         mean of the off-diagonal correlations
     * @param conditionNumber condition number of the covariance matrix (2-norm)
     * @param estimator       how the assumptions were made, in words (e.g. "given as tables by the analyst")
     */
    public record Assumptions(Table table, Table correlation, Pair lowest, Pair highest, double average,
                              double conditionNumber, String estimator) {
        public Assumptions {
            Objects.requireNonNull(table, "table");
            Objects.requireNonNull(correlation, "correlation");
            Objects.requireNonNull(estimator, "estimator");
        }
    }

    /** A correlation between two assets. */
    public record Pair(String first, String second, double correlation) {
    }

    /**
     * One portfolio of the pack.
     *
     * @param label          e.g. "Minimum variance", "Target 5.50 %"
     * @param proposed       true for the portfolio the pack proposes
     * @param expectedReturn decimal, annualised
     * @param volatility     decimal, annualised
     * @param method         how it was solved ({@code closed-form}, {@code numerical}, ...)
     * @param certificate    one line on the KKT certificate (residuals, pass or warn)
     * @param passes         true when the certificate passes
     * @param remark         what a reader must know besides the numbers, in a few words (e.g. "the target before
     *                       trading limits and costs: the trades do not reach it", "on the inefficient branch: ..."),
     *                       empty when nothing
     */
    public record Portfolio(String label, boolean proposed, double expectedReturn, double volatility, String method,
                            String certificate, boolean passes, String remark) {
        public Portfolio {
            Objects.requireNonNull(label, "label");
            Objects.requireNonNull(method, "method");
            Objects.requireNonNull(certificate, "certificate");
            remark = remark == null ? "" : remark;
        }

        /**
         * How the remark of the target portfolio begins when it is shown beside the proposal (the trading limits or
         * costs keep the trades from it).
         */
        public static final String BEFORE_TRADING = "the proposed target before ";

        /** True for the target portfolio shown beside a proposal that differs from it. */
        public boolean besideProposal() {
            return !proposed && remark.startsWith(BEFORE_TRADING);
        }

        /** A portfolio without a remark. */
        public Portfolio(String label, boolean proposed, double expectedReturn, double volatility, String method,
                         String certificate, boolean passes) {
            this(label, proposed, expectedReturn, volatility, method, certificate, passes, "");
        }
    }

    /**
     * One line of the summary.
     *
     * @param label     a few words in front, e.g. "Proposed portfolio"
     * @param text      the plain sentence(s) after it
     * @param attention true when a reader must not miss it (a breach, a certificate above tolerance, a stress point
     *                  not solved); shown emphasised
     */
    public record KeyPoint(String label, String text, boolean attention) {
        public KeyPoint {
            Objects.requireNonNull(label, "label");
            Objects.requireNonNull(text, "text");
        }
    }

    /**
     * A stress point the pack reports instead of a solution.
     *
     * @param where    which run: {@code "stress table"} (the pack file's targets) or {@code "stress chart"} (the
     *                 frontier's targets)
     * @param scenario the scenario's name, or {@code "today's assumptions"}
     * @param target   the return target, decimal
     * @param status   {@code not-solved} or {@code infeasible}, as the JSON contract names them
     * @param reason   the solver's message
     */
    public record NotSolved(String where, String scenario, double target, String status, String reason) {
        public NotSolved {
            Objects.requireNonNull(where, "where");
            Objects.requireNonNull(scenario, "scenario");
            Objects.requireNonNull(status, "status");
            reason = reason == null ? "" : reason;
        }
    }

    /**
     * A binding constraint of one portfolio with its shadow price.
     *
     * @param portfolio         label of the portfolio it belongs to
     * @param constraint        name as in the JSON contract ({@code upper:Cash}, {@code group:Equity:max})
     * @param variancePerUnit   ∂V*∂limit
     * @param volatilityPerUnit ∂σ*∂limit
     * @param sentence          {@code explain.Explain.sentence} of the multiplier
     */
    public record Binding(String portfolio, String constraint, double variancePerUnit, double volatilityPerUnit,
                          String sentence) {
    }

    /**
     * Where a chart goes in the notebook: the frontier and the marginal risk of the return target (∂σ*∂m along
     * the frontier) in the frontier section, weights with the portfolios, risk contributions with the risk of
     * the proposal, stress with the stress tables.
     */
    public enum ChartKind {
        FRONTIER, WEIGHTS, MARGINAL_RISK, RISK_CONTRIBUTION, STRESS
    }

    /**
     * A chart image.
     *
     * @param name    file stem ({@code frontier} → {@code charts/frontier.png})
     * @param kind    which section shows it
     * @param title   heading above the chart
     * @param caption a sentence under it (what to read from it)
     * @param png     the PNG bytes (copied)
     * @param svg     the same chart as SVG text
     * @param pdf     the same chart as PDF bytes, for the folder (empty when not made; copied)
     */
    public record Chart(String name, ChartKind kind, String title, String caption, byte[] png, String svg,
                        byte[] pdf) {
        public Chart {
            if (name == null || !name.matches("[a-z0-9][a-z0-9_-]{0,40}")) {
                throw new IllegalArgumentException("chart name must be a short lower-case file stem: " + name);
            }
            Objects.requireNonNull(kind, "kind");
            Objects.requireNonNull(title, "title");
            caption = caption == null ? "" : caption;
            png = png.clone();
            Objects.requireNonNull(svg, "svg");
            pdf = pdf == null ? new byte[0] : pdf.clone();
        }

        @Override
        public byte[] pdf() {
            return pdf.clone();
        }

        @Override
        public byte[] png() {
            return png.clone();
        }

        @Override
        public boolean equals(Object o) {
            return o instanceof Chart c && c.name.equals(name) && java.util.Arrays.equals(c.png, png) && c.svg.equals(svg);
        }

        @Override
        public int hashCode() {
            return name.hashCode();
        }

        @Override
        public String toString() {
            return "Chart[" + name + ", " + png.length + " PNG bytes]";
        }
    }

    /**
     * The run record.
     *
     * @param toolVersion isorisk version
     * @param created     when the pack was made
     * @param parameters  the parameters of the run in order (name → value as text)
     * @param inputs      the input files with their SHA-256
     * @param notes       remarks on the run (solver notes, warnings)
     */
    public record RunRecord(String toolVersion, OffsetDateTime created, List<Parameter> parameters,
                            List<InputFile> inputs, List<String> notes) {
        public RunRecord {
            Objects.requireNonNull(toolVersion, "toolVersion");
            Objects.requireNonNull(created, "created");
            parameters = List.copyOf(parameters);
            inputs = List.copyOf(inputs);
            notes = List.copyOf(notes);
        }
    }

    /**
     * How the pack's trade list was made from the current holdings, and what the policy's trading limits cost.
     *
     * @param mode       the full move to the proposal, the limit-respecting move, or a target out of reach within
     *                   the limits
     * @param headline   one plain sentence saying which of these the trade list is (summary, terminal)
     * @param limits     the trading limits in words, one per rule (empty when the policy sets none)
     * @param comparison today's holdings, the full move and (when it exists) the move within the limits side by
     *                   side: expected return before and after costs, volatility, turnover, cost, tracking error
     *                   against today
     * @param reading    what the comparison says in one plain sentence: whether a trading limit binds or the costs
     *                   alone make the difference (empty when there is no move within the limits)
     * @param breaches   limits of the policy today's holdings break, with the trades that cure them, in sentences
     * @param sentences  the engine's readings of the turnover limit's shadow price and of every other binding limit
     *                   of the move within the limits
     * @param notes      how turnover and costs are counted, the move's KKT certificate, the rebalancer's message
     */
    public record Trading(Mode mode, String headline, List<String> limits, Table comparison, String reading,
                          List<String> breaches, List<String> sentences, List<String> notes) {
        public Trading {
            reading = reading == null ? "" : reading;
            Objects.requireNonNull(mode, "mode");
            Objects.requireNonNull(headline, "headline");
            Objects.requireNonNull(comparison, "comparison");
            limits = List.copyOf(limits);
            breaches = List.copyOf(breaches);
            sentences = List.copyOf(sentences);
            notes = List.copyOf(notes);
        }

        /** Which trade list the pack shows. */
        public enum Mode {
            /** No trading limit in the policy: the trades move the holdings fully to the proposal. */
            FULL_MOVE,
            /** The trades are the rebalancer's move toward the proposal's target within the trading limits. */
            WITHIN_LIMITS,
            /** The proposal's target cannot be reached within the trading limits: no trade list is proposed. */
            OUT_OF_REACH
        }
    }

    /** A named parameter of the run. */
    public record Parameter(String name, String value) {
    }

    /** An input file by the name the user gave and its SHA-256 (hex). */
    public record InputFile(String role, String name, String sha256) {
    }
}

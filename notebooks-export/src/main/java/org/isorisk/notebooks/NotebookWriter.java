package org.isorisk.notebooks;

import com.fasterxml.jackson.core.JsonGenerator;
import com.fasterxml.jackson.core.util.DefaultIndenter;
import com.fasterxml.jackson.core.util.DefaultPrettyPrinter;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.JsonNodeFactory;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.io.IOException;
import java.io.OutputStream;
import java.io.UncheckedIOException;
import java.util.ArrayList;
import java.util.Base64;
import java.util.HashSet;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.Set;
import org.isorisk.engine.explain.Caution;
import org.isorisk.engine.explain.Explain;
import org.isorisk.notebooks.report.Table;

/**
 * Writes a {@link PackContent} as a Jupyter notebook in the open nbformat 4.5 format (JSON built as a Jackson
 * tree). Markdown cells carry the words; code cells reload the CSV tables and chart files that sit next to the
 * notebook ({@link PackLayout}) with pandas and IPython, and carry the outputs that running them produces
 * (tables as {@code text/html} and {@code text/plain}, charts as {@code image/png} with {@code image/svg+xml}
 * alongside, plus an HTML {@code <img>} of the PNG that every renderer shows first), so the notebook reads correctly without being run and an analyst can continue in it.
 *
 * <p>All text in the content is plain text from inputs and is escaped here: {@link Text#markdown} in Markdown
 * cells, {@link Text#html} in HTML outputs, {@link Text#python} in code.
 */
public final class NotebookWriter {

    /** The kernel the notebook names. */
    public static final String KERNEL = "python3";

    private static final JsonNodeFactory JSON = JsonNodeFactory.instance;

    private final PackContent content;
    private final ArrayNode cells = JSON.arrayNode();
    private final Set<String> ids = new HashSet<>();
    private int executionCount;

    private NotebookWriter(PackContent content) {
        this.content = content;
    }

    /** Writes the notebook of {@code content} to {@code out} as UTF-8 JSON; does not close the stream. */
    public static void write(PackContent content, OutputStream out) {
        ObjectNode nb = build(content);
        try {
            DefaultPrettyPrinter pp = new DefaultPrettyPrinter()
                    .withObjectIndenter(new DefaultIndenter(" ", "\n"))
                    .withArrayIndenter(new DefaultIndenter(" ", "\n"));
            new ObjectMapper().disable(JsonGenerator.Feature.AUTO_CLOSE_TARGET).writer(pp).writeValue(out, nb);
            out.write('\n');
            out.flush();
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    /** The notebook of {@code content} as a JSON tree. */
    public static ObjectNode build(PackContent content) {
        return new NotebookWriter(content).notebook();
    }

    private ObjectNode notebook() {
        PackContent.Heading h = content.heading();
        title();
        summary();
        setup();
        assumptions();
        mandate();
        portfolios();
        frontier();
        risk();
        binding();
        if (!content.stress().isEmpty() || !content.charts(PackContent.ChartKind.STRESS).isEmpty()) {
            stress();
        }
        if (content.trades().isPresent() || content.trading().isPresent()) {
            trades();
        }
        appendix();
        runRecord();
        workingNote();
        markdown("closing-caution", "---", "", "**Caution.** " + Text.markdown(h.caution()));

        ObjectNode nb = JSON.objectNode();
        ObjectNode meta = nb.putObject("metadata");
        ObjectNode kernel = meta.putObject("kernelspec");
        kernel.put("name", KERNEL);
        kernel.put("display_name", "Python 3 (ipykernel)");
        kernel.put("language", "python");
        ObjectNode lang = meta.putObject("language_info");
        lang.put("name", "python");
        lang.put("file_extension", ".py");
        lang.put("mimetype", "text/x-python");
        lang.put("nbconvert_exporter", "python");
        lang.put("pygments_lexer", "ipython3");
        lang.putObject("codemirror_mode").put("name", "ipython").put("version", 3);
        meta.put("title", h.fund() + " — committee pack, " + h.asOf());
        ObjectNode own = meta.putObject("isorisk");
        own.put("fund", h.fund());
        own.put("currency", h.currency());
        own.put("as_of", h.asOf().toString());
        own.put("tool_version", content.run().toolVersion());
        own.put("caution", h.caution());
        nb.put("nbformat", 4);
        nb.put("nbformat_minor", 5);
        nb.set("cells", cells);
        return nb;
    }

    // ---------------------------------------------------------------- sections

    private void title() {
        PackContent.Heading h = content.heading();
        List<String> lines = new ArrayList<>();
        lines.add("# " + Text.markdown(h.fund()));
        lines.add("");
        lines.add("**Investment committee pack** · as of **" + h.asOf() + "** · currency " + Text.markdown(h.currency()));
        if (!h.note().isBlank()) {
            lines.add("");
            lines.add("*" + Text.markdown(h.note()) + "*");
        }
        lines.add("");
        lines.add("> **Caution.** " + Text.markdown(h.caution()));
        markdown("title", lines);
    }

    private void summary() {
        if (content.keyPoints().isEmpty()) {
            derivedSummary();
            return;
        }
        List<String> lines = new ArrayList<>();
        lines.add("## Summary");
        lines.add("");
        for (PackContent.KeyPoint k : content.keyPoints()) {
            String text = Text.markdown(k.text());
            lines.add("- **" + Text.markdown(k.label()) + ":** " + (k.attention() ? "**" + text + "**" : text));
        }
        markdown("summary", lines);
    }

    /** The summary of a content without key points of its own: the proposal, the portfolios, the trades. */
    private void derivedSummary() {
        PackContent.Portfolio p = content.proposal();
        List<String> lines = new ArrayList<>();
        lines.add("## Summary");
        lines.add("");
        lines.add("- **Proposed portfolio:** " + Text.markdown(p.label()) + ": expected return "
                + Text.markdown(Explain.percent(p.expectedReturn())) + " a year with volatility "
                + Text.markdown(Explain.percent(p.volatility())) + ".");
        PackContent.Portfolio first = content.portfolios().get(0);
        if (first != p) {
            lines.add("- **" + Text.markdown(first.label()) + ":** expected return "
                    + Text.markdown(Explain.percent(first.expectedReturn())) + ", volatility "
                    + Text.markdown(Explain.percent(first.volatility())) + ": the least risk the mandate allows.");
        }
        content.current().ifPresent(c -> lines.add("- **" + Text.markdown(c.label()) + ":** expected return "
                + Text.markdown(Explain.percent(c.expectedReturn())) + ", volatility "
                + Text.markdown(Explain.percent(c.volatility())) + "."));
        long bindingHere = content.binding().stream().filter(b -> b.portfolio().equals(p.label())).count();
        lines.add("- **Binding constraints of the proposal:** " + bindingHere + " (each with its shadow price below).");
        boolean allPass = content.portfolios().stream().allMatch(PackContent.Portfolio::passes);
        // (the current holdings were given, not solved: they carry no certificate and count as passing)
        lines.add("- **Certificates:** " + (allPass
                ? "every portfolio satisfies its optimality (KKT) conditions within tolerance."
                : "**at least one portfolio's KKT certificate is above its tolerance: read the run record.**"));
        if (content.trading().isPresent()) {
            lines.add("- **Trades:** " + Text.markdown(content.trading().get().headline()) + " See the Trades section.");
        } else if (content.trades().isPresent()) {
            lines.add("- **Trades:** a trade list from the current holdings is in the Trades section.");
        }
        markdown("summary", lines);
    }

    private void setup() {
        code("setup", List.of(
                "# Reloads the pack's tables (tables/*.csv) and charts with pandas; see " + PackLayout.HELPER + ".",
                "from pack_tables import chart, load, show"), List.of());
    }

    private void workingNote() {
        markdown("working-note", "## Working with this notebook", "",
                "The tables and charts are stored in the notebook, so it reads as it is. Its short code cells reload "
                        + "them from the CSV files in `" + PackLayout.TABLES + "/` and the images in `"
                        + PackLayout.CHARTS + "/` with `" + PackLayout.HELPER + "` (next to the notebook), so an "
                        + "analyst can run it with Python 3 and pandas and continue from there: `load(\"weights\")` "
                        + "returns a table as a pandas DataFrame, `show(frame)` formats it as shown here. The CSV "
                        + "files hold decimals at full precision (0.065 is 6.50 %) and open in any spreadsheet.");
    }

    private void assumptions() {
        PackContent.Assumptions a = content.assumptions();
        List<String> lines = new ArrayList<>();
        lines.add("## Assumptions");
        lines.add("");
        lines.add("Expected returns and volatilities are annual. " + Text.markdown(a.estimator()));
        lines.add("");
        lines.add("- **Correlations:** average " + fixed2(a.average()) + "; lowest " + pair(a.lowest())
                + "; highest " + pair(a.highest()) + ".");
        lines.add("- **Condition number of the covariance matrix:** " + Text.markdown(Text.general(a.conditionNumber(), 4))
                + " (the ratio of its largest to smallest eigenvalue; the larger it is, the more the portfolios react "
                + "to small changes in the assumptions).");
        lines.add("");
        lines.add("The full correlation matrix is in the appendix.");
        markdown("assumptions", lines);
        table(a.table());
    }

    private static String pair(PackContent.Pair p) {
        if (p == null) {
            return "n/a";
        }
        return fixed2(p.correlation()) + " (" + Text.markdown(p.first()) + " with " + Text.markdown(p.second()) + ")";
    }

    private static String fixed2(double v) {
        return Text.display(new Table.Cell.Number(v), Table.Format.DECIMAL);
    }

    private void mandate() {
        List<String> lines = new ArrayList<>();
        lines.add("## Mandate");
        lines.add("");
        lines.add("Every portfolio in this pack obeys these rules:");
        lines.add("");
        for (String s : content.mandate()) {
            lines.add("- " + Text.markdown(s));
        }
        markdown("mandate", lines);
    }

    private void portfolios() {
        PackContent.Portfolio p = content.proposal();
        boolean sideBySide = content.besideProposal().isPresent();
        markdown("portfolios", "## Portfolios", "",
                "The minimum-variance portfolio carries the least risk the mandate allows; each target portfolio has "
                        + "the least risk for its expected return. The proposal is **" + Text.markdown(p.label())
                        + "**" + (sideBySide ? ": the portfolio the trade list reaches. The trading limits or costs keep "
                        + "it from the target portfolio, which is shown beside it for comparison." : "."));
        table(content.summary());
        table(content.weights());
        charts(PackContent.ChartKind.WEIGHTS);
    }

    private void frontier() {
        List<PackContent.Chart> charts = new ArrayList<>(content.charts(PackContent.ChartKind.FRONTIER));
        charts.addAll(content.charts(PackContent.ChartKind.MARGINAL_RISK));
        if (charts.isEmpty() && content.frontier().isEmpty()) {
            return;
        }
        markdown("frontier", "## Efficient frontier", "",
                "The least volatility the mandate allows for each expected return. Points on the curve are "
                        + "efficient: no portfolio under the same mandate has more expected return for the same risk.");
        charts(PackContent.ChartKind.FRONTIER);
        charts(PackContent.ChartKind.MARGINAL_RISK);
        if (content.frontier().isPresent()) {
            markdown("frontier-note", "The sampled frontier points are tabled in the appendix.");
        }
    }

    private void risk() {
        markdown("risk", "## Where the risk of the proposal comes from", "",
                "The proposal here is **" + Text.markdown(content.proposal().label()) + "**. Marginal risk is how much the portfolio's volatility moves per unit of extra weight in an asset "
                        + "(∂σ/∂wᵢ = (Σw)ᵢ/σ); an asset's contribution is its weight times its marginal risk. The "
                        + "contributions add up to the portfolio's volatility (Euler's theorem for functions "
                        + "homogeneous of degree one).");
        table(content.risk());
        charts(PackContent.ChartKind.RISK_CONTRIBUTION);
    }

    private void binding() {
        List<String> lines = new ArrayList<>();
        lines.add("## Binding constraints and their shadow prices");
        lines.add("");
        lines.add("A constraint binds when the portfolio sits on its limit. Its shadow price is how much the "
                + "portfolio's minimum variance changes per unit change of that limit (∂V\\*/∂limit); below it is "
                + "read in volatility for a small step.");
        Map<String, List<PackContent.Binding>> byPortfolio = new LinkedHashMap<>();
        for (PackContent.Portfolio p : content.portfolios()) {
            if (!p.method().equals(PackContent.GIVEN)) {
                byPortfolio.put(p.label(), new ArrayList<>());
            }
        }
        for (PackContent.Binding b : content.binding()) {
            byPortfolio.computeIfAbsent(b.portfolio(), k -> new ArrayList<>()).add(b);
        }
        for (Map.Entry<String, List<PackContent.Binding>> e : byPortfolio.entrySet()) {
            lines.add("");
            lines.add("**" + Text.markdown(e.getKey()) + "**");
            lines.add("");
            if (e.getValue().isEmpty()) {
                lines.add("- No constraint binds.");
            }
            for (PackContent.Binding b : e.getValue()) {
                lines.add("- " + Text.markdown(b.sentence()));
            }
        }
        lines.add("");
        lines.add("The shadow prices themselves are tabled in the appendix.");
        markdown("binding", lines);
    }

    private void appendix() {
        markdown("appendix", "## Appendix: detailed tables", "",
                "For the analyst: the correlation matrix of the assumptions, the sampled efficient frontier, and "
                        + "every binding constraint's shadow price, both as the change in minimum variance "
                        + "(∂V\\*/∂limit) and in volatility (∂σ\\*/∂limit) per unit of the limit.");
        table(content.assumptions().correlation());
        content.frontier().ifPresent(this::table);
        table(content.constraints());
        for (Table t : content.appendix()) {
            table(t);
        }
    }

    private void stress() {
        boolean proposal = content.stress().stream().anyMatch(t -> t.name().equals("stress_proposal"));
        List<String> lines = new ArrayList<>(List.of("## Stress", "",
                "How the portfolios' risk and return move when the assumptions are replaced by each scenario's"
                        + (proposal ? ": first the proposal (**" + Text.markdown(content.proposal().label())
                        + "**) and today's holdings as they are, then the least-risk portfolio at each target "
                        + "re-optimised under the scenario" : "") + ". Each point re-optimised under a scenario has a "
                        + "status: optimal (solved), infeasible (the target is out of reach under the scenario) or "
                        + "not-solved (the solver failed; the reason is in the Note column)."));
        if (!content.notSolved().isEmpty()) {
            lines.add("");
            lines.add("**" + content.notSolved().size() + " stress point" + (content.notSolved().size() == 1
                    ? " was" : "s were") + " not solved:**");
            lines.add("");
            for (PackContent.NotSolved x : content.notSolved()) {
                lines.add("- " + Text.markdown(x.scenario() + " at " + Explain.percent(x.target()) + " in the "
                        + x.where() + ": " + x.status() + " (" + x.reason() + ")"));
            }
        }
        markdown("stress", lines);
        for (Table t : content.stress()) {
            table(t);
        }
        charts(PackContent.ChartKind.STRESS);
    }

    /**
     * The trades: which trade list it is (the full move, or the move within the policy's trading limits), the
     * limits, the limits today's holdings break, the full move beside the limited one, the trade list, what the
     * limits cost (shadow prices), the conventions, and the caution.
     */
    private void trades() {
        String currency = Text.markdown(content.heading().currency());
        List<String> lines = new ArrayList<>();
        lines.add("## Trades");
        lines.add("");
        Optional<PackContent.Trading> trading = content.trading();
        if (trading.isEmpty()) {
            lines.add("The trades from the current holdings, in " + currency + ". Positive amounts are purchases, "
                    + "negative amounts sales.");
            markdown("trades", lines);
            content.trades().ifPresent(this::table);
            markdown("trades-caution", "*" + Text.markdown(Caution.SHORT) + "*");
            return;
        }
        PackContent.Trading t = trading.get();
        lines.add("**" + Text.markdown(t.headline()) + "**");
        if (!t.limits().isEmpty()) {
            lines.add("");
            lines.add("Trading limits of the policy:");
            lines.add("");
            for (String l : t.limits()) {
                lines.add("- " + Text.markdown(l));
            }
        }
        if (!t.breaches().isEmpty()) {
            lines.add("");
            lines.add(content.trades().isPresent() ? "Today's holdings break the policy; the trades below cure it:"
                    : "Today's holdings break the policy:");
            lines.add("");
            for (String b : t.breaches()) {
                lines.add("- " + Text.markdown(b));
            }
        }
        lines.add("");
        lines.add(t.mode() == PackContent.Trading.Mode.WITHIN_LIMITS
                ? "What keeping to the limits (and paying the trading costs) changes: the full move to the target "
                + "portfolio beside the proposal, both measured against today's holdings."
                : t.mode() == PackContent.Trading.Mode.FULL_MOVE
                ? "The full move to the proposal, measured against today's holdings."
                : "The full move to the target portfolio, measured against today's holdings.");
        markdown("trades", lines);
        table(t.comparison());
        if (!t.reading().isBlank()) {
            markdown("trades-reading", Text.markdown(t.reading()));
        }
        if (content.trades().isPresent()) {
            markdown("trades-list", "The trade list in " + currency + ": positive amounts are purchases, negative "
                    + "amounts sales.");
            table(content.trades().get());
        }
        List<String> after = new ArrayList<>();
        if (!t.sentences().isEmpty()) {
            after.add("What each limit costs at the margin: the shadow prices of the proposal's move, read for a "
                    + "small step (first-order estimates):");
            after.add("");
            for (String x : t.sentences()) {
                after.add("- " + Text.markdown(x));
            }
            after.add("");
        }
        for (String n : t.notes()) {
            after.add("- " + Text.markdown(n));
        }
        after.add("");
        after.add("*" + Text.markdown(Caution.SHORT) + "*");
        markdown("trades-notes", after);
    }

    private void runRecord() {
        PackContent.RunRecord r = content.run();
        List<String> lines = new ArrayList<>();
        lines.add("## Run record");
        lines.add("");
        lines.add("- **Tool:** isorisk " + Text.markdown(r.toolVersion()));
        lines.add("- **Made:** " + Text.markdown(r.created().toString()));
        for (PackContent.Parameter p : r.parameters()) {
            lines.add("- **" + Text.markdown(p.name()) + ":** " + Text.markdown(p.value()));
        }
        if (!r.inputs().isEmpty()) {
            lines.add("");
            lines.add("Inputs (SHA-256):");
            lines.add("");
            for (PackContent.InputFile f : r.inputs()) {
                lines.add("- " + Text.markdown(f.role()) + ": " + Text.markdown(f.name()) + " `" + hex(f.sha256()) + "`");
            }
        }
        if (!r.notes().isEmpty()) {
            lines.add("");
            lines.add("Notes:");
            lines.add("");
            for (String n : r.notes()) {
                lines.add("- " + Text.markdown(n));
            }
        }
        lines.add("");
        lines.add("`" + PackLayout.MANIFEST + "` next to this notebook lists every file of the pack with its SHA-256.");
        markdown("run-record", lines);
    }

    private static String hex(String s) {
        if (!s.matches("[0-9a-f]{64}")) {
            throw new IllegalArgumentException("not a SHA-256 in hex: " + s);
        }
        return s;
    }

    // ---------------------------------------------------------------- tables and charts

    private void table(Table t) {
        String var = t.name().replace('-', '_');
        List<String> src = List.of(var + " = load(" + Text.python(t.name()) + ")", "show(" + var + ")");
        ObjectNode result = output("execute_result");
        ObjectNode data = result.putObject("data");
        data.put("text/html", html(t));
        data.put("text/plain", plain(t));
        result.putObject("metadata");
        code("table-" + t.name(), src, List.of(result));
    }

    /** The table as pandas shows a DataFrame with a named index: headings, then the index name row. */
    static String html(Table t) {
        List<Table.Column> cols = t.columns();
        StringBuilder b = new StringBuilder();
        b.append("<div>\n<table border=\"1\" class=\"dataframe\">\n  <thead>\n    <tr style=\"text-align: right;\">\n");
        b.append("      <th></th>\n");
        for (int c = 1; c < cols.size(); c++) {
            b.append("      <th>").append(Text.html(cols.get(c).label())).append("</th>\n");
        }
        b.append("    </tr>\n    <tr>\n      <th>").append(Text.html(cols.get(0).label())).append("</th>\n");
        for (int c = 1; c < cols.size(); c++) {
            b.append("      <th></th>\n");
        }
        b.append("    </tr>\n  </thead>\n  <tbody>\n");
        for (List<Table.Cell> row : t.rows()) {
            b.append("    <tr>\n      <th>").append(Text.html(Text.display(row.get(0), Table.Format.TEXT))).append("</th>\n");
            for (int c = 1; c < cols.size(); c++) {
                b.append("      <td>").append(Text.html(Text.display(row.get(c), cols.get(c).format()))).append("</td>\n");
            }
            b.append("    </tr>\n");
        }
        b.append("  </tbody>\n</table>\n</div>");
        return b.toString();
    }

    /** The table as aligned plain text: the index left-aligned, other columns right-aligned. */
    static String plain(Table t) {
        List<Table.Column> cols = t.columns();
        int n = cols.size();
        List<String[]> lines = new ArrayList<>();
        String[] head = new String[n];
        head[0] = "";
        for (int c = 1; c < n; c++) {
            head[c] = cols.get(c).label();
        }
        lines.add(head);
        String[] index = new String[n];
        index[0] = cols.get(0).label();
        for (int c = 1; c < n; c++) {
            index[c] = "";
        }
        lines.add(index);
        for (List<Table.Cell> row : t.rows()) {
            String[] l = new String[n];
            for (int c = 0; c < n; c++) {
                l[c] = Text.display(row.get(c), cols.get(c).format()).replaceAll("[\\r\\n\\t]", " ");
            }
            lines.add(l);
        }
        int[] width = new int[n];
        for (String[] l : lines) {
            for (int c = 0; c < n; c++) {
                width[c] = Math.max(width[c], l[c].length());
            }
        }
        StringBuilder b = new StringBuilder();
        for (String[] l : lines) {
            StringBuilder line = new StringBuilder();
            line.append(l[0]).append(" ".repeat(width[0] - l[0].length()));
            for (int c = 1; c < n; c++) {
                line.append("  ").append(" ".repeat(width[c] - l[c].length())).append(l[c]);
            }
            b.append(line.toString().stripTrailing()).append('\n');
        }
        return b.toString().stripTrailing();
    }

    private void charts(PackContent.ChartKind kind) {
        for (PackContent.Chart c : content.charts(kind)) {
            List<String> src = List.of("chart(" + Text.python(c.name()) + ")");
            ObjectNode out = output("display_data");
            ObjectNode data = out.putObject("data");
            String png = Base64.getEncoder().encodeToString(c.png());
            // Renderers prefer text/html to images; Debian's nbconvert 6.5 would otherwise pick the SVG and strip
            // its drawing (lxml's clean_html removes SVG elements), leaving a blank chart in the HTML.
            data.put("text/html", "<img src=\"data:image/png;base64," + png + "\" alt=\"" + Text.html(c.title())
                    + "\" style=\"max-width: 100%;\"/>");
            data.put("image/png", png);
            data.put("image/svg+xml", c.svg());
            data.put("text/plain", c.title());
            out.putObject("metadata");
            // no heading of its own: the chart image carries its title
            code("chart-" + c.name(), src, List.of(out));
            if (!c.caption().isBlank()) {
                markdown("chart-" + c.name() + "-caption", "*" + Text.markdown(c.caption()) + "*");
            }
        }
    }

    // ---------------------------------------------------------------- cells

    private ObjectNode output(String type) {
        ObjectNode o = JSON.objectNode();
        o.put("output_type", type);
        return o;
    }

    private void markdown(String id, String... lines) {
        markdown(id, List.of(lines));
    }

    private void markdown(String id, List<String> lines) {
        ObjectNode cell = cells.addObject();
        cell.put("cell_type", "markdown");
        cell.put("id", uniqueId(id));
        cell.putObject("metadata");
        cell.set("source", source(lines));
    }

    private void code(String id, List<String> lines, List<ObjectNode> outputs) {
        int count = ++executionCount;
        ObjectNode cell = cells.addObject();
        cell.put("cell_type", "code");
        cell.put("id", uniqueId(id));
        cell.putObject("metadata");
        cell.put("execution_count", count);
        cell.set("source", source(lines));
        ArrayNode outs = cell.putArray("outputs");
        for (ObjectNode o : outputs) {
            if (o.get("output_type").asText().equals("execute_result")) {
                // nbformat orders execute_result's keys freely; the count must match the cell's.
                o.put("execution_count", count);
            }
            outs.add(o);
        }
    }

    /** Cell ids: 1–64 characters of {@code [a-zA-Z0-9-_]}, unique within the notebook (nbformat 4.5). */
    private String uniqueId(String base) {
        String clean = base.replaceAll("[^a-zA-Z0-9_-]", "-");
        if (clean.length() > 56) {
            clean = clean.substring(0, 56);
        }
        String id = clean;
        for (int k = 2; !ids.add(id); k++) {
            id = clean + "-" + k;
        }
        return id;
    }

    /** Jupyter's way of storing source: a list of lines, each but the last ending in a newline. */
    private static ArrayNode source(List<String> lines) {
        ArrayNode a = JSON.arrayNode();
        for (int i = 0; i < lines.size(); i++) {
            a.add(i < lines.size() - 1 ? lines.get(i) + "\n" : lines.get(i));
        }
        return a;
    }
}

package org.isorisk.cli.render;

import com.fasterxml.jackson.databind.node.ObjectNode;
import java.util.List;
import java.util.OptionalDouble;
import org.isorisk.cli.json.ResultJson;
import org.isorisk.engine.io.Provenance;
import org.isorisk.engine.risk.Contribution;
import org.isorisk.engine.risk.RiskDecomposition;
import org.isorisk.engine.risk.TrackingError;
import org.isorisk.notebooks.report.CsvWriter;

/**
 * The risk decomposition of a portfolio, optionally against a benchmark.
 *
 * @param label          what the portfolio is (a file name, "minimum-variance proposal", ...)
 * @param risk           its decomposition
 * @param marketValue    its total market value when it came from holdings
 * @param withReturns    false when no expected returns were given (returns are then not shown)
 * @param benchmarkLabel what the benchmark is; null without a benchmark
 * @param benchmarkRisk  the benchmark's decomposition; null without a benchmark
 * @param trackingError  tracking error against the benchmark; null without a benchmark
 * @param provenance     the input files, weights files included
 * @param warnings       what reading the inputs found
 */
public record RiskView(String label, RiskDecomposition risk, OptionalDouble marketValue, boolean withReturns,
                       String benchmarkLabel, RiskDecomposition benchmarkRisk, TrackingError trackingError,
                       Provenance provenance, List<String> warnings) implements Rendered {

    public RiskView {
        warnings = List.copyOf(warnings);
    }

    @Override
    public ObjectNode json() {
        ObjectNode o = ResultJson.object();
        o.put("status", "ok");
        ObjectNode p = o.putObject("portfolio");
        p.put("label", label);
        if (marketValue.isPresent()) {
            ResultJson.number(p, "market_value", marketValue.getAsDouble());
        }
        p.setAll(ResultJson.decomposition(risk, withReturns));
        if (benchmarkRisk != null) {
            ObjectNode b = o.putObject("benchmark");
            b.put("label", benchmarkLabel);
            b.setAll(ResultJson.decomposition(benchmarkRisk, withReturns));
            o.set("tracking_error", ResultJson.trackingError(trackingError));
        }
        o.set("warnings", ResultJson.strings(warnings));
        o.set("inputs", ResultJson.provenance(provenance));
        return o;
    }

    @Override
    public String table() {
        StringBuilder b = new StringBuilder();
        b.append("Risk of ").append(label);
        marketValue.ifPresent(v -> b.append(" (from market values, total ").append(Text.money(v)).append(')'));
        b.append('\n').append(Sections.inputs(provenance)).append('\n');
        b.append(decomposition(risk));
        b.append('\n');
        if (withReturns) {
            b.append("  Expected return  ").append(Text.pct(risk.expectedReturn())).append('\n');
        }
        b.append("  Volatility       ").append(Text.pct(risk.volatility())).append("   (variance ")
                .append(Text.num(risk.variance())).append(")\n");
        b.append(Text.wrap("Euler check: the risk contributions add up to the volatility (difference "
                + Text.sci(risk.eulerResidual()) + ").", "  ", "  "));
        if (benchmarkRisk != null) {
            b.append("\nBenchmark ").append(benchmarkLabel).append(": volatility ").append(Text.pct(benchmarkRisk.volatility()));
            if (withReturns) {
                b.append(", expected return ").append(Text.pct(benchmarkRisk.expectedReturn()));
            }
            b.append('\n').append(trackingError(trackingError));
        }
        b.append(Sections.bullets("Warnings:", warnings));
        b.append('\n').append(Text.caution());
        return b.toString();
    }

    /** The per-asset table of a decomposition; shared with the demo summary. */
    public static String decomposition(RiskDecomposition d) {
        Text.Table t = new Text.Table("Asset", "Weight", "Marginal risk", "Risk contribution", "Share of risk");
        for (Contribution c : d.contributions()) {
            t.row(c.asset(), Text.pct(c.weight()), Text.fixed4(c.marginal()), Text.pct(c.component()), Text.pct(c.share()));
        }
        t.row("Total", Text.pct(d.totalWeight()), "", Text.pct(d.volatility()), "");
        return t.render("  ");
    }

    /** Tracking error with the decomposition of active risk. */
    public static String trackingError(TrackingError te) {
        StringBuilder b = new StringBuilder("Tracking error against the benchmark: ").append(Text.pct(te.value()))
                .append('\n');
        te.decomposition().ifPresent(a -> {
            Text.Table t = new Text.Table("Asset", "Active weight", "Marginal", "Contribution to tracking error",
                    "Share");
            for (Contribution c : a.contributions()) {
                t.row(c.asset(), Text.pct(c.weight()), Text.fixed4(c.marginal()), Text.pct(c.component()),
                        Text.pct(c.share()));
            }
            b.append(t.render("  "));
        });
        return b.toString();
    }

    @Override
    public String csv() {
        return CsvWriter.text(c -> {
            Sections.csvHeader(c, "risk", provenance, warnings);
            c.comment("portfolio", label);
            c.comment("volatility", CsvWriter.number(risk.volatility()));
            if (withReturns) {
                c.comment("expected_return", CsvWriter.number(risk.expectedReturn()));
            }
            if (trackingError != null) {
                c.comment("benchmark", benchmarkLabel);
                c.comment("tracking_error", CsvWriter.number(trackingError.value()));
                c.row("asset", "weight", "marginal", "component", "share", "benchmark_weight", "active_weight",
                        "active_marginal", "active_component", "active_share");
                List<Contribution> p = risk.contributions();
                List<Contribution> bm = benchmarkRisk.contributions();
                List<Contribution> a = trackingError.active() == null ? null : trackingError.active().contributions();
                for (int i = 0; i < p.size(); i++) {
                    Contribution k = p.get(i);
                    c.row(k.asset(), k.weight(), k.marginal(), k.component(), k.share(), bm.get(i).weight(),
                            a == null ? 0.0 : a.get(i).weight(), a == null ? null : a.get(i).marginal(),
                            a == null ? null : a.get(i).component(), a == null ? null : a.get(i).share());
                }
            } else {
                c.row("asset", "weight", "marginal", "component", "share");
                for (Contribution k : risk.contributions()) {
                    c.row(k.asset(), k.weight(), k.marginal(), k.component(), k.share());
                }
            }
        });
    }
}

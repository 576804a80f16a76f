package org.isorisk.cli.render;

import com.fasterxml.jackson.databind.node.ObjectNode;
import java.util.List;
import org.isorisk.cli.json.RebalanceStressJson;
import org.isorisk.cli.json.ResultJson;
import org.isorisk.engine.io.Provenance;
import org.isorisk.engine.model.Multiplier;
import org.isorisk.engine.rebalance.Breach;
import org.isorisk.engine.rebalance.RebalanceResult;
import org.isorisk.engine.rebalance.Trade;
import org.isorisk.notebooks.report.CsvWriter;

/**
 * A rebalancing proposal: breaches of the policy today first, then the trade list, totals, risk and the shadow
 * prices of the binding limits.
 *
 * @param result      the engine's proposal
 * @param provenance  the input files
 * @param warnings    what reading the inputs found
 * @param solveMillis time in the engine
 */
public record RebalanceView(RebalanceResult result, Provenance provenance, List<String> warnings, double solveMillis)
        implements Rendered {

    public RebalanceView {
        warnings = List.copyOf(warnings);
    }

    @Override
    public ObjectNode json() {
        ObjectNode o = RebalanceStressJson.rebalance(result);
        o.set("warnings", ResultJson.strings(warnings));
        o.set("inputs", ResultJson.provenance(provenance));
        ResultJson.number(o.putObject("timing_ms"), "solve", solveMillis);
        return o;
    }

    private String title() {
        return switch (result.objective()) {
            case "target" -> "Rebalancing proposal: minimum risk for the return target after costs";
            case "same-risk" -> "Rebalancing proposal: highest return after costs at today's risk";
            default -> "Rebalancing proposal: the efficient portfolio nearest to today's (tracking error)";
        };
    }

    @Override
    public String table() {
        RebalanceResult r = result;
        StringBuilder b = new StringBuilder(title()).append('\n');
        b.append(Sections.inputs(provenance));
        if (!r.breaches().isEmpty()) {
            b.append("\nToday's holdings break the policy:\n");
            for (Breach x : r.breaches()) {
                b.append(Text.wrap(x.description(), "  ! ", "    "));
            }
        }
        b.append("\nTrades\n");
        boolean amounts = r.trades().stream().anyMatch(t -> Double.isFinite(t.amount()));
        Text.Table t = amounts
                ? new Text.Table("Asset", "Current", "Target", "Trade", "Amount", "Side", "Note")
                : new Text.Table("Asset", "Current", "Target", "Trade", "Side", "Note");
        for (Trade x : r.trades()) {
            String note = x.frozen() == null ? "" : x.frozen().equals("no-trade") ? "no-trade list"
                    : "below minimum trade";
            if (amounts) {
                t.row(x.asset(), Text.pct(x.current()), Text.pct(x.target()), Text.pct(x.trade()),
                        Text.money(x.amount()), x.side().label(), note);
            } else {
                t.row(x.asset(), Text.pct(x.current()), Text.pct(x.target()), Text.pct(x.trade()), x.side().label(),
                        note);
            }
        }
        b.append(t.render("  "));
        b.append('\n');
        b.append("  Turnover (two-way)   ").append(Text.pct(r.turnover())).append("   (buys ").append(Text.pct(r.buys()))
                .append(", sells ").append(Text.pct(r.sells())).append(")\n");
        b.append("  Estimated cost       ").append(Text.pct(r.cost()));
        if (Double.isFinite(r.costAmount())) {
            b.append("   (").append(Text.money(r.costAmount())).append(')');
        }
        b.append('\n');
        Text.Table s = new Text.Table("", "Today", "Proposal");
        s.row("Expected return", Text.pct(r.currentReturn()), Text.pct(r.proposedReturn()));
        s.row("Expected return after costs", "", Text.pct(r.proposedNetReturn()));
        s.row("Volatility", Text.pct(r.currentVolatility()), Text.pct(r.proposedVolatility()));
        s.row("Tracking error against today", "", Text.pct(r.trackingError()));
        b.append('\n').append(s.render("  "));
        if (r.proposedRisk() != null) {
            b.append("\nRisk contributions of the proposal\n").append(RiskView.decomposition(r.proposedRisk()));
        }
        b.append("\nShadow prices of the binding limits (one convention: ∂V*/∂limit, and in volatility ∂σ*/∂limit)\n");
        Text.Table m = new Text.Table("Binding limit", "∂V*/∂limit", "∂σ*/∂limit");
        r.turnoverPrice().ifPresent(x -> m.row("turnover" + (x.binding() ? "" : " (not binding)"),
                Text.sci(x.variancePerUnit()), Text.sci(x.volatilityPerUnit())));
        for (Multiplier x : r.binding()) {
            if (!x.constraint().equals("turnover")) {
                m.row(x.constraint(), Text.sci(x.variancePerUnit()), Text.sci(x.volatilityPerUnit()));
            }
        }
        b.append(m.render("  "));
        b.append(Sections.bullets("What the limits cost:", r.sentences()));
        b.append(Sections.bullets("Notes:", r.notes()));
        b.append(Sections.bullets("Warnings:", warnings));
        b.append(Text.wrap("Certificate: " + certificate(r), "", "  "));
        b.append('\n').append(Text.caution());
        return b.toString();
    }

    private static String certificate(RebalanceResult r) {
        var c = r.proposal().certificate();
        return String.format(java.util.Locale.ROOT, "%s (stationarity %s, primal %s, dual %s, complementarity %s; "
                        + "threshold %s).", c.passes() ? "the KKT conditions hold" : "WARNING: the KKT residuals exceed "
                        + "the threshold", Text.sci(c.stationarity()), Text.sci(c.primal()), Text.sci(c.dual()),
                Text.sci(c.complementarity()), Text.sci(c.threshold()));
    }

    @Override
    public String csv() {
        RebalanceResult r = result;
        return CsvWriter.text(c -> {
            Sections.csvHeader(c, "rebalance", provenance, warnings);
            c.comment("objective", r.objective());
            c.comment("turnover_convention", RebalanceResult.TURNOVER_CONVENTION);
            c.comment("turnover_two_way", CsvWriter.number(r.turnover()));
            c.comment("cost", CsvWriter.number(r.cost()));
            c.comment("current_volatility", CsvWriter.number(r.currentVolatility()));
            c.comment("proposed_volatility", CsvWriter.number(r.proposedVolatility()));
            c.comment("proposed_return_after_costs", CsvWriter.number(r.proposedNetReturn()));
            c.comment("tracking_error", CsvWriter.number(r.trackingError()));
            r.turnoverPrice().ifPresent(x -> {
                try {
                    c.comment("turnover_shadow_price_variance", CsvWriter.number(x.variancePerUnit()));
                    c.comment("turnover_shadow_price_volatility", CsvWriter.number(x.volatilityPerUnit()));
                } catch (java.io.IOException e) {
                    throw new java.io.UncheckedIOException(e);
                }
            });
            for (Breach x : r.breaches()) {
                c.comment("breach", x.description());
            }
            c.row("asset", "current_weight", "target_weight", "trade_weight", "trade_amount", "side", "cost", "frozen");
            for (Trade x : r.trades()) {
                c.row(x.asset(), x.current(), x.target(), x.trade(), Double.isFinite(x.amount()) ? x.amount() : null,
                        x.side().label(), x.cost(), x.frozen());
            }
        });
    }
}

package org.isorisk.cli.render;

import com.fasterxml.jackson.databind.node.ObjectNode;
import java.util.List;
import org.isorisk.cli.json.ResultJson;
import org.isorisk.engine.io.LoadedUniverse;
import org.isorisk.engine.risk.AssumptionSummary;
import org.isorisk.notebooks.report.CsvWriter;

/**
 * The result of {@code isorisk check}: the inputs are valid (else the command failed before), with what an
 * analyst looks at first.
 *
 * @param inputs  the universe as loaded
 * @param summary its summary
 */
public record CheckView(LoadedUniverse inputs, AssumptionSummary summary) implements Rendered {

    @Override
    public ObjectNode json() {
        ObjectNode o = ResultJson.object();
        o.put("status", "valid");
        o.setAll(ResultJson.summary(summary));
        o.put("positive_definite", true);
        o.put("has_expected_returns", inputs.hasExpectedReturns());
        o.set("warnings", ResultJson.strings(inputs.warnings()));
        o.set("inputs", ResultJson.provenance(inputs.provenance()));
        return o;
    }

    @Override
    public String table() {
        StringBuilder b = new StringBuilder();
        b.append("Check of the assumptions: ").append(summary.assets()).append(" assets\n");
        b.append(Sections.inputs(inputs.provenance())).append('\n');
        Text.Table t = new Text.Table("Asset", "Expected return", "Volatility");
        for (int i = 0; i < summary.assets(); i++) {
            t.row(summary.names().get(i), inputs.hasExpectedReturns() ? Text.pct(summary.expectedReturns()[i]) : "-",
                    Text.pct(summary.volatilities()[i]));
        }
        b.append(t.render("  ")).append('\n');
        if (inputs.hasExpectedReturns()) {
            b.append("  Expected returns     ").append(Text.pct(summary.lowestReturn().value())).append(" (")
                    .append(summary.lowestReturn().asset()).append(") to ").append(Text.pct(summary.highestReturn().value()))
                    .append(" (").append(summary.highestReturn().asset()).append(")\n");
        } else {
            b.append("  Expected returns     not given (only risk was checked)\n");
        }
        b.append("  Volatilities         ").append(Text.pct(summary.lowestVolatility().value())).append(" (")
                .append(summary.lowestVolatility().asset()).append(") to ")
                .append(Text.pct(summary.highestVolatility().value())).append(" (")
                .append(summary.highestVolatility().asset()).append(")\n");
        b.append("  Smallest eigenvalue  ").append(Text.num(summary.smallestEigenvalue())).append('\n');
        b.append("  Largest eigenvalue   ").append(Text.num(summary.largestEigenvalue())).append('\n');
        b.append("  Condition number     ").append(Text.num(summary.conditionNumber())).append('\n');
        b.append(Text.wrap("Positive definite: yes, so every minimum-variance problem on these inputs is strictly "
                + "convex and has one global minimum.", "  ", "  "));
        b.append(Sections.bullets("Warnings:", inputs.warnings()));
        if (inputs.warnings().isEmpty()) {
            b.append("\nWarnings: none\n");
        }
        b.append("\nResult: the inputs are valid.\n\n").append(Text.caution());
        return b.toString();
    }

    @Override
    public String csv() {
        return CsvWriter.text(c -> {
            Sections.csvHeader(c, "check", inputs.provenance(), inputs.warnings());
            c.comment("smallest_eigenvalue", CsvWriter.number(summary.smallestEigenvalue()));
            c.comment("largest_eigenvalue", CsvWriter.number(summary.largestEigenvalue()));
            c.comment("condition_number", CsvWriter.number(summary.conditionNumber()));
            c.row("asset", "expected_return", "volatility");
            for (int i = 0; i < summary.assets(); i++) {
                c.row(summary.names().get(i), inputs.hasExpectedReturns() ? summary.expectedReturns()[i] : null,
                        summary.volatilities()[i]);
            }
        });
    }

    @Override
    public List<String> warnings() {
        return inputs.warnings();
    }
}

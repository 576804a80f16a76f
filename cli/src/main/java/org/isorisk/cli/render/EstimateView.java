package org.isorisk.cli.render;

import com.fasterxml.jackson.databind.node.ObjectNode;
import java.io.StringWriter;
import java.nio.file.Path;
import java.util.List;
import org.isorisk.cli.json.ResultJson;
import org.isorisk.engine.estimate.Estimate;
import org.isorisk.engine.estimate.Issue;
import org.isorisk.engine.explain.Caution;
import org.isorisk.notebooks.report.CsvWriter;

/**
 * The result of {@code isorisk estimate}: the data-quality report of the estimate and the files written.
 *
 * @param estimate   the estimate
 * @param outDir     the folder written
 * @param files      names of the files in it
 * @param readMs     reading the inputs, ms
 * @param estimateMs estimating, ms
 * @param writeMs    writing the folder, ms
 */
public record EstimateView(Estimate estimate, Path outDir, List<String> files, double readMs, double estimateMs,
                           double writeMs) implements Rendered {

    /** Asset rows shown in the table; the files hold all. */
    public static final int TABLE_ROWS = 40;

    public EstimateView {
        files = List.copyOf(files);
    }

    @Override
    public ObjectNode json() {
        ObjectNode o = EstimateReport.json(estimate);
        o.remove("caution");
        o.put("out_dir", outDir.toString());
        o.set("files", ResultJson.strings(files));
        ObjectNode t = o.putObject("timing_ms");
        ResultJson.number(t, "read", readMs);
        ResultJson.number(t, "estimate", estimateMs);
        ResultJson.number(t, "write", writeMs);
        return o;
    }

    @Override
    public String table() {
        StringWriter w = new StringWriter();
        w.write("Wrote " + outDir + ": " + String.join(", ", files) + "\n\n");
        EstimateReport.text(w, estimate, TABLE_ROWS);
        return w.toString();
    }

    @Override
    public String csv() {
        return CsvWriter.text(c -> {
            c.comment("command", "estimate");
            c.comment("source", estimate.source());
            c.comment("method", EstimateReport.method(estimate));
            c.comment("expected_returns", EstimateReport.mean(estimate));
            c.comment("periods_per_year", Integer.toString(estimate.periodsPerYear()));
            for (String warning : warnings()) {
                c.comment("warning", warning);
            }
            c.comment("caution", Caution.TEXT);
            c.row("asset", "expected_return", "volatility");
            double[] mu = estimate.expectedReturns();
            double[] vol = estimate.volatilities();
            for (int i = 0; i < estimate.size(); i++) {
                c.row(estimate.assets().get(i), mu[i], vol[i]);
            }
        });
    }

    @Override
    public List<String> warnings() {
        return estimate.issues(Issue.Severity.WARNING).stream().map(Issue::message).toList();
    }
}

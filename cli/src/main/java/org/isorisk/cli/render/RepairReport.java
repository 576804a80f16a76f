package org.isorisk.cli.render;

import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.io.PrintWriter;
import java.io.Writer;
import java.util.Locale;
import org.isorisk.cli.json.ResultJson;
import org.isorisk.engine.estimate.RepairResult;
import org.isorisk.engine.explain.Caution;

/** The report of a matrix repair: what was changed and by how much, as text and as JSON, with the caution. */
public final class RepairReport {
    private RepairReport() {
    }

    /** Writes the report as text. */
    public static void text(Writer out, RepairResult r, String source) {
        PrintWriter w = new PrintWriter(out);
        String kind = r.covarianceInput() ? "covariance" : "correlation";
        w.printf(Locale.ROOT, "Repair of %s (%s matrix, %d assets)%n", source, kind, r.assets().size());
        w.printf(Locale.ROOT, "  %-10s smallest eigenvalue %s, condition number %s%n", "before:",
                EstimateReport.sci(r.before().smallest()), EstimateReport.sci(r.before().conditionNumber()));
        if (!r.changed()) {
            w.println("  The matrix is already positive definite: nothing was changed.");
        } else {
            w.printf(Locale.ROOT, "  %-10s smallest eigenvalue %s, condition number %s%n", "after:",
                    EstimateReport.sci(r.after().smallest()), EstimateReport.sci(r.after().conditionNumber()));
            w.println("  Method:    nearest correlation matrix in the Frobenius norm by alternating projections with "
                    + "Dykstra's correction (Higham 2002, IMA J. Numer. Anal. 22)"
                    + (r.covarianceInput() ? "; volatilities kept" : ""));
            w.printf(Locale.ROOT, "  Distance:  %s (Frobenius norm of the change%s), %d iterations%n",
                    EstimateReport.sci(r.frobeniusDistance()), r.covarianceInput()
                            ? String.format(Locale.ROOT, " of the covariance; %s of the correlation",
                            EstimateReport.sci(r.correlationDistance())) : "", r.iterations());
            w.println("  Largest changes of correlation:");
            for (RepairResult.Change c : r.largestChanges()) {
                w.printf(Locale.ROOT, "    %s / %s: %.4f -> %.4f (%+.4f)%n", c.first(), c.second(),
                        c.correlationBefore(), c.correlationAfter(), c.correlationChange());
            }
            w.println("  Check these changes before using the repaired matrix: they replace your numbers.");
        }
        w.println();
        w.println("Caution: " + Caution.TEXT);
        w.flush();
    }

    /** The report as a JSON object. */
    public static ObjectNode json(RepairResult r, String source) {
        ObjectNode root = ResultJson.object();
        root.put("status", "ok");
        root.put("source", source);
        root.put("matrix", r.covarianceInput() ? "covariance" : "correlation");
        root.put("changed", r.changed());
        root.put("method", "nearest correlation matrix, alternating projections with Dykstra's correction "
                + "(Higham 2002)" + (r.covarianceInput() ? ", volatilities kept" : ""));
        EstimateReport.number(root, "frobenius_distance", r.frobeniusDistance());
        EstimateReport.number(root, "correlation_distance", r.correlationDistance());
        root.put("iterations", r.iterations());
        EstimateReport.spectrum(root.putObject("before"), r.before());
        EstimateReport.spectrum(root.putObject("after"), r.after());
        ArrayNode changes = root.putArray("largest_changes");
        for (RepairResult.Change c : r.largestChanges()) {
            ObjectNode n = changes.addObject();
            n.put("first", c.first());
            n.put("second", c.second());
            EstimateReport.number(n, "correlation_before", c.correlationBefore());
            EstimateReport.number(n, "correlation_after", c.correlationAfter());
            EstimateReport.number(n, "value_before", c.valueBefore());
            EstimateReport.number(n, "value_after", c.valueAfter());
        }
        root.put("caution", Caution.TEXT);
        return root;
    }
}

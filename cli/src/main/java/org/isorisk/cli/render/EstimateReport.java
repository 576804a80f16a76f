package org.isorisk.cli.render;

import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.io.PrintWriter;
import java.io.Writer;
import java.util.List;
import java.util.Locale;
import org.isorisk.cli.json.ResultJson;
import org.isorisk.engine.estimate.CovarianceMethod;
import org.isorisk.engine.estimate.Estimate;
import org.isorisk.engine.estimate.Issue;
import org.isorisk.engine.estimate.ReturnType;
import org.isorisk.engine.estimate.ValueKind;
import org.isorisk.engine.explain.Caution;
import org.isorisk.engine.explain.Explain;
import org.isorisk.engine.linalg.Spectrum;

/**
 * The data-quality report of an estimate, as text for people and as JSON for scripts; both say how every number
 * was obtained (returns, frequency and periods per year, estimator, shrinkage intensity, conditioning before and
 * after) and carry the caution.
 */
public final class EstimateReport {
    private EstimateReport() {
    }

    /** The estimator in words, with its source. */
    public static String method(Estimate e) {
        return switch (e.method()) {
            case SAMPLE -> "sample covariance (divisor n - 1), centred on the sample mean";
            case EWMA -> String.format(Locale.ROOT, "exponentially weighted (EWMA), decay %s (half-life %.1f periods)%s;"
                            + " weights normalised to sum to 1, centred on the weighted mean", Double.toString(e.decay()),
                    Math.log(0.5) / Math.log(e.decay()),
                    e.decay() == 0.94 ? ", the RiskMetrics Technical Document (1996) daily value" : "");
            case LEDOIT_WOLF_IDENTITY -> String.format(Locale.ROOT, "Ledoit-Wolf shrinkage towards a scaled identity "
                    + "(Ledoit & Wolf 2004, J. Multivariate Anal. 88), intensity %.6f estimated from the data; "
                    + "sample covariance with divisor n as in the paper", e.shrinkage().intensity());
            case LEDOIT_WOLF_CONSTANT_CORRELATION -> String.format(Locale.ROOT, "Ledoit-Wolf shrinkage towards "
                    + "constant correlation (Ledoit & Wolf 2004, J. Portfolio Management 30(4)), intensity %.6f "
                    + "estimated from the data; sample covariance with divisor n as in the paper",
                    e.shrinkage().intensity());
        };
    }

    /** How the expected returns were obtained, in words. */
    public static String mean(Estimate e) {
        Estimate.MeanInfo m = e.mean();
        return switch (m.kind()) {
            case "historical" -> "historical arithmetic means of the returns used, annualised";
            case "supplied" -> "supplied in " + m.source() + ", used as given";
            default -> Double.isNaN(m.sharpeRatio())
                    ? String.format(Locale.ROOT, "implied by the reference portfolio in %s: mu = r_f + delta * Sigma * "
                    + "w_ref with delta = %s (given), r_f = %s", m.source(), num(m.riskAversion()),
                    Explain.percent(m.riskFree()))
                    : String.format(Locale.ROOT, "implied by the reference portfolio in %s: mu = r_f + delta * Sigma * "
                    + "w_ref with delta = SR / sigma_ref = %s / %s = %s, r_f = %s", m.source(), num(m.sharpeRatio()),
                    num(m.referenceVolatility()), num(m.riskAversion()), Explain.percent(m.riskFree()));
        };
    }

    private static String returns(Estimate e) {
        if (e.kind() == ValueKind.RETURNS) {
            return e.returnType().label() + " returns, as given in the file";
        }
        return e.returnType() == ReturnType.SIMPLE ? "simple returns r = p_t / p_(t-1) - 1"
                : "log returns r = ln(p_t / p_(t-1))";
    }

    /**
     * Writes the report as text.
     *
     * @param maxRows at most this many asset rows in the table (the files hold all)
     */
    public static void text(Writer out, Estimate e, int maxRows) {
        PrintWriter w = new PrintWriter(out);
        Estimate.Observations o = e.observations();
        w.printf(Locale.ROOT, "Estimate from %s: %d assets, %d rows of %s%n", e.source(), e.size(), o.rows(),
                e.kind().label());
        w.printf(Locale.ROOT, "  returns used:   %d of %d (%s to %s), %d dropped by listwise deletion%n", o.used(),
                o.returns(), o.first(), o.last(), o.dropped());
        w.printf(Locale.ROOT, "  returns:        %s%n", returns(e));
        w.printf(Locale.ROOT, "  frequency:      %s (%s, median interval %s %s); %d periods a year%n",
                e.frequency().label(), e.frequencyDetected() ? "detected from the dates" : "given",
                num(e.medianGapDays()), e.medianGapDays() == 1 ? "day" : "days", e.periodsPerYear());
        w.printf(Locale.ROOT, "  annualised:     mean x %d, covariance x %d%s%n", e.periodsPerYear(),
                e.periodsPerYear(), e.returnType() == ReturnType.SIMPLE ? " (simple returns are not compounded)" : "");
        w.printf(Locale.ROOT, "  covariance:     %s%n", method(e));
        w.printf(Locale.ROOT, "  expected:       %s%n", mean(e));
        w.printf(Locale.ROOT, "  conditioning:   %-24s %-22s %s%n", "", "smallest eigenvalue", "condition number");
        w.printf(Locale.ROOT, "                  %-24s %-22s %s%n", "before (sample, n - 1)", sci(e.before().smallest()),
                sci(e.before().conditionNumber()));
        w.printf(Locale.ROOT, "                  %-24s %-22s %s%n", "after (this estimate)",
                sci(e.after().smallest()), sci(e.after().conditionNumber()));
        w.println();
        double[] mu = e.expectedReturns();
        double[] vol = e.volatilities();
        double[] se = e.mean().standardErrors();
        int width = 5;
        for (String a : e.assets()) {
            width = Math.max(width, Math.min(a.length(), 40));
        }
        w.printf(Locale.ROOT, "  %-" + width + "s  %15s  %10s%s%n", "asset", "expected return", "volatility",
                se != null ? "  std. error of mean" : "");
        int shown = Math.min(e.size(), maxRows);
        for (int i = 0; i < shown; i++) {
            w.printf(Locale.ROOT, "  %-" + width + "s  %15s  %10s%s%n", e.assets().get(i), Explain.percent(mu[i]),
                    Explain.percent(vol[i]), se != null ? String.format(Locale.ROOT, "  %19s", Explain.percent(se[i]))
                            : "");
        }
        if (shown < e.size()) {
            w.printf(Locale.ROOT, "  ... %d more assets in the written tables%n", e.size() - shown);
        }
        w.println();
        List<Issue> issues = e.issues();
        w.println(issues.isEmpty() ? "Data quality: no findings." : "Data quality:");
        for (Issue i : issues) {
            w.printf(Locale.ROOT, "  %s: %s%n", i.severity().label(), i.message());
        }
        w.println();
        w.println("Caution: " + Caution.TEXT);
        w.flush();
    }

    /** The report as a JSON object (field names in snake case; NaN and infinities as null). */
    public static ObjectNode json(Estimate e) {
        ObjectNode root = ResultJson.object();
        root.put("status", "ok");
        root.put("source", e.source());
        root.put("kind", e.kind().label());
        root.put("returns", e.returnType().label());
        ObjectNode f = root.putObject("frequency");
        f.put("frequency", e.frequency().label());
        f.put("detected", e.frequencyDetected());
        number(f, "median_interval_days", e.medianGapDays());
        f.put("periods_per_year", e.periodsPerYear());
        Estimate.Observations o = e.observations();
        ObjectNode obs = root.putObject("observations");
        obs.put("rows", o.rows());
        obs.put("returns", o.returns());
        obs.put("used", o.used());
        obs.put("dropped_rows", o.dropped());
        obs.put("missing_cells", o.missingCells());
        obs.put("first", String.valueOf(o.first()));
        obs.put("last", String.valueOf(o.last()));
        ObjectNode m = root.putObject("method");
        m.put("name", e.method().label());
        m.put("description", method(e));
        if (e.method() == CovarianceMethod.EWMA) {
            number(m, "decay", e.decay());
            number(m, "half_life", Math.log(0.5) / Math.log(e.decay()));
        }
        if (e.shrinkage() != null) {
            m.put("target", e.shrinkage().target());
            number(m, "shrinkage_intensity", e.shrinkage().intensity());
        }
        ObjectNode cond = root.putObject("conditioning");
        spectrum(cond.putObject("before"), e.before());
        spectrum(cond.putObject("after"), e.after());
        ObjectNode mean = root.putObject("mean");
        Estimate.MeanInfo mi = e.mean();
        mean.put("kind", mi.kind());
        mean.put("description", mean(e));
        if (mi.source() != null) {
            mean.put("source", mi.source());
        }
        number(mean, "years", mi.years());
        if (mi.kind().equals("implied")) {
            number(mean, "risk_aversion", mi.riskAversion());
            number(mean, "sharpe_ratio", mi.sharpeRatio());
            number(mean, "risk_free", mi.riskFree());
            number(mean, "reference_volatility", mi.referenceVolatility());
        }
        ArrayNode assets = root.putArray("assets");
        double[] mu = e.expectedReturns();
        double[] vol = e.volatilities();
        double[] se = mi.standardErrors();
        for (int i = 0; i < e.size(); i++) {
            ObjectNode a = assets.addObject();
            a.put("asset", e.assets().get(i));
            number(a, "expected_return", mu[i]);
            number(a, "volatility", vol[i]);
            if (se != null) {
                number(a, "mean_standard_error", se[i]);
            }
        }
        ArrayNode issues = root.putArray("issues");
        for (Issue i : e.issues()) {
            ObjectNode n = issues.addObject();
            n.put("code", i.code().label());
            n.put("severity", i.severity().label());
            if (i.asset() != null) {
                n.put("asset", i.asset());
            }
            if (i.row() > 0) {
                n.put("row", i.row());
            }
            n.put("message", i.message());
        }
        root.put("caution", Caution.TEXT);
        return root;
    }

    static void spectrum(ObjectNode n, Spectrum s) {
        number(n, "smallest_eigenvalue", s.smallest());
        number(n, "largest_eigenvalue", s.largest());
        number(n, "condition_number", s.conditionNumber());
        n.put("exact", s.exact());
    }

    static void number(ObjectNode n, String field, double v) {
        ResultJson.number(n, field, v);
    }

    static String num(double v) {
        if (!Double.isFinite(v)) {
            return Double.isNaN(v) ? "n/a" : "infinite";
        }
        return v == Math.rint(v) && Math.abs(v) < 1e15 ? String.valueOf((long) v)
                : String.format(Locale.ROOT, "%.4g", v);
    }

    static String sci(double v) {
        if (!Double.isFinite(v)) {
            return Double.isNaN(v) ? "n/a" : "infinite";
        }
        return String.format(Locale.ROOT, "%.4g", v);
    }
}

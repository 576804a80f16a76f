package org.isorisk.cli.render;

import com.fasterxml.jackson.databind.node.ObjectNode;
import java.util.List;
import java.util.Map;
import org.isorisk.cli.json.ResultJson;
import org.isorisk.engine.explain.Explain;
import org.isorisk.engine.io.LoadedUniverse;
import org.isorisk.engine.model.Certificate;
import org.isorisk.engine.model.Method;
import org.isorisk.engine.model.Multiplier;
import org.isorisk.engine.model.Objective;
import org.isorisk.engine.model.Solution;
import org.isorisk.engine.risk.Contribution;
import org.isorisk.engine.risk.RiskDecomposition;
import org.isorisk.notebooks.report.CsvWriter;

/**
 * A solved portfolio for people, spreadsheets and scripts.
 *
 * @param solution    the engine's solution
 * @param risk        its risk decomposition
 * @param objective   what was asked
 * @param sharpe      Sharpe ratio for a tangency objective, NaN otherwise
 * @param fixed       fixed weights asked for, by asset (decimal)
 * @param policy      file name of the policy the mandate comes from; null without one
 * @param inputs      the universe as loaded (provenance)
 * @param warnings    the loader's warnings and the command's own
 * @param solveMillis time in the solver
 */
public record SolveView(Solution solution, RiskDecomposition risk, Objective objective, double sharpe,
                        Map<String, Double> fixed, String policy, LoadedUniverse inputs, List<String> warnings, double solveMillis)
        implements Rendered {

    public SolveView {
        fixed = java.util.Collections.unmodifiableMap(new java.util.LinkedHashMap<>(fixed));
        warnings = List.copyOf(warnings);
    }

    /** A title such as "Minimum-variance portfolio for a target return of 5.00 %". */
    public String title() {
        if (objective instanceof Objective.TargetReturn t) {
            return "Minimum-variance portfolio for a target return of " + Text.pct(t.target());
        }
        if (objective instanceof Objective.Tangency t) {
            return "Tangency portfolio (highest Sharpe ratio) for a risk-free rate of " + Text.pct(t.riskFree());
        }
        return "Minimum-variance portfolio";
    }

    /** The objective as JSON: kind and its parameter. */
    public ObjectNode objectiveJson() {
        ObjectNode o = ResultJson.object();
        if (objective instanceof Objective.TargetReturn t) {
            o.put("kind", "target-return");
            ResultJson.number(o, "target_return", t.target());
        } else if (objective instanceof Objective.Tangency t) {
            o.put("kind", "tangency");
            ResultJson.number(o, "risk_free", t.riskFree());
            ResultJson.number(o, "sharpe_ratio", sharpe);
        } else {
            o.put("kind", "minimum-variance");
        }
        return o;
    }

    @Override
    public ObjectNode json() {
        ObjectNode o = ResultJson.solution(solution);
        o.set("objective", objectiveJson());
        ObjectNode f = o.putObject("fixed");
        fixed.forEach((k, v) -> ResultJson.number(f, k, v));
        if (policy == null) {
            o.putNull("policy");
        } else {
            o.put("policy", policy);
        }
        o.set("risk", ResultJson.decomposition(risk, true));
        o.set("warnings", ResultJson.strings(warnings));
        o.set("inputs", ResultJson.provenance(inputs.provenance()));
        ResultJson.number(o.putObject("timing_ms"), "solve", solveMillis);
        return o;
    }

    @Override
    public String table() {
        StringBuilder b = new StringBuilder();
        b.append(title()).append(" (method: ").append(solution.method().label()).append(")\n");
        b.append(policy == null ? "Mandate: the budget only (no policy file; short positions allowed)\n"
                : "Mandate: policy " + policy + "\n");
        b.append(Sections.inputs(inputs.provenance())).append('\n');
        b.append(weights());
        b.append('\n');
        b.append("  Expected return  ").append(Text.pct(solution.expectedReturn())).append('\n');
        b.append("  Volatility       ").append(Text.pct(solution.volatility())).append("   (variance ")
                .append(Text.num(solution.variance())).append(")\n");
        if (objective instanceof Objective.Tangency) {
            b.append("  Sharpe ratio     ").append(Text.num(sharpe)).append('\n');
        }
        b.append('\n').append(multipliers(solution));
        b.append('\n').append(certificate(solution.certificate(), solution.method()));
        b.append(Sections.bullets("Notes:", solution.notes()));
        b.append(Sections.bullets("Warnings:", warnings));
        b.append('\n').append(Text.caution());
        return b.toString();
    }

    private String weights() {
        Text.Table t = new Text.Table("Asset", "Weight", "Marginal risk", "Risk contribution", "Share of risk");
        for (Contribution c : risk.contributions()) {
            t.row(c.asset(), Text.pct(c.weight()), Text.fixed4(c.marginal()), Text.pct(c.component()), Text.pct(c.share()));
        }
        t.row("Total", Text.pct(risk.totalWeight()), "", Text.pct(risk.volatility()), "");
        return t.render("  ");
    }

    /**
     * The multiplier table of the binding constraints with a sentence for each, then the names of the constraints
     * that do not bind (their shadow price is zero); shared with the demo summary.
     */
    public static String multipliers(Solution s) {
        StringBuilder b = new StringBuilder("Shadow prices (change of the optimal variance and volatility per unit "
                + "of each constraint's limit):\n");
        Text.Table t = new Text.Table("Constraint", "Variance per unit", "Volatility per unit", "Binding");
        List<String> slack = new java.util.ArrayList<>();
        for (Multiplier m : s.multipliers()) {
            if (m.binding()) {
                t.row(m.constraint(), Text.num(m.variancePerUnit()), Text.num(m.volatilityPerUnit()), "yes");
            } else {
                slack.add(m.constraint());
            }
        }
        b.append(t.render("  "));
        for (Multiplier m : s.binding()) {
            b.append(Text.wrap(Explain.sentence(m), "  - ", "    "));
        }
        if (!slack.isEmpty()) {
            b.append(Text.wrap("Not binding (shadow price 0, moving their limits a little changes nothing): "
                    + String.join(", ", slack) + ".", "  ", "    "));
        }
        return b.toString();
    }

    static String certificate(Certificate c) {
        return certificate(c, Method.CLOSED_FORM);
    }

    /** The certificate line; bounded methods report the condition number of the reduced system they solved. */
    static String certificate(Certificate c, Method method) {
        String of = method == Method.CLOSED_FORM ? "of the covariance" : "of the reduced system solved";
        String line = "Certificate (KKT residuals): stationarity " + Text.sci(c.stationarity()) + ", primal "
                + Text.sci(c.primal()) + ", dual " + Text.sci(c.dual()) + ", complementarity "
                + Text.sci(c.complementarity()) + "; condition number " + of + " " + Text.num(c.conditionNumber())
                + (c.passes() ? "; passes (threshold " + Text.sci(c.threshold()) + ")."
                        : "; DOES NOT PASS the threshold " + Text.sci(c.threshold())
                                + ": treat these numbers with suspicion.");
        return Text.wrap(line, "", "  ");
    }

    @Override
    public String csv() {
        return CsvWriter.text(c -> {
            Sections.csvHeader(c, "solve", inputs.provenance(), warnings);
            c.comment("objective", title());
            c.comment("status", solution.status().label());
            c.comment("method", solution.method().label());
            c.comment("policy", policy == null ? "none (budget only; short positions allowed)" : policy);
            c.comment("expected_return", CsvWriter.number(solution.expectedReturn()));
            c.comment("volatility", CsvWriter.number(solution.volatility()));
            c.comment("variance", CsvWriter.number(solution.variance()));
            for (Multiplier m : solution.multipliers()) {
                c.comment("multiplier", m.constraint() + ": variance_per_unit " + CsvWriter.number(m.variancePerUnit())
                        + ", volatility_per_unit " + CsvWriter.number(m.volatilityPerUnit()) + "; "
                        + Explain.sentence(m));
            }
            c.comment("certificate_passes", Boolean.toString(solution.certificate().passes()));
            for (String n : solution.notes()) {
                c.comment("note", n);
            }
            c.row("asset", "weight", "marginal", "component", "share");
            for (Contribution k : risk.contributions()) {
                c.row(k.asset(), k.weight(), k.marginal(), k.component(), k.share());
            }
        });
    }

}

package org.isorisk.cli.render;

import com.fasterxml.jackson.databind.node.ObjectNode;
import java.util.List;
import org.isorisk.cli.json.RebalanceStressJson;
import org.isorisk.cli.json.ResultJson;
import org.isorisk.engine.io.Provenance;
import org.isorisk.engine.model.Branch;
import org.isorisk.engine.stress.BindingChange;
import org.isorisk.engine.stress.ScenarioPoint;
import org.isorisk.engine.stress.ScenarioResult;
import org.isorisk.engine.stress.StressResult;
import org.isorisk.engine.stress.TargetPoint;
import org.isorisk.notebooks.report.CsvWriter;

/**
 * A stress run: the target sweep under the base assumptions, then one block per scenario.
 *
 * @param result      the engine's result
 * @param provenance  the input files
 * @param warnings    what reading the inputs found
 * @param solveMillis time in the engine
 */
public record StressView(StressResult result, Provenance provenance, List<String> warnings, double solveMillis)
        implements Rendered {

    public StressView {
        warnings = List.copyOf(warnings);
    }

    /**
     * The stress run's notes, then one for each sweep (today's assumptions, then each scenario's) with targets on
     * the inefficient branch: their marginal risk is negative, which the reader must not take for a bargain.
     */
    List<String> notes() {
        List<String> out = new java.util.ArrayList<>(result.notes());
        inefficient("Under today's assumptions", result.base()).ifPresent(out::add);
        for (ScenarioResult s : result.scenarios()) {
            inefficient("Under scenario " + s.scenario().name(), s.sweep()).ifPresent(out::add);
        }
        return out;
    }

    private static java.util.Optional<String> inefficient(String where, org.isorisk.engine.stress.Sweep sweep) {
        List<String> at = sweep == null ? List.of() : sweep.points().stream()
                .filter(p -> p.feasible() && p.solution() != null && Branch.inefficient(p.solution()))
                .map(p -> Text.pct(p.target())).toList();
        if (at.isEmpty()) {
            return java.util.Optional.empty();
        }
        return java.util.Optional.of(where + ", " + (at.size() == 1 ? "the target " : "the targets ")
                + String.join(", ", at) + (at.size() == 1 ? " lies" : " lie") + " below the minimum-variance return, "
                + "on the inefficient branch of the frontier: the marginal risk is negative there (raising the target "
                + "lowers the least risk), and another portfolio of the mandate has the same risk with a higher "
                + "expected return.");
    }

    private static boolean inefficient(TargetPoint p) {
        return p.feasible() && p.solution() != null && Branch.inefficient(p.solution());
    }

    @Override
    public ObjectNode json() {
        ObjectNode o = RebalanceStressJson.stress(result);
        o.set("notes", ResultJson.strings(notes()));
        o.set("warnings", ResultJson.strings(warnings));
        o.set("inputs", ResultJson.provenance(provenance));
        ResultJson.number(o.putObject("timing_ms"), "solve", solveMillis);
        return o;
    }

    @Override
    public String table() {
        StringBuilder b = new StringBuilder("Stress test of the return target");
        b.append(result.scenarios().isEmpty() ? "\n" : " and of the assumptions\n");
        b.append(Sections.inputs(provenance));
        b.append(String.format(java.util.Locale.ROOT, "\nBase assumptions: achievable targets %s to %s\n",
                Text.pct(result.base().minTarget()), Text.pct(result.base().maxTarget())));
        Text.Table t = new Text.Table("Target", "Min volatility", "Marginal risk ∂σ*/∂m", "Binding");
        for (TargetPoint p : result.base().points()) {
            t.row(Text.pct(p.target()), p.feasible() ? Text.pct(p.volatility()) : "infeasible",
                    p.feasible() ? Text.fixed4(p.marginalRisk()) + (inefficient(p) ? " (inefficient branch)" : "")
                            : "", p.feasible() ? p.binding().size() + "" : "");
        }
        b.append(t.render("  "));
        b.append("\nBinding constraints (besides the budget and the target):\n");
        for (TargetPoint p : result.base().points()) {
            if (p.feasible()) {
                b.append(Text.wrap(p.binding().isEmpty() ? "none" : String.join(", ", p.binding()),
                        "  " + Text.pct(p.target()) + ": ", "          "));
            }
        }
        if (!result.base().changes().isEmpty()) {
            b.append("\nWhere the binding set changes:\n");
            for (BindingChange c : result.base().changes()) {
                String where = c.exact() ? "at " + Text.pct(c.at())
                        : "between " + Text.pct(c.from()) + " and " + Text.pct(c.to());
                String what = (c.entered().isEmpty() ? "" : "starts binding: " + String.join(", ", c.entered()))
                        + (!c.entered().isEmpty() && !c.left().isEmpty() ? "; " : "")
                        + (c.left().isEmpty() ? "" : "stops binding: " + String.join(", ", c.left()));
                b.append(Text.wrap(where + ": " + what, "  - ", "    "));
            }
        }
        for (ScenarioResult s : result.scenarios()) {
            b.append("\nScenario ").append(s.scenario().name()).append(": ").append(s.scenario().summary()).append('\n');
            if (s.shocked().repaired()) {
                b.append(Text.wrap(String.format(java.util.Locale.ROOT, "The shocked correlation matrix was not "
                                + "positive semi-definite (smallest eigenvalue %s) and was repaired to the nearest valid "
                                + "one: distance %s, largest change of a correlation %s.",
                        Text.sci(s.shocked().smallestEigenvalue()), Text.sci(s.shocked().repairDistance()),
                        Text.fixed4(s.shocked().largestChange())), "  ", "  "));
            }
            b.append("  Highest achievable target: ").append(Text.pct(s.maxTarget())).append('\n');
            Text.Table u = new Text.Table("Target", "Min volatility", "Change", "Base proposal: risk", "return",
                    "Turnover to re-optimise");
            for (ScenarioPoint p : s.points()) {
                u.row(Text.pct(p.target()), p.feasible() ? Text.pct(p.volatility()) : "infeasible",
                        Double.isFinite(p.change()) ? Text.pct(p.change()) : "",
                        Double.isFinite(p.baseRisk()) ? Text.pct(p.baseRisk()) : "",
                        Double.isFinite(p.baseReturn()) ? Text.pct(p.baseReturn()) : "",
                        Double.isFinite(p.turnover()) ? Text.pct(p.turnover()) : "");
            }
            b.append(u.render("  "));
        }
        b.append(Sections.bullets("Notes:", notes()));
        b.append(Sections.bullets("Warnings:", warnings));
        b.append('\n').append(Text.caution());
        return b.toString();
    }

    @Override
    public String csv() {
        return CsvWriter.text(c -> {
            Sections.csvHeader(c, "stress", provenance, warnings);
            for (String n : notes()) {
                c.comment("note", n);
            }
            c.row("scenario", "target", "feasible", "min_volatility", "change_vs_base", "base_portfolio_volatility",
                    "base_portfolio_return", "turnover_to_reoptimise", "marginal_risk", "max_target", "binding");
            for (TargetPoint p : result.base().points()) {
                c.row("base", p.target(), p.feasible(), num(p.volatility()), null, num(p.volatility()),
                        p.feasible() ? p.solution().expectedReturn() : null, p.feasible() ? 0.0 : null,
                        num(p.marginalRisk()), num(result.base().maxTarget()), String.join("; ", p.binding()));
            }
            for (ScenarioResult s : result.scenarios()) {
                for (ScenarioPoint p : s.points()) {
                    c.row(s.scenario().name(), p.target(), p.feasible(), num(p.volatility()), num(p.change()),
                            num(p.baseRisk()), num(p.baseReturn()), num(p.turnover()), num(p.marginalRisk()),
                            num(s.maxTarget()), String.join("; ", p.binding()));
                }
            }
        });
    }

    private static Double num(double v) {
        return Double.isFinite(v) ? v : null;
    }
}

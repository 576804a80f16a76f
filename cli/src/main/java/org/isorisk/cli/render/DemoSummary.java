package org.isorisk.cli.render;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Set;
import org.isorisk.engine.explain.Explain;
import org.isorisk.engine.io.AtomicWrite;
import org.isorisk.engine.io.CsvWriter;
import org.isorisk.engine.io.LoadedUniverse;
import org.isorisk.engine.io.PortfolioFile;
import org.isorisk.engine.io.Provenance;
import org.isorisk.engine.model.Multiplier;
import org.isorisk.engine.risk.AssumptionSummary;
import org.isorisk.engine.risk.Contribution;
import org.isorisk.engine.risk.RiskDecomposition;
import org.isorisk.engine.risk.TrackingError;

/**
 * The demo's printed summary and its combined CSV tables.
 *
 * @param inputs     the universe as loaded
 * @param check      its summary
 * @param minVar     the minimum-variance portfolio
 * @param proposal   the target-return portfolio
 * @param tangency   the tangency portfolio
 * @param holdings   the current holdings
 * @param current    risk of the current holdings
 * @param te         tracking error of the proposal against the current holdings
 * @param provenance input files, holdings included
 * @param warnings   what reading found
 * @param folder     where the results were written
 * @param mandateMinVar the minimum-variance portfolio under the sample policy; null without a policy file
 * @param mandateTarget the target-return portfolio under the sample policy; null without a policy file
 * @param frontier      the frontier under the sample policy; null without a policy file
 * @param charts        the paragraph that describes the charts written, or null when none were
 */
public record DemoSummary(LoadedUniverse inputs, AssumptionSummary check, SolveView minVar, SolveView proposal,
                          SolveView tangency, PortfolioFile holdings, RiskDecomposition current, TrackingError te,
                          Provenance provenance, List<String> warnings, Path folder, SolveView mandateMinVar,
                          SolveView mandateTarget, FrontierView frontier, String charts) {

    /** The files the demo writes besides the copied inputs, in the order listed. */
    public static final List<String> FILES = List.of("summary.txt", "check.json", "minimum-variance.json",
            "target-return.json", "tangency.json", "risk-current.json", "risk-proposal.json", "weights.csv",
            "multipliers.csv", "risk.csv", "mandate-minimum-variance.json", "mandate-target-return.json",
            "frontier.json", "frontier.csv");

    /** The files written by this run: {@link #FILES}, without the mandate's when there was no policy file. */
    public List<String> written() {
        return mandateMinVar == null ? FILES.stream().filter(f -> !f.startsWith("mandate-") && !f.startsWith("frontier"))
                .toList() : FILES;
    }

    private List<SolveView> portfolios() {
        return List.of(minVar, proposal, tangency);
    }

    private static String shortName(SolveView v) {
        String t = v.title();
        return t.startsWith("Minimum-variance portfolio for") ? "Target return" : t.startsWith("Tangency")
                ? "Tangency" : "Minimum variance";
    }

    public String table() {
        StringBuilder b = new StringBuilder();
        b.append("isorisk demo\n");
        b.append(Sections.inputs(provenance));
        if (holdings.marketValue().isPresent()) {
            b.append("Fund size (current holdings): ").append(Text.money(holdings.marketValue().getAsDouble()))
                    .append(" currency units\n");
        }
        b.append("\n1. Check of the assumptions\n");
        b.append(Text.wrap(check.assets() + " assets; volatilities " + Text.pct(check.lowestVolatility().value())
                + " (" + check.lowestVolatility().asset() + ") to " + Text.pct(check.highestVolatility().value()) + " ("
                + check.highestVolatility().asset() + "); expected returns " + Text.pct(check.lowestReturn().value())
                + " (" + check.lowestReturn().asset() + ") to " + Text.pct(check.highestReturn().value()) + " ("
                + check.highestReturn().asset() + "); covariance positive definite, smallest eigenvalue "
                + Text.num(check.smallestEigenvalue()) + ", condition number " + Text.num(check.conditionNumber())
                + "; " + (inputs.warnings().isEmpty() ? "no warnings." : inputs.warnings().size() + " warning(s), "
                + "listed below."), "   ", "   "));

        b.append("\n2. Portfolios (only the budget applies: short positions, i.e. negative weights, are allowed)\n");
        Text.Table t = new Text.Table("Asset", "Current", "Minimum variance",
                "Target return " + Text.pct(((org.isorisk.engine.model.Objective.TargetReturn) proposal.objective())
                        .target()),
                "Tangency (rf " + Text.pct(((org.isorisk.engine.model.Objective.Tangency) tangency.objective())
                        .riskFree()) + ")");
        double[] hw = holdings.weights();
        for (int i = 0; i < hw.length; i++) {
            t.row(holdings.assets().get(i), Text.pct(hw[i]), Text.pct(minVar.solution().weight(i)),
                    Text.pct(proposal.solution().weight(i)), Text.pct(tangency.solution().weight(i)));
        }
        t.row("Expected return", Text.pct(current.expectedReturn()), Text.pct(minVar.solution().expectedReturn()),
                Text.pct(proposal.solution().expectedReturn()), Text.pct(tangency.solution().expectedReturn()));
        t.row("Volatility", Text.pct(current.volatility()), Text.pct(minVar.solution().volatility()),
                Text.pct(proposal.solution().volatility()), Text.pct(tangency.solution().volatility()));
        t.row("Sharpe ratio", "", "", "", Text.num(tangency.sharpe()));
        b.append(t.render("   "));

        b.append('\n').append(Text.wrap("3. What each constraint costs in risk (shadow prices: change of the optimal "
                + "variance per unit of the constraint's limit)", "", "   "));
        for (SolveView v : portfolios()) {
            b.append("   ").append(v.title()).append(":\n");
            for (Multiplier m : v.solution().multipliers()) {
                b.append(Text.wrap(m.constraint() + ": " + Text.num(m.variancePerUnit()) + " variance, "
                        + Text.num(m.volatilityPerUnit()) + " volatility per unit. " + Explain.sentence(m), "     - ",
                        "       "));
            }
            b.append(Text.wrap("Certificate: " + (v.solution().certificate().passes() ? "passes" : "DOES NOT PASS")
                    + " (largest KKT residual " + Text.sci(v.solution().certificate().worst()) + ", threshold "
                    + Text.sci(v.solution().certificate().threshold()) + ").", "     ", "     "));
        }

        b.append("\n4. Risk: current holdings and the target-return proposal\n");
        Text.Table r = new Text.Table("Asset", "Current: share of risk", "Proposal: share of risk",
                "Proposal: risk contribution");
        List<Contribution> cur = current.contributions();
        List<Contribution> pro = proposal.risk().contributions();
        for (int i = 0; i < cur.size(); i++) {
            r.row(cur.get(i).asset(), Text.pct(cur.get(i).share()), Text.pct(pro.get(i).share()),
                    Text.pct(pro.get(i).component()));
        }
        r.row("Volatility", Text.pct(current.volatility()), Text.pct(proposal.risk().volatility()), "");
        b.append(r.render("   "));
        b.append(Text.wrap("Tracking error of the proposal against the current holdings: " + Text.pct(te.value())
                + ". Each portfolio's risk contributions add up to its volatility (Euler check: differences "
                + Text.sci(current.eulerResidual()) + " and " + Text.sci(proposal.risk().eulerResidual()) + ").",
                "   ", "   "));

        if (mandateMinVar != null) {
            b.append('\n').append(mandate());
        }

        Set<String> notes = new LinkedHashSet<>();
        for (SolveView v : portfolios()) {
            notes.addAll(v.solution().notes());
        }
        if (mandateMinVar != null) {
            for (String n : mandateMinVar.solution().notes()) {
                notes.add("Under the mandate, minimum variance: " + n);
            }
            for (String n : mandateTarget.solution().notes()) {
                notes.add("Under the mandate, target return: " + n);
            }
            for (String n : frontier.notes()) {
                notes.add("Frontier under the mandate: " + n);
            }
        }
        b.append(Sections.bullets("Notes:", new ArrayList<>(notes)));
        b.append(Sections.bullets("Warnings:", warnings));
        b.append('\n').append(Text.wrap("Results written to " + folder + "/: " + String.join(", ", written())
                + ", and a copy of the inputs in inputs/.", "", ""));
        if (charts != null) {
            b.append('\n').append(Text.wrap(charts, "", ""));
        }
        b.append('\n').append(Text.caution());
        return b.toString();
    }

    /** Section 5: the two portfolios under the mandate, their binding constraints, and the frontier. */
    private String mandate() {
        String pol = mandateMinVar.policy();
        StringBuilder b = new StringBuilder(Text.wrap("5. Under the mandate of " + pol + " (bounds, asset-class "
                + "ranges and linear limits apply; method: " + mandateTarget.solution().method().label() + ")", "",
                "   "));
        double m = ((org.isorisk.engine.model.Objective.TargetReturn) mandateTarget.objective()).target();
        Text.Table t = new Text.Table("Asset", "Minimum variance", "Target return " + Text.pct(m),
                "Without the mandate: target return " + Text.pct(m));
        for (int i = 0; i < inputs.assets().size(); i++) {
            t.row(inputs.assets().get(i), Text.pct(mandateMinVar.solution().weight(i)),
                    Text.pct(mandateTarget.solution().weight(i)), Text.pct(proposal.solution().weight(i)));
        }
        t.row("Expected return", Text.pct(mandateMinVar.solution().expectedReturn()),
                Text.pct(mandateTarget.solution().expectedReturn()), Text.pct(proposal.solution().expectedReturn()));
        t.row("Volatility", Text.pct(mandateMinVar.solution().volatility()),
                Text.pct(mandateTarget.solution().volatility()), Text.pct(proposal.solution().volatility()));
        b.append(t.render("   "));
        for (SolveView v : List.of(mandateMinVar, mandateTarget)) {
            b.append("   ").append(v.title()).append(" under the mandate: binding constraints\n");
            int slack = 0;
            for (Multiplier x : v.solution().multipliers()) {
                if (!x.binding()) {
                    slack++;
                    continue;
                }
                b.append(Text.wrap(x.constraint() + ": " + Text.num(x.variancePerUnit()) + " variance, "
                        + Text.num(x.volatilityPerUnit()) + " volatility per unit. " + Explain.sentence(x), "     - ",
                        "       "));
            }
            b.append(Text.wrap(slack + " other limits do not bind (shadow price 0). Certificate: "
                    + (v.solution().certificate().passes() ? "passes" : "DOES NOT PASS") + " (largest KKT residual "
                    + Text.sci(v.solution().certificate().worst()) + ", threshold "
                    + Text.sci(v.solution().certificate().threshold()) + ").", "     ", "     "));
        }
        List<org.isorisk.engine.model.Solution> ps = frontier.frontier().points();
        b.append(Text.wrap("Frontier under the mandate (" + ps.size() + " points from the minimum-variance return to the "
                + "highest return the mandate allows; every point with its weights and binding constraints in "
                + "frontier.json and frontier.csv):", "   ", "   "));
        Text.Table f = new Text.Table("Return", "Volatility", "Without the mandate", "Return-target price (volatility)",
                "Binding limits");
        for (org.isorisk.engine.model.Solution p : ps) {
            double price = p.multiplier("target_return").map(Multiplier::volatilityPerUnit).orElse(0.0);
            f.row(Text.pct(p.expectedReturn()), Text.pct(p.volatility()),
                    Text.pct(frontier.unconstrainedVolatility(p.expectedReturn())), Text.num(price),
                    Integer.toString(FrontierView.binding(p).size()));
        }
        b.append(f.render("   "));
        return b.toString();
    }

    /** asset, current and the three portfolios' weights. */
    public String weightsCsv() {
        return AtomicWrite.text(w -> {
            CsvWriter c = new CsvWriter(w);
            Sections.csvHeader(c, "demo", provenance, warnings);
            c.row("asset", "current", "minimum_variance", "target_return", "tangency");
            double[] hw = holdings.weights();
            for (int i = 0; i < hw.length; i++) {
                c.row(holdings.assets().get(i), hw[i], minVar.solution().weight(i), proposal.solution().weight(i),
                        tangency.solution().weight(i));
            }
        });
    }

    /** Every portfolio's multipliers with their sentences. */
    public String multipliersCsv() {
        return AtomicWrite.text(w -> {
            CsvWriter c = new CsvWriter(w);
            Sections.csvHeader(c, "demo", provenance, warnings);
            c.row("portfolio", "constraint", "variance_per_unit", "volatility_per_unit", "binding", "sentence");
            for (SolveView v : portfolios()) {
                for (Multiplier m : v.solution().multipliers()) {
                    c.row(shortName(v), m.constraint(), m.variancePerUnit(), m.volatilityPerUnit(), m.binding(),
                            Explain.sentence(m));
                }
            }
        });
    }

    /** Risk contributions of the current holdings and of the three portfolios. */
    public String riskCsv() {
        return AtomicWrite.text(w -> {
            CsvWriter c = new CsvWriter(w);
            Sections.csvHeader(c, "demo", provenance, warnings);
            c.comment("tracking_error_proposal_vs_current", CsvWriter.number(te.value()));
            c.row("portfolio", "asset", "weight", "marginal", "component", "share");
            List<String> labels = List.of("Current", "Minimum variance", "Target return", "Tangency");
            List<RiskDecomposition> all = List.of(current, minVar.risk(), proposal.risk(), tangency.risk());
            for (int k = 0; k < all.size(); k++) {
                for (Contribution x : all.get(k).contributions()) {
                    c.row(labels.get(k), x.asset(), x.weight(), x.marginal(), x.component(), x.share());
                }
            }
        });
    }
}

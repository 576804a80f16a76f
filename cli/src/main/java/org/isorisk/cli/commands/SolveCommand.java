package org.isorisk.cli.commands;

import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.isorisk.cli.ExitCode;
import org.isorisk.cli.options.Decimal;
import org.isorisk.cli.options.Format;
import org.isorisk.cli.options.FormatOption;
import org.isorisk.cli.options.InputOptions;
import org.isorisk.cli.options.OutOption;
import org.isorisk.cli.render.SolveView;
import org.isorisk.engine.error.InputException;
import org.isorisk.engine.io.LoadedUniverse;
import org.isorisk.engine.io.Names;
import org.isorisk.engine.io.NumberText;
import org.isorisk.engine.model.AllocationRequest;
import org.isorisk.engine.model.Mandate;
import org.isorisk.engine.model.Objective;
import org.isorisk.engine.model.Solution;
import org.isorisk.engine.risk.RiskAnalysis;
import org.isorisk.engine.risk.RiskDecomposition;
import org.isorisk.engine.solve.Allocator;
import picocli.CommandLine;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;

/** {@code isorisk solve}: one portfolio (minimum variance, a target return, or tangency) with its shadow prices. */
@Command(name = "solve", mixinStandardHelpOptions = true, sortOptions = false,
        header = "Solve one portfolio: minimum variance, a target return, or tangency.",
        description = {"Solve for one portfolio: the minimum-variance portfolio, the minimum-variance portfolio for a "
                + "target return, or the tangency portfolio for a risk-free rate; with the shadow price of every "
                + "constraint, its KKT certificate and its risk decomposition.",
                "Without a policy only the budget (and a target or fixed weights) apply: short positions are allowed."})
public final class SolveCommand extends BaseCommand {

    @Mixin
    InputOptions inputs;

    @Option(names = "--target-return", paramLabel = "RETURN", converter = Decimal.class,
            description = "Expected return the portfolio must have (annualised, decimal unless --units percent).")
    Double target;

    @Option(names = "--risk-free", paramLabel = "RATE", converter = Decimal.class,
            description = "Risk-free rate: solve for the tangency portfolio (highest Sharpe ratio) instead.")
    Double riskFree;

    @Option(names = "--fix", paramLabel = "ASSET=WEIGHT",
            description = "Fix an asset's weight (repeatable), e.g. --fix Cash=0.02 --fix \"Government Bonds=0.25\".")
    Map<String, String> fixes = new LinkedHashMap<>();

    @Mixin
    FormatOption formatOption;

    @Mixin
    OutOption outOption;

    @Override
    protected Format format() {
        return formatOption == null ? Format.TABLE : formatOption.format();
    }

    @Override
    protected ExitCode execute() {
        if (target != null && riskFree != null) {
            throw new CommandLine.ParameterException(spec.commandLine(),
                    "give --target-return (minimum variance for that return) or --risk-free (tangency), not both");
        }
        LoadedUniverse u = inputs.load(true, "solve");
        List<String> warnings = new ArrayList<>(u.warnings());
        Objective objective = Objective.minimumVariance();
        if (target != null) {
            objective = Objective.targetReturn(rate("--target-return", target, warnings));
        } else if (riskFree != null) {
            objective = Objective.tangency(rate("--risk-free", riskFree, warnings));
        }
        Map<String, Double> fixed = new LinkedHashMap<>();
        Mandate mandate = mandate(u, fixed);
        emit(run(u, mandate, objective, fixed, warnings), outOption.out());
        return ExitCode.OK;
    }

    /** Solves one objective on a loaded universe and decomposes the result's risk; shared with the demo. */
    static SolveView run(LoadedUniverse u, Mandate mandate, Objective objective, Map<String, Double> fixed,
                         List<String> warnings) {
        long t0 = System.nanoTime();
        Solution s = Allocator.solve(AllocationRequest.of(u.universe(), mandate, objective));
        double solveMillis = (System.nanoTime() - t0) / 1e6;
        RiskDecomposition risk = RiskAnalysis.decompose(u.universe(), s.weights());
        double sharpe = objective instanceof Objective.Tangency t
                ? RiskAnalysis.sharpeRatio(s.expectedReturn(), s.volatility(), t.riskFree()) : Double.NaN;
        return new SolveView(s, risk, objective, sharpe, fixed, u, warnings, solveMillis);
    }

    private double rate(String option, double value, List<String> warnings) {
        double v = inputs.units().rate(value);
        if (Math.abs(v) > 1) {
            warnings.add(option + " " + value + " means " + org.isorisk.engine.explain.Explain.percent(v)
                    + " a year; if you meant percent, add --units percent");
        }
        return v;
    }

    /** The budget plus the fixed weights of {@code --fix}; fills {@code fixed} with the weights by asset name. */
    private Mandate mandate(LoadedUniverse u, Map<String, Double> fixed) {
        List<String> assets = u.assets();
        Mandate base = Mandate.fullyInvested(assets.size());
        Map<Integer, Double> byIndex = new LinkedHashMap<>();
        for (Map.Entry<String, String> e : fixes.entrySet()) {
            String name = e.getKey().strip();
            int i = assets.indexOf(name);
            if (i < 0) {
                throw Names.hint(InputException.of("--fix names an asset that is not in the expected-returns file")
                        .asset(name).value(e.getKey() + "=" + e.getValue()), name, assets,
                        "use one of the asset names: " + String.join(", ", assets)).build();
            }
            NumberText.Problem p = NumberText.problem(e.getValue());
            if (p != null) {
                throw InputException.of("--fix: " + p.problem()).asset(name).value(e.getValue()).fix(p.fix()).build();
            }
            double w = inputs.units().rate(NumberText.parse(e.getValue()));
            byIndex.put(i, w);
            fixed.put(name, w);
        }
        return new Mandate(base.budget(), base.lower(), base.upper(), byIndex, List.of(), List.of());
    }
}

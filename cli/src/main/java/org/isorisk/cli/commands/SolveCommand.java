package org.isorisk.cli.commands;

import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.OptionalDouble;
import org.isorisk.cli.options.Decimal;
import org.isorisk.cli.options.InputOptions;
import org.isorisk.cli.options.OutputOptions;
import org.isorisk.cli.options.PolicyOption;
import org.isorisk.cli.render.SolveView;
import org.isorisk.engine.error.InputException;
import org.isorisk.engine.explain.Explain;
import org.isorisk.engine.io.LoadedUniverse;
import org.isorisk.engine.io.Names;
import org.isorisk.engine.io.NumberText;
import org.isorisk.engine.model.AllocationRequest;
import org.isorisk.engine.model.Branch;
import org.isorisk.engine.model.Mandate;
import org.isorisk.engine.model.Method;
import org.isorisk.engine.model.Objective;
import org.isorisk.engine.model.Policy;
import org.isorisk.engine.model.Solution;
import org.isorisk.engine.risk.RiskAnalysis;
import org.isorisk.engine.risk.RiskDecomposition;
import org.isorisk.engine.solve.Allocator;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine;

/** {@code isorisk solve}: one portfolio (minimum variance, a target return, or tangency) with its shadow prices. */
@Command(name = "solve", mixinStandardHelpOptions = true, sortOptions = false,
        header = "Solve one portfolio: minimum variance, a target return, or tangency.",
        description = {"Solve for one portfolio: the minimum-variance portfolio, the minimum-variance portfolio for a "
                + "target return, or the tangency portfolio for a risk-free rate; with the shadow price of every "
                + "constraint, its KKT certificate and its risk decomposition.",
                "With --policy the mandate's bounds, groups, fixed weights and linear constraints apply, and its "
                        + "target_return is used when --target-return is not given; without a policy only the budget "
                        + "(and a target or fixed weights) apply: short positions are allowed.",
                "The method is picked automatically (closed form when only equalities apply, critical line when "
                        + "only bounds apply, numerical QP otherwise) and reported; --method forces one."})
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
    PolicyOption policyOption;

    @Option(names = "--method", paramLabel = "METHOD", converter = MethodConverter.class, defaultValue = "auto",
            completionCandidates = MethodNames.class,
            description = "Solution method: ${COMPLETION-CANDIDATES} (default: ${DEFAULT-VALUE}).")
    Method method = Method.AUTO;

    @Mixin
    OutputOptions output;

    @Override
    protected ExitCode execute() {
        if (target != null && riskFree != null) {
            throw new CommandLine.ParameterException(spec.commandLine(),
                    "give --target-return (minimum variance for that return) or --risk-free (tangency), not both");
        }
        PolicyOption.Loaded loaded = policyOption.load(inputs);
        LoadedUniverse u = loaded.inputs();
        List<String> warnings = new ArrayList<>(u.warnings());
        List<String> notes = new ArrayList<>();
        Objective objective = Objective.minimumVariance();
        OptionalDouble policyTarget = loaded.policy().map(Policy::targetReturn)
                .orElse(OptionalDouble.empty());
        if (target != null) {
            double m = rate("--target-return", target, warnings);
            objective = Objective.targetReturn(m);
            if (policyTarget.isPresent()) {
                notes.add("The return target " + Explain.percent(m) + " comes from --target-return; it overrides "
                        + "the policy's target_return "
                        + Explain.percent(policyTarget.getAsDouble()) + " (" + loaded.name() + ").");
            }
        } else if (riskFree != null) {
            objective = Objective.tangency(rate("--risk-free", riskFree, warnings));
            if (policyTarget.isPresent()) {
                notes.add("The policy's target_return " + Explain.percent(policyTarget.getAsDouble()) + " ("
                        + loaded.name() + ") is not used: --risk-free asks for the tangency portfolio.");
            }
        } else if (policyTarget.isPresent()) {
            objective = Objective.targetReturn(policyTarget.getAsDouble());
            notes.add("The return target " + Explain.percent(policyTarget.getAsDouble()) + " comes from the policy's "
                    + "target_return (" + loaded.name() + "); give --target-return to use another.");
        }
        Map<String, Double> fixed = new LinkedHashMap<>();
        Mandate mandate = loaded.mandate(fixes(u, fixed));
        emit(run(u, mandate, objective, method, fixed, loaded.name(), notes, warnings), output.out());
        return ExitCode.OK;
    }

    /** Solves one objective on a loaded universe and decomposes the result's risk; shared with the demo. */
    static SolveView run(LoadedUniverse u, Mandate mandate, Objective objective, Map<String, Double> fixed,
                         List<String> warnings) {
        return run(u, mandate, objective, Method.AUTO, fixed, null, List.of(), warnings);
    }

    /**
     * Solves one objective by {@code method} and decomposes the result's risk.
     *
     * @param policy file name of the policy the mandate comes from, null without one
     * @param notes  the command's own notes, added after the solver's
     */
    static SolveView run(LoadedUniverse u, Mandate mandate, Objective objective, Method method,
                         Map<String, Double> fixed, String policy, List<String> notes, List<String> warnings) {
        long t0 = System.nanoTime();
        // a target below the minimum-variance return says it is on the inefficient branch, whatever the method
        Solution s = Branch.annotated(Allocator.solve(new AllocationRequest(u.universe(), mandate, objective, method,
                null)));
        double solveMillis = (System.nanoTime() - t0) / 1e6;
        if (!notes.isEmpty()) {
            s = s.withNotes(notes);
        }
        RiskDecomposition risk = RiskAnalysis.decompose(u.universe(), s.weights());
        double sharpe = objective instanceof Objective.Tangency t
                ? RiskAnalysis.sharpeRatio(s.expectedReturn(), s.volatility(), t.riskFree()) : Double.NaN;
        return new SolveView(s, risk, objective, sharpe, fixed, policy, u, warnings, solveMillis);
    }

    private double rate(String option, double value, List<String> warnings) {
        double v = inputs.units().rate(value);
        if (Math.abs(v) > 1) {
            warnings.add(option + " " + value + " means " + Explain.percent(v)
                    + " a year; if you meant percent, add --units percent");
        }
        return v;
    }

    /** The fixed weights of {@code --fix} by asset index; fills {@code fixed} with the weights by asset name. */
    private Map<Integer, Double> fixes(LoadedUniverse u, Map<String, Double> fixed) {
        List<String> assets = u.assets();
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
        return byIndex;
    }

    /** Reads {@code auto}, {@code closed-form}, {@code critical-line} or {@code numerical}, ignoring case. */
    public static final class MethodConverter implements CommandLine.ITypeConverter<Method> {
        @Override
        public Method convert(String value) {
            Method m = Method.fromLabel(value.strip());
            if (m == null) {
                throw new CommandLine.TypeConversionException("'" + value
                        + "' is not a method; use auto, closed-form, critical-line or numerical");
            }
            return m;
        }
    }

    /** The method names shown in help. */
    public static final class MethodNames implements Iterable<String> {
        @Override
        public java.util.Iterator<String> iterator() {
            return java.util.Arrays.stream(Method.values()).map(Method::label).iterator();
        }
    }
}

package org.isorisk.cli.commands;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.OptionalDouble;
import java.util.Set;
import java.util.TreeSet;
import org.isorisk.cli.options.Decimal;
import org.isorisk.cli.options.InputOptions;
import org.isorisk.cli.options.OutputOptions;
import org.isorisk.cli.options.PolicyOption;
import org.isorisk.cli.render.RebalanceView;
import org.isorisk.cli.usecase.FundSize;
import org.isorisk.engine.error.InputException;
import org.isorisk.engine.io.LoadedUniverse;
import org.isorisk.engine.io.PortfolioFile;
import org.isorisk.engine.io.PortfolioReader;
import org.isorisk.engine.io.Provenance;
import org.isorisk.engine.model.Policy;
import org.isorisk.engine.rebalance.Holdings;
import org.isorisk.engine.rebalance.RebalanceObjective;
import org.isorisk.engine.rebalance.RebalanceRequest;
import org.isorisk.engine.rebalance.RebalanceResult;
import org.isorisk.engine.rebalance.Rebalancer;
import org.isorisk.engine.rebalance.TradingLimits;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine;

/** {@code isorisk rebalance}: today's holdings to a proposal under the policy and the trading limits. */
@Command(name = "rebalance", mixinStandardHelpOptions = true, sortOptions = false,
        header = "Move today's holdings to a proposal within the policy and the trading limits; the trade list.",
        description = {"Move today's holdings to a proposal that obeys the policy and the trading limits: the trade "
                + "list, turnover (two-way: buys plus sells), estimated costs, return and risk before and after, "
                + "tracking error against today, and the shadow price of the turnover limit and of every other "
                + "binding limit. Limits today's holdings break are reported first, with the trades that cure them.",
                "Costs are deducted from the return the target must reach (expected return minus costs >= target)."})
public final class RebalanceCommand extends BaseCommand {

    @Mixin
    InputOptions inputs;

    @Mixin
    PolicyOption policyOption;

    @Option(names = "--holdings", paramLabel = "FILE", required = true,
            description = "Today's portfolio: CSV asset,weight or asset,market_value; cash is an asset (give the "
                    + "cash balance as a row).")
    Path holdings;

    @Option(names = "--fund-size", paramLabel = "AMOUNT", converter = Decimal.class,
            description = "Fund size in the fund's currency: turns trade weights into amounts (with market values it "
                    + "must equal their total).")
    Double fundSize;

    @Option(names = "--objective", paramLabel = "KIND", defaultValue = "target",
            description = "target (minimum risk for --target-return after costs), same-risk (highest return after "
                    + "costs at today's volatility) or nearest (the efficient portfolio with the smallest tracking "
                    + "error against today). Default: ${DEFAULT-VALUE}.")
    String objective;

    @Option(names = "--target-return", paramLabel = "RETURN", converter = Decimal.class,
            description = "Expected return after costs the proposal must reach (default: the policy's target_return).")
    Double target;

    @Option(names = "--max-turnover", paramLabel = "T", converter = Decimal.class,
            description = "Largest two-way turnover sum |target - current| (overrides the policy's turnover.max).")
    Double maxTurnover;

    @Option(names = "--max-trade", paramLabel = "ASSET=WEIGHT",
            description = "Largest trade in one asset (repeatable; overrides the policy's trading.max_trade); ASSET "
                    + "'all' sets every asset.")
    Map<String, String> maxTrade = new LinkedHashMap<>();

    @Option(names = "--min-trade", paramLabel = "WEIGHT", converter = Decimal.class,
            description = "Smallest trade kept: smaller trades are dropped, the asset frozen at today's weight and the "
                    + "problem solved again (default: the policy's trading.min_trade, else 0: keep every trade).")
    Double minTrade;

    @Option(names = "--no-trade", paramLabel = "ASSET",
            description = "An asset that must not be traded (repeatable; added to the policy's trading.no_trade).")
    List<String> noTrade = new ArrayList<>();

    @Mixin
    OutputOptions output;

    @Override
    protected ExitCode execute() {
        PolicyOption.Loaded pl = policyOption.load(inputs);
        LoadedUniverse u = pl.inputs();
        List<String> assets = u.assets();
        List<String> warnings = new ArrayList<>(u.warnings());
        Policy p = pl.policyOrBudget();
        PortfolioFile held = PortfolioReader.read(holdings, "holdings", assets, inputs.units());
        warnings.addAll(held.warnings());
        double size = FundSize.resolve(held, holdings, fundSize == null ? OptionalDouble.empty()
                : OptionalDouble.of(fundSize), "--fund-size", "drop --fund-size").orElse(Double.NaN);
        Holdings today;
        try {
            today = Holdings.ofWeights(assets, held.weights(), size);
            today.alignedTo(u.universe(), p.mandate().budget()); // the engine's check, made here to name the file
        } catch (InputException e) {
            throw inFile(e, holdings); // e.g. weights that do not add up to the budget
        }
        RebalanceRequest req = new RebalanceRequest(u.universe(), p.mandate(), today, limits(p, assets), objective(p),
                null);
        long t0 = System.nanoTime();
        RebalanceResult r = Rebalancer.rebalance(req);
        double millis = (System.nanoTime() - t0) / 1e6;
        Provenance prov = u.provenance().withInput(held.source());
        emit(new RebalanceView(r, prov, warnings, millis), output.out());
        return ExitCode.OK;
    }

    /** {@code e} with {@code file} as its file when it names none (a check made on values read from the file). */
    static InputException inFile(InputException e, Path file) {
        if (e.file().isPresent()) {
            return e;
        }
        InputException.Builder b = InputException.of(e.problem()).file(file.toString());
        e.row().ifPresent(b::row);
        e.line().ifPresent(b::line);
        e.key().ifPresent(b::key);
        e.column().ifPresent(b::column);
        e.asset().ifPresent(b::asset);
        e.value().ifPresent(b::value);
        e.fix().ifPresent(b::fix);
        return b.build();
    }

    private RebalanceObjective objective(Policy p) {
        switch (objective.strip().toLowerCase(Locale.ROOT)) {
            case "target" -> {
                double m;
                if (target != null) {
                    m = inputs.units().rate(target);
                } else if (p.targetReturn().isPresent()) {
                    m = p.targetReturn().getAsDouble();
                } else {
                    throw InputException.of("--objective target needs a return target")
                            .fix("give --target-return (e.g. 0.05), set target_return in the policy, or use "
                                    + "--objective same-risk or nearest").build();
                }
                return new RebalanceObjective.TargetReturn(m);
            }
            case "same-risk" -> {
                return new RebalanceObjective.SameRisk();
            }
            case "nearest" -> {
                return new RebalanceObjective.Nearest();
            }
            default -> throw new CommandLine.ParameterException(spec.commandLine(), "--objective '" + objective
                    + "' is not known; use target, same-risk or nearest");
        }
    }

    /** The policy's trading limits ({@link TradingLimits#of}), with the command line's options applied. */
    private TradingLimits limits(Policy p, List<String> assets) {
        TradingLimits base = TradingLimits.of(p);
        int n = assets.size();
        double tau = maxTurnover != null ? inputs.units().rate(maxTurnover) : base.maxTurnover();
        double[] trade = base.maxTrade();
        double[] given = TradingOptions.perAsset("--max-trade", maxTrade, assets, Double.NaN);
        for (int i = 0; i < n; i++) {
            if (!Double.isNaN(given[i])) {
                trade[i] = inputs.units().rate(given[i]);
            }
        }
        Set<Integer> frozen = new TreeSet<>(base.noTrade());
        for (String a : noTrade) {
            frozen.add(TradingOptions.asset("--no-trade", a, assets));
        }
        double min = minTrade == null ? base.minTrade() : inputs.units().rate(minTrade);
        return new TradingLimits(tau, trade, base.costBps(), min, frozen);
    }
}

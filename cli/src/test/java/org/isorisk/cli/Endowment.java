package org.isorisk.cli;

import java.nio.file.Path;
import java.util.List;
import java.util.Optional;
import org.isorisk.cli.options.PolicyOption;
import org.isorisk.engine.io.LoadedUniverse;
import org.isorisk.engine.io.PortfolioReader;
import org.isorisk.engine.io.ScenarioFile;
import org.isorisk.engine.io.UniverseFiles;
import org.isorisk.engine.io.UniverseLoader;
import org.isorisk.engine.io.Units;
import org.isorisk.engine.model.AssetUniverse;
import org.isorisk.engine.model.Mandate;
import org.isorisk.engine.model.Policy;
import org.isorisk.engine.rebalance.TradingLimits;
import org.isorisk.engine.stress.Scenario;

/**
 * The invented Wrenfield University Endowment (test resources, folder {@code usecase/endowment}, with a README that
 * says it is invented): 25 asset classes in groups for equity, credit, real assets, privates and cash, holdings with a
 * 10 % cash holding that break two limits of the policy, five scenarios and a pack file. Read through the same readers
 * the command line uses.
 *
 * @param universe  the assets and assumptions
 * @param mandate   the policy's mandate
 * @param policy    the policy (with its trading limits)
 * @param holdings  today's weights in the universe's order
 * @param scenarios the stress scenarios
 */
public record Endowment(AssetUniverse universe, Mandate mandate, Policy policy, double[] holdings,
                        List<Scenario> scenarios) {

    /** The folder (tests run in the {@code cli} folder). */
    public static final Path DIR = Path.of("src", "test", "resources", "org", "isorisk", "cli", "usecase", "endowment");

    /** A file of the folder, e.g. {@code pack.yaml}. */
    public static Path file(String name) {
        return DIR.resolve(name);
    }

    /** Reads the endowment. */
    public static Endowment read() {
        LoadedUniverse u = UniverseLoader.load(UniverseFiles.of(file("expected_returns.csv"), file("covariance.csv")));
        PolicyOption.Loaded p = PolicyOption.of(file("policy.yaml")).load(u);
        double[] held = PortfolioReader.read(file("holdings.csv"), "holdings", u.assets(), Units.DECIMAL).weights();
        List<Scenario> sc = ScenarioFile.read(file("scenarios.yaml"), u.assets(), p.groups(), null);
        return new Endowment(u.universe(), p.mandate(), p.policy().orElseThrow(), held, sc);
    }

    /** The policy's trading limits, as {@code pack} and {@code rebalance} take them. */
    public TradingLimits trading() {
        return TradingLimits.of(policy);
    }

    @Override
    public double[] holdings() {
        return holdings.clone();
    }

    /** The holdings as the pack's request takes them. */
    public Optional<double[]> held() {
        return Optional.of(holdings());
    }
}

package org.isorisk.engine;

import java.nio.file.Path;
import java.util.List;
import org.isorisk.engine.io.UniverseFiles;
import org.isorisk.engine.io.UniverseLoader;
import org.isorisk.engine.model.AssetUniverse;

/**
 * The invented sample fund of {@code sample-data/} (fictional, illustrative assumptions, not market data), loaded
 * through the project's own reader, for tests that need it with the sample policy.
 */
public final class SampleFund {
    private SampleFund() {
    }

    /** The sample data folder, relative to a module's working directory. */
    public static final Path DATA = Path.of("..", "sample-data");

    /** The twelve asset classes, in the order of the sample files. */
    public static final List<String> ASSETS = List.of("Cash", "Government Bonds", "Inflation-Linked Bonds",
            "Investment-Grade Credit", "High Yield", "Emerging Market Debt", "Domestic Equity",
            "Foreign Developed Equity", "Emerging Equity", "Listed Real Estate", "Infrastructure", "Commodities");

    public static AssetUniverse universe() {
        AssetUniverse u = UniverseLoader.load(UniverseFiles.of(DATA.resolve("expected_returns.csv"),
                DATA.resolve("covariance.csv"))).universe();
        if (!u.assets().equals(ASSETS)) {
            throw new IllegalStateException("sample data assets changed: " + u.assets());
        }
        return u;
    }
}

package org.isorisk.engine.io;

import java.util.List;
import java.util.OptionalDouble;

/**
 * A portfolio read from a weights or holdings file, aligned to an asset universe.
 *
 * @param assets      the universe's asset names, in the order of {@code weights}
 * @param weights     decimal weights, one per universe asset (0 for assets the file does not list); copied
 * @param marketValue total market value in the fund's currency when the file gave market values; empty for weights
 * @param source      the file
 * @param warnings    things worth a look (unlisted assets, weights not summing to 1, values that look like percent)
 */
public record PortfolioFile(List<String> assets, double[] weights, OptionalDouble marketValue, SourceFile source,
                            List<String> warnings) {
    public PortfolioFile {
        assets = List.copyOf(assets);
        weights = weights.clone();
        warnings = List.copyOf(warnings);
        if (weights.length != assets.size()) {
            throw new IllegalArgumentException("one weight per asset");
        }
    }

    @Override
    public double[] weights() {
        return weights.clone();
    }
}

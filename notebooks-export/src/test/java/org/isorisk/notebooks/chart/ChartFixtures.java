package org.isorisk.notebooks.chart;

import java.nio.file.Path;
import java.time.LocalDate;
import java.util.ArrayList;
import java.util.List;
import java.util.Random;
import org.isorisk.engine.frontier.Frontiers;
import org.isorisk.engine.frontier.Grid;
import org.isorisk.engine.io.PolicyReader;
import org.isorisk.engine.io.PortfolioReader;
import org.isorisk.engine.io.Units;
import org.isorisk.engine.io.UniverseFiles;
import org.isorisk.engine.io.UniverseLoader;
import org.isorisk.engine.model.AllocationRequest;
import org.isorisk.engine.model.AssetUniverse;
import org.isorisk.engine.model.Frontier;
import org.isorisk.engine.model.Mandate;
import org.isorisk.engine.model.MertonScalars;
import org.isorisk.engine.model.Objective;
import org.isorisk.engine.model.Solution;
import org.isorisk.engine.solve.Allocator;
import org.isorisk.engine.solve.Factored;
import org.isorisk.engine.synthetic.FactorModels;

/**
 * Inputs for the chart tests, all from the engine: the invented sample fund of {@code sample-data/} (fictional,
 * illustrative numbers), its policy's bounds, frontiers from {@link Frontiers}, and larger invented universes.
 */
final class ChartFixtures {
    private ChartFixtures() {
    }

    /** The repository's sample data (tests run in the {@code engine} folder). */
    static final Path DATA = Path.of("..", "sample-data");

    static final List<String> SAMPLE_ASSETS = List.of("Cash", "Government Bonds", "Inflation-Linked Bonds",
            "Investment-Grade Credit", "High Yield", "Emerging Market Debt", "Domestic Equity",
            "Foreign Developed Equity", "Emerging Equity", "Listed Real Estate", "Infrastructure", "Commodities");

    private static AssetUniverse sampleFund;
    private static Frontier sampleFrontier;

    /** The invented sample fund (12 asset classes). */
    static synchronized AssetUniverse sampleFund() {
        if (sampleFund == null) {
            sampleFund = UniverseLoader.load(UniverseFiles.of(DATA.resolve("expected_returns.csv"),
                    DATA.resolve("covariance.csv"))).universe();
        }
        return sampleFund;
    }

    /** The sample policy in full: bounds, groups and a general limit. */
    static Mandate samplePolicy() {
        return PolicyReader.read(DATA.resolve("policy.yaml"), sampleFund().assets()).mandate();
    }

    /** The sample policy's per-asset bounds alone, where the critical line method traces every corner. */
    static Mandate sampleBounds() {
        Mandate p = samplePolicy();
        return new Mandate(p.budget(), p.lower(), p.upper(), p.fixed(), List.of(), List.of());
    }

    /** The exact frontier of the sample fund under its policy's bounds, with 16 sampled points. */
    static synchronized Frontier sampleFrontier() {
        if (sampleFrontier == null) {
            sampleFrontier = Frontiers.mandate(sampleFund(), sampleBounds(), Grid.points(16), null);
        }
        return sampleFrontier;
    }

    /** The sample fund's current holdings as weights. */
    static double[] sampleCurrent() {
        return PortfolioReader.read(DATA.resolve("holdings.csv"), "holdings", sampleFund().assets(), Units.DECIMAL)
                .weights();
    }

    /** An invented universe of {@code n} assets from a four-factor model with a fixed seed. */
    static AssetUniverse large(int n, long seed) {
        Random r = new Random(seed);
        List<String> names = new ArrayList<>();
        double[] mu = new double[n];
        double[] vol = new double[n];
        double[][] l = new double[n][4];
        for (int i = 0; i < n; i++) {
            names.add(String.format(java.util.Locale.ROOT, "Asset %03d", i + 1));
            vol[i] = 0.04 + 0.22 * r.nextDouble();
            mu[i] = 0.015 + 0.3 * vol[i] + 0.01 * r.nextGaussian();
            double norm = 0;
            for (int f = 0; f < 4; f++) {
                l[i][f] = 0.3 * r.nextGaussian();
                norm += l[i][f] * l[i][f];
            }
            if (norm > 0.8) {
                for (int f = 0; f < 4; f++) {
                    l[i][f] *= Math.sqrt(0.8 / norm);
                }
            }
        }
        // correlations from the loadings, the rest of each variance the asset's own: positive definite
        double[][] s = new double[n][n];
        for (int i = 0; i < n; i++) {
            for (int j = 0; j < n; j++) {
                double c = 0;
                for (int f = 0; f < 4; f++) {
                    c += l[i][f] * l[j][f];
                }
                s[i][j] = (i == j ? 1.0 : c) * vol[i] * vol[j];
            }
        }
        return new AssetUniverse(names, mu, s);
    }

    /** The exact frontier of {@code u} when every weight lies in [0, {@code max}]. */
    static Frontier boxedFrontier(AssetUniverse u, double max, int points) {
        return Frontiers.mandate(u, FactorModels.boxed(u.size(), 0.0, max), Grid.points(points), null);
    }

    static ChartContext context() {
        return new ChartContext(LocalDate.of(2025, 6, 30), "3f9a0c1d7e5b2a4c6d8e", "Example Pension Fund (invented)");
    }

    /** Only the budget: the closed-form frontier at {@code points} targets from {@code lo} to {@code hi}. */
    static Frontier closedFormFrontier(AssetUniverse u, int points, double lo, double hi) {
        Factored f = Factored.of(u);
        MertonScalars ms = Allocator.merton(f, 1.0);
        Mandate m = Mandate.fullyInvested(u.size());
        List<Solution> sols = new ArrayList<>();
        for (int i = 0; i < points; i++) {
            double t = lo + (hi - lo) * i / Math.max(1, points - 1);
            sols.add(Allocator.closedForm(f, m, Objective.targetReturn(t),
                    AllocationRequest.of(u, m, Objective.targetReturn(t))));
        }
        return new Frontier(List.of(), sols, ms, ms.minimumVarianceReturn(), Double.POSITIVE_INFINITY);
    }

    /** Euler shares of volatility {@code w_i (Σw)_i / (w'Σw)} (test-side arithmetic, from the definition). */
    static RiskShares shares(String name, AssetUniverse u, double[] w) {
        int n = u.size();
        double[] sw = new double[n];
        double v = 0;
        for (int i = 0; i < n; i++) {
            for (int j = 0; j < n; j++) {
                sw[i] += u.covariance(i, j) * w[j];
            }
            v += w[i] * sw[i];
        }
        double[] sh = new double[n];
        for (int i = 0; i < n; i++) {
            sh[i] = w[i] * sw[i] / v;
        }
        return new RiskShares(name, u.assets(), sh);
    }

    /** The point of weights {@code w}: (sqrt(w'Σw), μ'w). */
    static PortfolioPoint point(String name, AssetUniverse u, double[] w) {
        int n = u.size();
        double v = 0;
        double m = 0;
        for (int i = 0; i < n; i++) {
            m += u.expectedReturn(i) * w[i];
            for (int j = 0; j < n; j++) {
                v += w[i] * u.covariance(i, j) * w[j];
            }
        }
        return new PortfolioPoint(name, Math.sqrt(v), m);
    }
}

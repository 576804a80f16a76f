package org.isorisk.notebooks.chart;

import java.io.IOException;
import java.io.OutputStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import org.isorisk.engine.frontier.Frontiers;
import org.isorisk.engine.frontier.Grid;
import org.isorisk.engine.model.AllocationRequest;
import org.isorisk.engine.model.AssetUniverse;
import org.isorisk.engine.model.Frontier;
import org.isorisk.engine.model.Mandate;
import org.isorisk.engine.model.Objective;
import org.isorisk.engine.model.Solution;
import org.isorisk.engine.solve.Allocator;

/**
 * Writes every chart for the sample fund (12 assets) and for 200 invented assets into a folder, to look at them:
 * {@code java -cp ... org.isorisk.notebooks.chart.ChartGallery OUT_DIR}. Not a test.
 */
public final class ChartGallery {
    private ChartGallery() {
    }

    public static void main(String[] args) throws IOException {
        Path out = Path.of(args.length > 0 ? args[0] : "chart-gallery");
        Files.createDirectories(out);
        ChartSettings s = ChartSettings.defaults();
        ChartContext ctx = ChartFixtures.context();

        AssetUniverse u = ChartFixtures.sampleFund();
        Frontier bounds = Frontiers.mandate(u, ChartFixtures.sampleBounds(), Grid.points(60), null);
        write(out, "sample", u, ChartFixtures.sampleBounds(), bounds, ctx, s, ChartFixtures.sampleCurrent());
        Frontier policy = Frontiers.sampled(u, ChartFixtures.samplePolicy(), Grid.points(60), null);
        write(out, "policy", u, ChartFixtures.samplePolicy(), policy, ctx, s, ChartFixtures.sampleCurrent());
        if (args.length > 1 && args[1].equals("sample")) {
            return;
        }
        AssetUniverse big = ChartFixtures.large(200, 7);
        Frontier fb = ChartFixtures.boxedFrontier(big, 0.05, 60);
        double[] cur = new double[200];
        Arrays.fill(cur, 1.0 / 200);
        write(out, "n200", big, org.isorisk.engine.synthetic.FactorModels.boxed(200, 0.0, 0.05), fb, ctx, s, cur);
    }

    static void write(Path out, String tag, AssetUniverse u, Mandate mandate, Frontier f, ChartContext ctx,
                      ChartSettings s, double[] current) throws IOException {
        AssetColours colours = AssetColours.of(u.assets());
        double target = f.minReturn() + 0.55 * (f.maxReturn() - f.minReturn());
        Solution proposed = nearest(f, target);
        Solution tangency = Allocator.solve(AllocationRequest.of(u, mandate, Objective.tangency(0.024)));
        FrontierChartData d = FrontierChartData.of(u, f).withTangency(0.024, tangency)
                .withCurrent(ChartFixtures.point("Current", u, current))
                .withProposed(PortfolioPoint.of("Proposed", proposed));
        List<Figure> figs = new ArrayList<>();
        figs.add(Charts.frontier(d, ctx, colours, s));
        figs.add(Charts.weights(f, ctx, colours, s));
        figs.add(Charts.marginalRisk(f, ctx, s));
        figs.add(Charts.riskContributions(ChartFixtures.shares("Current", u, current),
                ChartFixtures.shares("Proposed", u, proposed.weights()), ctx, colours, s));
        AssetUniverse shocked = u.withAssumptions(scale(u.expectedReturns(), 0.8), scaleCov(u.covariance(), 1.3));
        figs.add(Charts.stressOverlay(List.of(new NamedFrontier("Base", f),
                new NamedFrontier("Returns 20 % lower, variances 30 % higher", u.size() == 12 && f.corners().isEmpty()
                        ? Frontiers.sampled(shocked, ChartFixtures.samplePolicy(), Grid.points(30), null)
                        : u.size() == 12 ? Frontiers.mandate(shocked, ChartFixtures.sampleBounds(), Grid.points(30), null)
                        : ChartFixtures.boxedFrontier(shocked, 0.05, 30))), ctx, s));
        for (Figure fig : figs) {
            for (ChartFormat fmt : ChartFormat.values()) {
                Path p = out.resolve(tag + "-" + fig.kind().label() + "." + fmt.extension());
                try (OutputStream os = Files.newOutputStream(p)) {
                    Charts.write(fig, fmt, s, os);
                }
            }
            System.out.println(tag + " " + fig.kind().label() + ": " + fig.notices());
        }
    }

    private static Solution nearest(Frontier f, double target) {
        Solution best = f.points().get(0);
        for (Solution p : f.points()) {
            if (Math.abs(p.expectedReturn() - target) < Math.abs(best.expectedReturn() - target)) {
                best = p;
            }
        }
        return best;
    }

    private static double[] scale(double[] a, double k) {
        double[] r = a.clone();
        for (int i = 0; i < r.length; i++) {
            r[i] *= k;
        }
        return r;
    }

    private static double[][] scaleCov(double[][] a, double k) {
        double[][] r = new double[a.length][];
        for (int i = 0; i < a.length; i++) {
            r[i] = scale(a[i], k);
        }
        return r;
    }
}

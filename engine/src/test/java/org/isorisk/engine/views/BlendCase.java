package org.isorisk.engine.views;

import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.isorisk.engine.random.Xoshiro256PlusPlus;

/**
 * Generated blend problems for tests (invented numbers): a one-factor covariance of 3 to 10 assets, an implied or
 * a given prior, and 1 to 4 views of every kind (absolute, relative, group-weighted) with confidences (full ones
 * included), variances or the default.
 */
record BlendCase(Prior prior, List<View> views, double tau) {

    static BlendCase random(Xoshiro256PlusPlus g, int trial) {
        int n = 3 + g.nextInt(8);
        List<String> assets = new ArrayList<>();
        double[] beta = new double[n];
        double[] idio = new double[n];
        double[] w = new double[n];
        double total = 0;
        for (int i = 0; i < n; i++) {
            assets.add("Asset " + (char) ('A' + i));
            beta[i] = 0.3 + 1.2 * g.nextDouble();
            idio[i] = 0.05 + 0.2 * g.nextDouble();
            w[i] = 0.05 + g.nextDouble();
            total += w[i];
        }
        double[][] sigma = new double[n][n];
        for (int i = 0; i < n; i++) {
            w[i] /= total;
            for (int j = 0; j < n; j++) {
                sigma[i][j] = 0.16 * 0.16 * beta[i] * beta[j] + (i == j ? idio[i] * idio[i] : 0);
            }
        }
        double delta = 1 + 3 * g.nextDouble();
        double rf = 0.03 * g.nextDouble();
        Prior prior;
        if (trial % 3 == 2) {
            double[] mu = new double[n];
            for (int i = 0; i < n; i++) {
                mu[i] = rf + 0.02 + 0.06 * g.nextDouble();
            }
            prior = Prior.given(assets, sigma, mu, rf, delta);
        } else {
            prior = Prior.implied(assets, sigma, w, delta, rf);
        }
        int k = 1 + g.nextInt(Math.min(4, n - 1));
        List<View> views = new ArrayList<>();
        for (int v = 0; v < k; v++) {
            String name = "view " + (v + 1);
            int a = g.nextInt(n);
            int b = (a + 1 + g.nextInt(n - 1)) % n;
            View view;
            switch (g.nextInt(3)) {
                case 0 -> view = View.absolute(name, assets.get(a), 0.02 + 0.08 * g.nextDouble());
                case 1 -> view = View.relative(name, assets.get(a), assets.get(b), 0.04 * g.nextDouble() - 0.01);
                default -> {
                    Map<String, Double> caps = new LinkedHashMap<>();
                    for (int i = 0; i < n; i++) {
                        caps.put(assets.get(i), w[i]);
                    }
                    List<String> group = new ArrayList<>();
                    for (int i = 0; i < n; i++) {
                        if (i != a && g.nextInt(2) == 0) {
                            group.add(assets.get(i));
                        }
                    }
                    if (group.isEmpty()) {
                        group.add(assets.get(b));
                    }
                    Map<String, Double> p = ViewPortfolios.difference(name, Map.of(assets.get(a), 1.0),
                            ViewPortfolios.weightedGroup(name, group, caps));
                    view = View.of(name, p, 0.03 * g.nextDouble());
                }
            }
            switch (g.nextInt(4)) {
                case 0 -> view = view.withConfidence(g.nextInt(4) == 0 ? 1 : 0.05 + 0.9 * g.nextDouble());
                case 1 -> view = view.withVariance(0.0001 + 0.002 * g.nextDouble());
                default -> { }
            }
            views.add(view);
        }
        return new BlendCase(prior, views, 0.01 + 0.2 * g.nextDouble());
    }
}

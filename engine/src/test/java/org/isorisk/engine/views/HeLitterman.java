package org.isorisk.engine.views;

import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/**
 * The inputs of He &amp; Litterman's (1999) worked example, "The Intuition Behind Black-Litterman Model
 * Portfolios": seven equity markets, δ = 2.5, τ = 0.05, Σ = diag(vol)·corr·diag(vol), two relative views; the
 * paper's inputs as reproduced in public copies of it.
 */
final class HeLitterman {
    private HeLitterman() {
    }

    static final List<String> ASSETS = List.of("Australia", "Canada", "France", "Germany", "Japan", "UK", "USA");
    static final double[] VOLATILITY = {0.160, 0.203, 0.248, 0.271, 0.210, 0.200, 0.187};
    static final double[] WEIGHTS = {0.016, 0.022, 0.052, 0.055, 0.116, 0.124, 0.615};
    static final double[][] CORRELATION = {
            {1.000, 0.488, 0.478, 0.515, 0.439, 0.512, 0.491},
            {0.488, 1.000, 0.664, 0.655, 0.310, 0.608, 0.779},
            {0.478, 0.664, 1.000, 0.861, 0.355, 0.783, 0.668},
            {0.515, 0.655, 0.861, 1.000, 0.354, 0.777, 0.653},
            {0.439, 0.310, 0.355, 0.354, 1.000, 0.405, 0.306},
            {0.512, 0.608, 0.783, 0.777, 0.405, 1.000, 0.652},
            {0.491, 0.779, 0.668, 0.653, 0.306, 0.652, 1.000}};
    static final double DELTA = 2.5;
    static final double TAU = 0.05;

    static double[][] covariance() {
        int n = VOLATILITY.length;
        double[][] s = new double[n][n];
        for (int i = 0; i < n; i++) {
            for (int j = 0; j < n; j++) {
                s[i][j] = VOLATILITY[i] * CORRELATION[i][j] * VOLATILITY[j];
            }
        }
        return s;
    }

    /** The equilibrium prior, excess returns (risk-free rate 0, as in the paper). */
    static Prior prior() {
        return Prior.implied(ASSETS, covariance(), WEIGHTS, DELTA, 0);
    }

    /** View 1: Germany outperforms the rest of Europe (France −0.295, UK −0.705, as printed) by 5 % a year. */
    static View germanyOverEurope() {
        Map<String, Double> p = new LinkedHashMap<>();
        p.put("Germany", 1.0);
        p.put("France", -0.295);
        p.put("UK", -0.705);
        return View.of("Germany over the rest of Europe", p, 0.05);
    }

    /** View 2: Canada outperforms the USA by 3 % a year. */
    static View canadaOverUsa() {
        return View.relative("Canada over USA", "Canada", "USA", 0.03);
    }
}

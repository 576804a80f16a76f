package org.isorisk.engine.io;

/**
 * The units numbers arrive in. The engine only ever sees decimals (0.065 is 6.5 %); {@link #PERCENT} converts
 * on input: returns, rates, volatilities and weights are divided by 100, variances and covariances by 10 000.
 * Correlations and market values have no unit and are never converted.
 */
public enum Units {
    /** 0.065 means 6.5 %. */
    DECIMAL("decimal"),
    /** 6.5 means 6.5 %. */
    PERCENT("percent");

    private final String label;

    Units(String label) {
        this.label = label;
    }

    /** The name on the command line ({@code --units decimal|percent}). */
    public String label() {
        return label;
    }

    /** A return, rate, volatility or weight in decimals. */
    public double rate(double v) {
        return this == PERCENT ? v / 100.0 : v;
    }

    /** A variance or covariance in decimals squared. */
    public double variance(double v) {
        return this == PERCENT ? v / 10_000.0 : v;
    }
}

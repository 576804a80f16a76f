package org.isorisk.engine.estimate;

/** The covariance estimator. */
public enum CovarianceMethod {
    /** Sample covariance with the unbiased divisor {@code n − 1}, centred on the sample mean. */
    SAMPLE("sample"),
    /**
     * Exponentially weighted: weight {@code λ^k} on the return k periods before the latest, normalised to sum to
     * one, centred on the exponentially weighted mean (RiskMetrics Technical Document (1996) daily decay 0.94 as
     * the preset for daily data).
     */
    EWMA("ewma"),
    /**
     * Ledoit &amp; Wolf (2004), "A well-conditioned estimator for large-dimensional covariance matrices", JMVA 88:
     * shrinkage of the sample covariance towards a scaled identity {@code m·I}, with the intensity estimated from
     * the data.
     */
    LEDOIT_WOLF_IDENTITY("ledoit-wolf-identity"),
    /**
     * Ledoit &amp; Wolf (2004), "Honey, I shrunk the sample covariance matrix", JPM 30(4): shrinkage towards the
     * constant-correlation matrix (sample variances, every correlation equal to the average sample correlation),
     * with the intensity estimated from the data.
     */
    LEDOIT_WOLF_CONSTANT_CORRELATION("ledoit-wolf-constant-correlation");

    private final String label;

    CovarianceMethod(String label) {
        this.label = label;
    }

    /** The name used on the command line and in reports. */
    public String label() {
        return label;
    }

    /** True for the two Ledoit–Wolf shrinkage estimators. */
    public boolean shrinks() {
        return this == LEDOIT_WOLF_IDENTITY || this == LEDOIT_WOLF_CONSTANT_CORRELATION;
    }

    /** Parses a label such as {@code ewma}; null when unknown. */
    public static CovarianceMethod fromLabel(String s) {
        for (CovarianceMethod m : values()) {
            if (m.label.equalsIgnoreCase(s)) {
                return m;
            }
        }
        return null;
    }
}

package org.isorisk.engine.estimate;

/**
 * Ledoit–Wolf shrinkage of the sample covariance {@code S = X'X/T} of centred returns X (T × N) towards a
 * structured target F: {@code Σ* = δ F + (1 − δ) S}, with the intensity δ estimated from the data. Both papers
 * use the divisor T (not T − 1) and centre on the sample mean; so does this class.
 */
final class LedoitWolf {
    private LedoitWolf() {
    }

    /**
     * A shrunk matrix with its intensity.
     *
     * @param covariance the shrunk covariance (per period)
     * @param intensity  δ in [0, 1], the weight on the target
     */
    record Result(double[][] covariance, double intensity) {
    }

    /**
     * Ledoit &amp; Wolf (2004), JMVA 88, "A well-conditioned estimator for large-dimensional covariance
     * matrices", the sample counterparts of Lemmas 3.2–3.3 and Theorem 3.1 with the norm
     * {@code ‖A‖² = tr(AA')/N}: {@code m = tr(S)/N}, {@code d² = ‖S − mI‖²},
     * {@code b̄² = (1/T²) Σ_t ‖x_t x_t' − S‖²}, {@code b² = min(b̄², d²)}, and
     * {@code Σ* = (b²/d²) m I + (1 − b²/d²) S}. The intensity is {@code b²/d²} (0 when S is already m I).
     *
     * @param x centred returns, one array per asset ({@code x[j][t]}); not modified
     * @param s {@code X'X/T}; not modified
     */
    static Result identity(double[][] x, double[][] s) {
        int n = s.length;
        int len = x[0].length;
        double trace = 0;
        for (int i = 0; i < n; i++) {
            trace += s[i][i];
        }
        double m = trace / n;
        double d2 = 0;
        double sNorm2 = 0;
        for (int i = 0; i < n; i++) {
            for (int j = 0; j < n; j++) {
                double v = s[i][j] - (i == j ? m : 0);
                d2 += v * v;
                sNorm2 += s[i][j] * s[i][j];
            }
        }
        d2 /= n;
        // Σ_t ‖x_t x_t' − S‖² = Σ_t ‖x_t‖⁴ − T‖S‖², because Σ_t x_t x_t' = T S.
        double fourth = 0;
        for (int t = 0; t < len; t++) {
            double r2 = 0;
            for (int j = 0; j < n; j++) {
                double v = x[j][t];
                r2 += v * v;
            }
            fourth += r2 * r2;
        }
        double bBar2 = (fourth - len * sNorm2) / ((double) len * len * n);
        double b2 = Math.min(bBar2, d2);
        double delta = d2 > 0 ? Math.max(0, b2) / d2 : 0;
        double[][] out = new double[n][n];
        for (int i = 0; i < n; i++) {
            for (int j = 0; j < n; j++) {
                out[i][j] = (1 - delta) * s[i][j] + (i == j ? delta * m : 0);
            }
        }
        return new Result(out, delta);
    }

    /**
     * Ledoit &amp; Wolf (2004), "Honey, I shrunk the sample covariance matrix", JPM 30(4): the target F has the
     * sample variances on the diagonal and {@code r̄ sqrt(s_ii s_jj)} off it, with r̄ the average sample
     * correlation; {@code δ = max(0, min(1, κ/T))} with {@code κ = (π̂ − ρ̂)/γ̂}, where
     * {@code π̂ = Σ_ij (1/T) Σ_t (x_it x_jt − s_ij)²},
     * {@code ρ̂ = Σ_i π̂_ii + Σ_{i≠j} r̄ sqrt(s_jj/s_ii) ϑ_ij} with
     * {@code ϑ_ij = (1/T) Σ_t (x_it² − s_ii)(x_it x_jt − s_ij)}, and {@code γ̂ = ‖F − S‖²_F}.
     *
     * @param x centred returns, one array per asset; not modified
     * @param s {@code X'X/T}; not modified
     */
    static Result constantCorrelation(double[][] x, double[][] s) {
        int n = s.length;
        int len = x[0].length;
        double[] sd = new double[n];
        for (int i = 0; i < n; i++) {
            sd[i] = Math.sqrt(s[i][i]);
        }
        double rSum = 0;
        for (int i = 0; i < n; i++) {
            for (int j = i + 1; j < n; j++) {
                rSum += s[i][j] / (sd[i] * sd[j]);
            }
        }
        double rBar = n > 1 ? 2 * rSum / ((double) n * (n - 1)) : 0;
        double[][] x2 = Moments.power(x, 2);
        // (1/T) Σ_t x_it² x_jt²  and  (1/T) Σ_t x_it³ x_jt: with them π̂_ij = p2_ij − s_ij², ϑ_ij = p31_ij − s_ii s_ij.
        double[][] p2 = Moments.cross(x2, x2, len);
        double[][] x3 = Moments.power(x, 3);
        double[][] p31 = Moments.cross(x3, x, len);
        double pi = 0;
        double rho = 0;
        double gamma = 0;
        for (int i = 0; i < n; i++) {
            for (int j = 0; j < n; j++) {
                double piIj = p2[i][j] - s[i][j] * s[i][j];
                pi += piIj;
                if (i == j) {
                    rho += piIj;
                } else {
                    double theta = p31[i][j] - s[i][i] * s[i][j];
                    rho += rBar * (sd[j] / sd[i]) * theta;
                    double f = rBar * sd[i] * sd[j];
                    gamma += (f - s[i][j]) * (f - s[i][j]);
                }
            }
        }
        double delta;
        if (gamma > 0) {
            double kappa = (pi - rho) / gamma;
            delta = Math.max(0, Math.min(1, kappa / len));
        } else {
            delta = 0; // S already has constant correlation: nothing to shrink
        }
        double[][] out = new double[n][n];
        for (int i = 0; i < n; i++) {
            for (int j = 0; j < n; j++) {
                double f = i == j ? s[i][i] : rBar * sd[i] * sd[j];
                out[i][j] = delta * f + (1 - delta) * s[i][j];
            }
        }
        return new Result(out, delta);
    }
}

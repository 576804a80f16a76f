package org.isorisk.engine.views;

import java.util.Collections;
import java.util.LinkedHashMap;
import java.util.Locale;
import java.util.Map;
import org.isorisk.engine.error.InputException;

/**
 * A view: the committee expects the portfolio {@code p} (coefficients over assets) to return {@code q} a year,
 * with some confidence. An absolute view has one asset with coefficient 1 ("Emerging Equity returns 7 %"); a
 * relative view has coefficients summing to 0 ("Domestic Equity outperforms Foreign Equity by 1 %").
 *
 * <p>How sure the view is, exactly one of three ways:
 * <ul>
 *   <li>a confidence c in [0, 1], turned into the view's variance by Idzorek's calibration (Idzorek 2005, "A
 *   Step-by-Step Guide to the Black-Litterman Model"): {@code ω = ((1 − c)/c)·p'τΣp}; c = 0 drops the view and
 *   c = 1 makes it hold exactly. With one view and weights {@code (δΣ)⁻¹μ̄}, the tilt of the weights is then c
 *   times the tilt at full confidence (a test checks it); with several views it is the same per-view rule;</li>
 *   <li>the view's variance ω ≥ 0 directly (annual variance of the view's return, decimal²);</li>
 *   <li>neither: He &amp; Litterman's (1999) {@code ω = p'τΣp}, the prior's own uncertainty along the view
 *   portfolio (equivalent to c = ½).</li>
 * </ul>
 *
 * <p>Errors are {@link InputException}s whose problem names the view and whose key is the view's field
 * ({@code name}, {@code portfolio}, {@code return}, {@code confidence}, {@code variance}), so that the reader of a
 * views file can add the file and line.
 *
 * @param name       the view's name, unique among the views, used in every message and table
 * @param portfolio  asset name → coefficient (copied, order kept); finite, at least one not zero
 * @param viewReturn expected annual total return of the view portfolio, decimal (for a relative view the
 *                   outperformance; the risk-free rate cancels there)
 * @param confidence c in [0, 1], or NaN when not given
 * @param variance   ω ≥ 0, or NaN when not given
 */
public record View(String name, Map<String, Double> portfolio, double viewReturn, double confidence,
                   double variance) {

    /** How a view's uncertainty was stated. */
    public enum Uncertainty {
        /** A confidence c, through Idzorek's calibration. */
        CONFIDENCE,
        /** A variance ω given directly. */
        VARIANCE,
        /** Neither: He &amp; Litterman's ω = p'τΣp. */
        PRIOR
    }

    public View {
        if (name == null || name.isBlank()) {
            throw InputException.of("a view has no name").key("name").fix("give every view a name").build();
        }
        if (portfolio == null || portfolio.isEmpty()) {
            throw error(name, "names no asset").key("portfolio")
                    .fix("give the view portfolio's coefficients, e.g. {Domestic Equity: 1.0, Foreign Equity: -1.0}")
                    .build();
        }
        boolean nonZero = false;
        for (Map.Entry<String, Double> e : portfolio.entrySet()) {
            if (e.getKey() == null || e.getKey().isBlank()) {
                throw error(name, "has an asset without a name").key("portfolio").fix("name every asset").build();
            }
            Double v = e.getValue();
            if (v == null || !Double.isFinite(v)) {
                throw error(name, "has a coefficient that is not a finite number").key("portfolio")
                        .asset(e.getKey()).value(v).fix("give a number such as 1.0 or -0.5").build();
            }
            nonZero |= v != 0;
        }
        if (!nonZero) {
            throw error(name, "has a portfolio whose coefficients are all zero (its two sides are the same)")
                    .key("portfolio").fix("give the assets that should outperform and those that should trail")
                    .build();
        }
        portfolio = Collections.unmodifiableMap(new LinkedHashMap<>(portfolio));
        if (!Double.isFinite(viewReturn)) {
            throw error(name, "has a return that is not a finite number").key("return").value(viewReturn)
                    .fix("give a decimal such as 0.01 for 1 %").build();
        }
        boolean hasConfidence = !Double.isNaN(confidence);
        boolean hasVariance = !Double.isNaN(variance);
        if (hasConfidence && hasVariance) {
            throw error(name, "gives both a confidence and a variance").key("confidence")
                    .fix("give one of them (a confidence between 0 and 1, or the view's variance)").build();
        }
        if (hasConfidence && !(confidence >= 0 && confidence <= 1)) {
            throw error(name, "has a confidence outside [0, 1]").key("confidence").value(confidence)
                    .fix("give a confidence between 0 and 1 (0.6 for 60 %; 1 makes the view hold exactly)").build();
        }
        if (hasVariance && !(variance >= 0 && Double.isFinite(variance))) {
            throw error(name, "has a negative or infinite variance").key("variance").value(variance)
                    .fix("give the view's variance as a non-negative decimal, e.g. 0.0004 for a 2 % standard "
                            + "deviation").build();
        }
    }

    /** A view on a portfolio with He &amp; Litterman's default uncertainty. */
    public static View of(String name, Map<String, Double> portfolio, double viewReturn) {
        return new View(name, portfolio, viewReturn, Double.NaN, Double.NaN);
    }

    /** "{@code asset} returns {@code viewReturn}" (total return). */
    public static View absolute(String name, String asset, double viewReturn) {
        return of(name, Map.of(asset, 1.0), viewReturn);
    }

    /**
     * "{@code outperformer} outperforms {@code underperformer} by {@code viewReturn}".
     *
     * @throws InputException when the two sides are the same asset
     */
    public static View relative(String name, String outperformer, String underperformer, double viewReturn) {
        if (outperformer != null && outperformer.equals(underperformer)) {
            throw error(name, "compares an asset with itself").key("portfolio").asset(outperformer)
                    .fix("name two different assets or groups").build();
        }
        Map<String, Double> p = new LinkedHashMap<>();
        p.put(outperformer, 1.0);
        p.put(underperformer, -1.0);
        return of(name, p, viewReturn);
    }

    /** The same view with a confidence c in [0, 1] (and no variance). */
    public View withConfidence(double c) {
        return new View(name, portfolio, viewReturn, c, Double.NaN);
    }

    /** The same view with a variance ω ≥ 0 (and no confidence). */
    public View withVariance(double omega) {
        return new View(name, portfolio, viewReturn, Double.NaN, omega);
    }

    /** How the uncertainty was stated. */
    public Uncertainty uncertainty() {
        return !Double.isNaN(confidence) ? Uncertainty.CONFIDENCE
                : !Double.isNaN(variance) ? Uncertainty.VARIANCE : Uncertainty.PRIOR;
    }

    /** Sum of the coefficients: 1 for an absolute view, 0 for a relative one. */
    public double netExposure() {
        double s = 0;
        for (double v : portfolio.values()) {
            s += v;
        }
        return s;
    }

    static InputException.Builder error(String view, String problem) {
        return InputException.of(String.format(Locale.ROOT, "view '%s' %s", view == null ? "" : view, problem));
    }
}

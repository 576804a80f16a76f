package org.isorisk.engine.views;

/**
 * One view after blending: how it entered the posterior and what the posterior says about it. Returns are
 * annualised total returns, decimal.
 *
 * @param view              the view as given
 * @param portfolio         its coefficients over the prior's assets, in the prior's order (copied)
 * @param priorVariance     {@code p'τΣp}, the prior's variance along the view portfolio
 * @param variance          ω used; NaN when the view was dropped (confidence 0)
 * @param impliedConfidence {@code p'τΣp / (p'τΣp + ω)}: the confidence that gives this ω in Idzorek's
 *                          calibration (½ for He &amp; Litterman's default, 1 at ω = 0, 0 when dropped)
 * @param before            the view portfolio's prior return {@code p'(r_f + Π)} (as for {@code Q}: total)
 * @param after             its posterior return {@code p'(r_f + μ̄)}
 * @param viewWeight        the view's weight in the unconstrained optimum (He &amp; Litterman's Λ): 0 when the
 *                          view was dropped, NaN when the prior has no risk aversion
 * @param dropped           true when the confidence was 0 (the view did not enter the blend)
 */
public record BlendedView(View view, double[] portfolio, double priorVariance, double variance,
                          double impliedConfidence, double before, double after, double viewWeight, boolean dropped) {

    public BlendedView {
        portfolio = portfolio.clone();
    }

    @Override
    public double[] portfolio() {
        return portfolio.clone();
    }

    /** The view's name. */
    public String name() {
        return view.name();
    }

    /** The view's stated return Q (total). */
    public double viewReturn() {
        return view.viewReturn();
    }

    /** How far the blend moved the view portfolio's return: {@code after − before}. */
    public double tilt() {
        return after - before;
    }
}

package org.isorisk.notebooks.chart;

import org.isorisk.engine.error.InputException;

/**
 * Knobs shared by every chart; {@link #defaults()} documents the values a committee pack uses.
 *
 * @param width              logical width in pixels (points in SVG/PDF); PNG is written at {@code pngScale} times this
 * @param height             logical height in pixels, footnote included
 * @param pngScale           resolution multiplier of PNG exports (2 = print quality at A4 width)
 * @param assetLabelLimit    above this many assets the frontier chart draws asset points without name labels
 * @param bandLimit          at most this many assets get their own band in the weights chart; the rest are "other"
 * @param otherThreshold     when there are more than {@code bandLimit} assets, an asset whose weight stays below this
 *                           (decimal) everywhere on the frontier goes to "other" even if there is room for it
 * @param barLimit           at most this many assets get their own bar in the risk-contribution chart
 * @param cornerLabelLimit   at most this many corner portfolios are labelled in the marginal-risk chart
 * @param marginalStep       return step (decimal) in which the marginal-risk chart states the cost of a higher target
 */
public record ChartSettings(int width, int height, double pngScale, int assetLabelLimit, int bandLimit,
                            double otherThreshold, int barLimit, int cornerLabelLimit, double marginalStep) {

    public ChartSettings {
        if (width < 320 || height < 240) {
            throw InputException.of("a chart must be at least 320 by 240 pixels").value(width + "x" + height)
                    .fix("give a larger chart size").build();
        }
        if (!(pngScale >= 1 && pngScale <= 8)) {
            throw InputException.of("the PNG scale must be between 1 and 8").value(pngScale).build();
        }
        if (assetLabelLimit < 0 || bandLimit < 1 || barLimit < 1 || cornerLabelLimit < 0) {
            throw InputException.of("chart limits must be positive").build();
        }
        if (!(otherThreshold >= 0 && otherThreshold < 1)) {
            throw InputException.of("the 'other' threshold must be a decimal in [0, 1)").value(otherThreshold).build();
        }
        if (!(marginalStep > 0 && marginalStep < 1)) {
            throw InputException.of("the marginal-risk step must be a decimal in (0, 1)").value(marginalStep).build();
        }
    }

    /**
     * Defaults: 800 × 600 (about A4 text width at 2× PNG resolution, where 12-pixel text prints at about 7 pt), PNG at
     * 2×, asset labels up to 25 assets, 12 asset bands and 20 risk bars before grouping (more do not stay legible in
     * a printed legend), "other" below 2 % (common practice, no source), 14 corner labels, and the marginal cost of
     * the return target stated per 0.25 % of target (the step committees discuss).
     */
    public static ChartSettings defaults() {
        return new ChartSettings(800, 600, 2.0, 25, 12, 0.02, 20, 14, 0.0025);
    }

    /** The same settings with another PNG resolution multiplier. */
    public ChartSettings withPngScale(double scale) {
        return new ChartSettings(width, height, scale, assetLabelLimit, bandLimit, otherThreshold, barLimit,
                cornerLabelLimit, marginalStep);
    }

    /** The same settings with another size. */
    public ChartSettings withSize(int w, int h) {
        return new ChartSettings(w, h, pngScale, assetLabelLimit, bandLimit, otherThreshold, barLimit, cornerLabelLimit,
                marginalStep);
    }
}

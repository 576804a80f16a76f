package org.isorisk.notebooks.chart;

import java.awt.image.BufferedImage;
import java.io.FilterOutputStream;
import java.io.IOException;
import java.io.OutputStream;
import java.util.Iterator;
import java.util.List;
import javax.imageio.IIOImage;
import javax.imageio.ImageIO;
import javax.imageio.ImageTypeSpecifier;
import javax.imageio.ImageWriteParam;
import javax.imageio.ImageWriter;
import javax.imageio.metadata.IIOMetadata;
import javax.imageio.metadata.IIOMetadataNode;
import javax.imageio.stream.ImageOutputStream;
import org.isorisk.engine.model.Frontier;
import org.knowm.xchart.ChartEncoder;

/**
 * The front door for charts: one method per kind, each taking engine values and returning a {@link Figure}, and
 * {@link #write} to export a figure to a stream in PNG, SVG or PDF. Charts never compute portfolio numbers: every
 * value drawn comes from the engine result passed in.
 */
public final class Charts {
    private Charts() {
    }

    /**
     * The efficient frontier: volatility against expected return, both in percent; the mandate frontier (efficient
     * branch solid) with its corner portfolios, the unconstrained closed-form frontier (inefficient branch faint),
     * every asset, the minimum-variance portfolio, and the tangency portfolio with its capital market line and the
     * current and proposed portfolios when given.
     *
     * @throws org.isorisk.engine.error.InputException when the frontier is empty or a single point
     */
    public static Figure frontier(FrontierChartData data, ChartContext context, AssetColours colours,
                                  ChartSettings settings) {
        return FrontierChart.build(data, context, colours, settings);
    }

    /**
     * Each asset's weight along the frontier as stacked bands, from the minimum-variance end to the maximum
     * return, with guides at the corner portfolios; with many assets the small ones are grouped as "other".
     *
     * @throws org.isorisk.engine.error.InputException when the frontier has fewer than two portfolios
     */
    public static Figure weights(Frontier frontier, ChartContext context, AssetColours colours,
                                 ChartSettings settings) {
        return WeightsChart.build(frontier, context, colours, settings);
    }

    /**
     * The marginal risk of the return target, {@code ∂σ*∂m} (the target's shadow price in volatility units), against
     * the target, for the mandate and the unconstrained frontier; corners marked with the constraint that starts or
     * stops binding there.
     *
     * @throws org.isorisk.engine.error.InputException when neither curve has two points
     */
    public static Figure marginalRisk(Frontier frontier, ChartContext context, ChartSettings settings) {
        return MarginalRiskChart.build(frontier, context, settings);
    }

    /**
     * Each asset's share of portfolio volatility (Euler contributions) as horizontal bars, the current beside the
     * proposed portfolio, sorted by the proposed share.
     *
     * @param current  the current portfolio's shares; null to draw the proposed one alone
     * @param proposed the proposed portfolio's shares
     */
    public static Figure riskContributions(RiskShares current, RiskShares proposed, ChartContext context,
                                           AssetColours colours, ChartSettings settings) {
        return RiskContributionChart.build(current, proposed, context, colours, settings);
    }

    /**
     * Base and scenario frontiers on one chart (the first is the base).
     *
     * @throws org.isorisk.engine.error.InputException when the list is empty or a frontier cannot be drawn
     */
    public static Figure stressOverlay(List<NamedFrontier> frontiers, ChartContext context, ChartSettings settings) {
        return StressChart.build(frontiers, context, settings);
    }

    /**
     * Base and scenario curves on one chart (the first is the base), from volatilities at return targets, e.g. a
     * stress run's scenario points, when the portfolios themselves are not needed.
     *
     * @throws org.isorisk.engine.error.InputException when the list is empty or two curves share a name
     */
    public static Figure stressCurves(List<StressCurve> curves, ChartContext context, ChartSettings settings) {
        return StressChart.buildCurves(curves, context, settings, false);
    }

    /**
     * Writes the figure to {@code out} in {@code format}; PNG at {@code pngScale} times the logical size with the
     * matching resolution recorded (72 dpi × scale). Does not close {@code out}.
     */
    public static void write(Figure figure, ChartFormat format, double pngScale, OutputStream out) throws IOException {
        OutputStream keepOpen = new FilterOutputStream(out) {
            @Override
            public void write(byte[] b, int off, int len) throws IOException {
                out.write(b, off, len);
            }

            @Override
            public void close() throws IOException {
                flush();
            }
        };
        switch (format) {
            case PNG -> writePng(figure, pngScale, keepOpen);
            case SVG -> ChartEncoder.saveChart(figure, keepOpen, "svg");
            case PDF -> ChartEncoder.saveChart(figure, keepOpen, "pdf");
            default -> throw new IllegalArgumentException(format.name());
        }
        keepOpen.flush();
    }

    /** {@link #write(Figure, ChartFormat, double, OutputStream)} with the settings' PNG scale. */
    public static void write(Figure figure, ChartFormat format, ChartSettings settings, OutputStream out)
            throws IOException {
        write(figure, format, settings.pngScale(), out);
    }

    private static void writePng(Figure figure, double scale, OutputStream out) throws IOException {
        BufferedImage img = figure.image(scale);
        Iterator<ImageWriter> it = ImageIO.getImageWritersByFormatName("png");
        ImageWriter writer = it.next();
        try (ImageOutputStream ios = ImageIO.createImageOutputStream(out)) {
            writer.setOutput(ios);
            ImageWriteParam param = writer.getDefaultWriteParam();
            IIOMetadata meta = writer.getDefaultImageMetadata(
                    ImageTypeSpecifier.createFromBufferedImageType(BufferedImage.TYPE_INT_RGB), param);
            // The resolution goes into the PNG's own pHYs chunk (pixels per metre): the JDK writer misreads the
            // standard tree's HorizontalPixelSize (it takes the value as pixels per millimetre).
            long perMetre = Math.round(72.0 * scale / 0.0254);
            IIOMetadataNode phys = new IIOMetadataNode("pHYs");
            phys.setAttribute("pixelsPerUnitXAxis", Long.toString(perMetre));
            phys.setAttribute("pixelsPerUnitYAxis", Long.toString(perMetre));
            phys.setAttribute("unitSpecifier", "meter");
            IIOMetadataNode root = new IIOMetadataNode("javax_imageio_png_1.0");
            root.appendChild(phys);
            meta.mergeTree("javax_imageio_png_1.0", root);
            writer.write(null, new IIOImage(img, null, meta), param);
        } finally {
            writer.dispose();
        }
    }
}

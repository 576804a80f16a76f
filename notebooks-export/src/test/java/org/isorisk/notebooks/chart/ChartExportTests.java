package org.isorisk.notebooks.chart;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.awt.image.BufferedImage;
import java.io.ByteArrayInputStream;
import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.Iterator;
import java.util.List;
import java.util.Locale;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import javax.imageio.ImageIO;
import javax.imageio.ImageReader;
import javax.imageio.metadata.IIOMetadata;
import javax.imageio.stream.ImageInputStream;
import org.apache.pdfbox.Loader;
import org.apache.pdfbox.pdmodel.PDDocument;
import org.apache.pdfbox.pdmodel.common.PDRectangle;
import org.isorisk.engine.error.InputException;
import org.isorisk.engine.model.AssetUniverse;
import org.isorisk.engine.model.Frontier;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.knowm.xchart.XYChart;
import org.w3c.dom.NamedNodeMap;
import org.w3c.dom.Node;

/** Exports: format from the extension, magic bytes, pixel and page sizes; never golden image bytes. */
class ChartExportTests {

    private static final ChartSettings S = ChartSettings.defaults();
    private static List<Figure> figures;
    /** Every figure exported once in every format (rendering is the slow part; each test reads these). */
    private static java.util.Map<Figure, java.util.Map<ChartFormat, byte[]>> exported;

    @BeforeAll
    static void allFiveCharts() {
        AssetUniverse u = ChartFixtures.sampleFund();
        Frontier f = ChartFixtures.sampleFrontier();
        AssetColours colours = AssetColours.of(u.assets());
        ChartContext ctx = ChartFixtures.context();
        figures = new ArrayList<>();
        figures.add(Charts.frontier(FrontierChartData.of(u, f), ctx, colours, S));
        figures.add(Charts.weights(f, ctx, colours, S));
        figures.add(Charts.marginalRisk(f, ctx, S));
        figures.add(Charts.riskContributions(ChartFixtures.shares("Current", u, ChartFixtures.sampleCurrent()),
                ChartFixtures.shares("Proposed", u, f.points().get(7).weights()), ctx, colours, S));
        figures.add(Charts.stressOverlay(List.of(new NamedFrontier("Base", f)), ctx, S));
        exported = new java.util.HashMap<>();
        for (Figure fig : figures) {
            java.util.Map<ChartFormat, byte[]> m = new java.util.EnumMap<>(ChartFormat.class);
            for (ChartFormat fmt : ChartFormat.values()) {
                ByteArrayOutputStream out = new ByteArrayOutputStream();
                try {
                    Charts.write(fig, fmt, S, out);
                } catch (IOException e) {
                    throw new AssertionError(e);
                }
                m.put(fmt, out.toByteArray());
            }
            exported.put(fig, m);
        }
    }

    private static byte[] export(Figure fig, ChartFormat fmt) {
        return exported.get(fig).get(fmt);
    }

    @Test
    void theFormatComesFromTheFileExtension() {
        assertEquals(ChartFormat.PNG, ChartFormat.fromFileName("out/frontier.png"));
        assertEquals(ChartFormat.SVG, ChartFormat.fromFileName("frontier.SVG"));
        assertEquals(ChartFormat.PDF, ChartFormat.fromFileName("a.b/frontier.pdf"));
        InputException none = assertThrows(InputException.class, () -> ChartFormat.fromFileName("charts.d/frontier"));
        assertEquals("charts.d/frontier: the chart file name has no extension to tell its format; fix: end the file "
                + "name in .png, .svg or .pdf", none.getMessage());
        InputException gif = assertThrows(InputException.class, () -> ChartFormat.fromFileName("frontier.gif"));
        assertEquals("frontier.gif: the chart format 'gif' is not supported; fix: end the file name in .png, .svg or "
                + ".pdf", gif.getMessage());
    }

    @Test
    void pngIsTwiceTheLogicalSizeRecordsItsResolutionAndIsNotBlank() throws IOException {
        for (Figure fig : figures) {
            byte[] b = export(fig, ChartFormat.PNG);
            assertEquals((byte) 0x89, b[0]);
            assertEquals("PNG", new String(b, 1, 3, StandardCharsets.US_ASCII));
            BufferedImage img = ImageIO.read(new ByteArrayInputStream(b));
            assertEquals(2 * fig.getWidth(), img.getWidth(), fig.kind().label());
            assertEquals(2 * fig.getHeight(), img.getHeight(), fig.kind().label());
            int ink = 0;
            for (int y = 0; y < img.getHeight(); y += 4) {
                for (int x = 0; x < img.getWidth(); x += 4) {
                    if ((img.getRGB(x, y) & 0xFFFFFF) != 0xFFFFFF) {
                        ink++;
                    }
                }
            }
            assertTrue(ink > img.getWidth() * img.getHeight() / 16 / 50, fig.kind().label() + " looks blank");
            assertEquals(144.0, dpi(b), 0.01, fig.kind().label()); // 2 x 72 dpi
        }
    }

    /** Dots per inch from the PNG's pHYs chunk (pixels per metre). */
    private static double dpi(byte[] png) throws IOException {
        try (ImageInputStream in = ImageIO.createImageInputStream(new ByteArrayInputStream(png))) {
            Iterator<ImageReader> it = ImageIO.getImageReaders(in);
            ImageReader r = it.next();
            r.setInput(in);
            IIOMetadata meta = r.getImageMetadata(0);
            Node root = meta.getAsTree("javax_imageio_png_1.0");
            for (Node n = root.getFirstChild(); n != null; n = n.getNextSibling()) {
                if (n.getNodeName().equals("pHYs")) {
                    NamedNodeMap a = n.getAttributes();
                    assertEquals("meter", a.getNamedItem("unitSpecifier").getNodeValue());
                    return Double.parseDouble(a.getNamedItem("pixelsPerUnitXAxis").getNodeValue()) * 0.0254;
                }
            }
        }
        throw new AssertionError("no resolution recorded");
    }

    @Test
    void svgIsAnSvgDocumentOfTheLogicalSize() {
        for (Figure fig : figures) {
            String svg = new String(export(fig, ChartFormat.SVG), StandardCharsets.UTF_8);
            assertTrue(svg.startsWith("<?xml"), svg.substring(0, 40));
            Matcher tag = Pattern.compile("<svg\\s[^>]*>").matcher(svg);
            assertTrue(tag.find(), "an svg element");
            assertEquals(fig.getWidth(), attribute(tag.group(), "width"), 1.0, fig.kind().label());
            assertEquals(fig.getHeight(), attribute(tag.group(), "height"), 1.0, fig.kind().label());
        }
    }

    private static double attribute(String tag, String name) {
        Matcher m = Pattern.compile("\\s" + name + "=\"([0-9.]+)(px)?\"").matcher(tag);
        assertTrue(m.find(), name + " in " + tag);
        return Double.parseDouble(m.group(1));
    }

    @Test
    void pdfIsOnePageOfTheLogicalSizeInPoints() throws IOException {
        for (Figure fig : figures) {
            byte[] b = export(fig, ChartFormat.PDF);
            assertEquals("%PDF-", new String(b, 0, 5, StandardCharsets.US_ASCII));
            try (PDDocument doc = Loader.loadPDF(b)) {
                assertEquals(1, doc.getNumberOfPages());
                PDRectangle box = doc.getPage(0).getMediaBox();
                assertEquals(fig.getWidth(), box.getWidth(), 0.5, fig.kind().label());
                assertEquals(fig.getHeight(), box.getHeight(), 0.5, fig.kind().label());
            }
        }
    }

    @Test
    void writingDoesNotCloseTheCallersStream() throws IOException {
        class Watch extends ByteArrayOutputStream {
            boolean closed;

            @Override
            public void close() {
                closed = true;
            }
        }
        Figure small = Charts.stressOverlay(List.of(new NamedFrontier("Base", ChartFixtures.sampleFrontier())),
                ChartFixtures.context(), S.withSize(400, 300));
        for (ChartFormat fmt : ChartFormat.values()) {
            Watch w = new Watch();
            Charts.write(small, fmt, 1.0, w);
            assertTrue(w.size() > 0);
            assertTrue(!w.closed, fmt + " closed the stream");
        }
    }

    @Test
    void percentTicksIgnoreTheMachinesLocale() throws IOException {
        Locale before = Locale.getDefault();
        try {
            Locale.setDefault(Locale.GERMANY);
            Figure fig = Charts.frontier(FrontierChartData.of(ChartFixtures.sampleFund(), ChartFixtures.sampleFrontier()),
                    ChartFixtures.context(), AssetColours.of(ChartFixtures.sampleFund().assets()), S);
            XYChart c = (XYChart) fig.chart();
            assertEquals("2.5 %", c.getStyler().getxAxisTickLabelsFormattingFunction().apply(0.025));
            assertEquals("12 %", c.getStyler().getyAxisTickLabelsFormattingFunction().apply(0.12));
            assertEquals(Locale.ROOT, c.getStyler().getLocale());
            ByteArrayOutputStream out = new ByteArrayOutputStream();
            Charts.write(fig, ChartFormat.PNG, 1.0, out);
            assertTrue(out.size() > 0);
            assertTrue(fig.footnote().get(fig.footnote().size() - 1).contains("2025-06-30"));
        } finally {
            Locale.setDefault(before);
        }
    }

    @Test
    void everyChartCarriesTheFootnote() {
        for (Figure fig : figures) {
            List<String> foot = fig.footnote();
            assertEquals(org.isorisk.engine.explain.Caution.SHORT, foot.get(foot.size() - 2), fig.kind().label());
            assertTrue(foot.get(foot.size() - 1).contains("inputs #3f9a0c1d7e5b"), fig.kind().label());
        }
    }
}

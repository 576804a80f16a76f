package org.isorisk.cli.commands;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.awt.image.BufferedImage;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import javax.imageio.ImageIO;
import org.isorisk.cli.Run;
import org.isorisk.engine.explain.Caution;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class ChartCommandTests {

    @TempDir
    Path dir;

    String mu;
    String cov;
    String holdings;

    @BeforeEach
    void sample() {
        Run.sample(dir);
        mu = dir.resolve("expected_returns.csv").toString();
        cov = dir.resolve("covariance.csv").toString();
        holdings = dir.resolve("holdings.csv").toString();
    }

    @Test
    void riskContributionsAreDrawnIntoAPngAtTwiceTheChartSize() throws IOException {
        String prop = Run.file(dir, "proposal.csv", "asset,weight\nGovernment Bonds,0.4\nDomestic Equity,0.3\n"
                + "Foreign Developed Equity,0.3\n");
        Path png = dir.resolve("charts/risk.png");
        Run r = Run.of("chart", "risk-contributions", "--expected-returns", mu, "--covariance", cov, "--weights", prop,
                "--current", holdings, "--out", png.toString());
        assertEquals(0, r.code(), r.toString());
        assertTrue(r.out().startsWith("Wrote the risk-contributions chart to " + png + " (PNG, 1600 x 1200 pixels).\n"),
                r.out());
        assertTrue(r.out().replaceAll("\\s+", " ").contains(Caution.TEXT), r.out());
        assertEquals("", r.err());
        BufferedImage img = ImageIO.read(png.toFile());
        assertEquals(1600, img.getWidth());
        assertEquals(1200, img.getHeight());
    }

    @Test
    void svgAndPdfComeFromTheExtension() throws IOException {
        for (String ext : new String[] {"svg", "pdf"}) {
            Path f = dir.resolve("risk." + ext);
            Run r = Run.of("chart", "risk-contributions", "--covariance", cov, "--weights", holdings, "--out",
                    f.toString());
            assertEquals(0, r.code(), r.toString());
            String head = new String(Files.readAllBytes(f), 0, 5, StandardCharsets.US_ASCII);
            assertEquals(ext.equals("svg") ? "<?xml" : "%PDF-", head);
        }
    }

    @Test
    void anUnknownFormatIsRefusedBeforeAnyWorkAndNoFileIsLeft() throws IOException {
        Path gif = dir.resolve("risk.gif");
        Run r = Run.of("chart", "risk-contributions", "--covariance", cov, "--weights", holdings, "--out",
                gif.toString());
        assertEquals(2, r.code(), r.toString());
        assertEquals("isorisk: error: " + gif + ": the chart format 'gif' is not supported; fix: end the file name in "
                + ".png, .svg or .pdf\n", r.err());
        assertEquals("", r.out());
        assertFalse(Files.exists(gif));
        try (var s = Files.list(dir)) {
            assertTrue(s.noneMatch(p -> p.getFileName().toString().endsWith(".tmp")));
        }
    }

    @Test
    void chartWithoutAKindNamesTheKinds() {
        Run r = Run.of("chart");
        assertEquals(2, r.code());
        assertTrue(r.err().startsWith("isorisk: error: name a chart: risk-contributions"), r.err());
    }
}

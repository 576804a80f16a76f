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
        Path png = Files.createDirectories(dir.resolve("charts")).resolve("risk.png");
        Run r = Run.of("chart", "risk-contributions", "--expected-returns", mu, "--covariance", cov, "--weights", prop,
                "--current", holdings, "--out", png.toString());
        assertEquals(0, r.code(), r.toString());
        assertTrue(r.out().startsWith("Wrote the risk-contributions chart to " + png + " (PNG, 1600 x 1200 pixels).\n"),
                r.out());
        assertTrue(r.out().replaceAll("\\s+", " ").contains(Caution.TEXT), r.out());
        // the proposal leaves nine of the sample's twelve assets out: PortfolioReader's warning, on stderr
        assertEquals("isorisk: warning: " + prop + ": 9 assets are not listed and count as weight 0: Cash, "
                + "Inflation-Linked Bonds, Investment-Grade Credit, High Yield, Emerging Market Debt, Emerging Equity, "
                + "Listed Real Estate, Infrastructure, Commodities\n", r.err());
        BufferedImage img = ImageIO.read(png.toFile());
        assertEquals(1600, img.getWidth());
        assertEquals(1200, img.getHeight());
    }

    @Test
    void riskContributionsPrintTheWarningsOfTheWeightsAndTheCurrentFileAfterTheAssumptions() {
        // weights adding up to 0.9 (every asset listed) and to 90 (percent typed as decimals): PortfolioReader
        // warns about both; the chart is still drawn from the portfolios as given
        String prop = Run.file(dir, "proposal.csv", "asset,weight\n" + rows(0.075));
        String now = Run.file(dir, "now.csv", "asset,weight\n" + rows(7.5));
        Path svg = dir.resolve("risk.svg");
        Run r = Run.of("chart", "risk-contributions", "--covariance", cov, "--weights", prop, "--current", now,
                "--out", svg.toString());
        assertEquals(0, r.code(), r.toString());
        assertEquals("isorisk: warning: " + prop + ": weights add up to 0.9, not 1; the portfolio is taken as given\n"
                + "isorisk: warning: " + now + ": weights add up to 90 and look like percent; if they are, add --units "
                + "percent\n", r.err());
        assertTrue(Files.exists(svg));
    }

    @Test
    void theFrontierChartsPrintTheCurrentFilesWarningsTheSameWay() {
        String now = Run.file(dir, "now.csv", "asset,weight\n" + rows(0.075));
        for (String kind : new String[] {"frontier", "weights", "marginal-risk"}) {
            Run r = Run.of("chart", kind, "--expected-returns", mu, "--covariance", cov, "--current", now, "--points",
                    "5", "--out", dir.resolve(kind + ".svg").toString());
            assertEquals(0, r.code(), r.toString());
            assertEquals("isorisk: warning: " + now + ": weights add up to 0.9, not 1; the portfolio is taken as "
                    + "given\n", r.err(), kind);
        }
    }

    /** One {@code asset,weight} row per sample asset, each with weight {@code w}. */
    private String rows(double w) {
        StringBuilder b = new StringBuilder();
        for (String a : new String[] {"Cash", "Government Bonds", "Inflation-Linked Bonds", "Investment-Grade Credit",
            "High Yield", "Emerging Market Debt", "Domestic Equity", "Foreign Developed Equity", "Emerging Equity",
            "Listed Real Estate", "Infrastructure", "Commodities"}) {
            b.append(a).append(',').append(w).append('\n');
        }
        return b.toString();
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
        assertEquals("isorisk: error: name a chart: frontier, weights, marginal-risk, risk-contributions (see 'isorisk "
                + "chart --help')\n", r.err());
    }

    @Test
    void theFrontierUnderThePolicyWithTangencyCurrentAndProposalIsDrawn() throws IOException {
        Path policy = Files.copy(Run.SAMPLE.resolve("policy.yaml"), dir.resolve("policy.yaml"));
        Path pdf = dir.resolve("frontier.pdf");
        Run r = Run.of("chart", "frontier", "--expected-returns", mu, "--covariance", cov, "--policy", policy.toString(),
                "--current", holdings, "--target-return", "0.05", "--risk-free", "0.024", "--points", "20", "--out",
                pdf.toString());
        assertEquals(0, r.code(), r.toString());
        assertTrue(r.out().startsWith("Wrote the frontier chart to " + pdf + " (PDF, 800 x 600 points).\n"), r.out());
        assertEquals("%PDF-", new String(Files.readAllBytes(pdf), 0, 5, StandardCharsets.US_ASCII));
    }

    @Test
    void weightsUnderBoundsOnlyHaveCornerGuidesAndUnderGroupsSampledChanges() throws IOException {
        Path bounds = Path.of(Run.file(dir, "bounds.yaml", "bounds:\n  default: {min: 0.0, max: 0.3}\n"));
        Run r = Run.of("chart", "weights", "--expected-returns", mu, "--covariance", cov, "--policy", bounds.toString(),
                "--out", dir.resolve("w.png").toString());
        assertEquals(0, r.code(), r.toString());
        assertTrue(r.out().contains("Dashed verticals: corner portfolios"), r.out());
        Path policy = Files.copy(Run.SAMPLE.resolve("policy.yaml"), dir.resolve("policy.yaml"));
        Run g = Run.of("chart", "weights", "--expected-returns", mu, "--covariance", cov, "--policy", policy.toString(),
                "--points", "25", "--out", dir.resolve("w2.png").toString());
        assertEquals(0, g.code(), g.toString());
        assertTrue(g.out().replaceAll("\\s+", " ").contains("the binding constraints change between the two sampled "
                + "targets"), g.out());
    }

    @Test
    void frontierWithChartWritesTheChartBesideItsJsonWhichStaysPure() throws IOException {
        Path policy = Files.copy(Run.SAMPLE.resolve("policy.yaml"), dir.resolve("policy.yaml"));
        Path png = dir.resolve("frontier.png");
        Run r = Run.of("frontier", "--expected-returns", mu, "--covariance", cov, "--policy", policy.toString(),
                "--format", "json", "--chart", png.toString());
        assertEquals(0, r.code(), r.toString());
        assertEquals("optimal", r.json().get("status").asText(), r.out());
        assertEquals("isorisk: wrote " + png + "\n", r.err());
        BufferedImage img = ImageIO.read(png.toFile());
        assertEquals(1600, img.getWidth());
        Run bad = Run.of("frontier", "--expected-returns", mu, "--covariance", cov, "--chart",
                dir.resolve("f.jpg").toString());
        assertEquals(2, bad.code());
        assertEquals("", bad.out());
        assertTrue(bad.err().contains("the chart format 'jpg' is not supported"), bad.err());
    }

    @Test
    void marginalRiskWithoutAPolicyIsTheClosedFormCurveAlone() {
        Run r = Run.of("chart", "marginal-risk", "--expected-returns", mu, "--covariance", cov, "--out",
                dir.resolve("m.svg").toString());
        assertEquals(0, r.code(), r.toString());
        assertTrue(r.out().startsWith("Wrote the marginal-risk chart to "), r.out());
    }

    @Test
    void tooFewPointsAndMissingReturnsAreInputErrors() {
        Run r = Run.of("chart", "frontier", "--expected-returns", mu, "--covariance", cov, "--points", "1", "--out",
                dir.resolve("f.png").toString());
        assertEquals(2, r.code());
        assertEquals("isorisk: error: --points must be at least 2 for a frontier chart (value '1'); fix: give --points "
                + "2 or more (default 60)\n", r.err());
        Run n = Run.of("chart", "weights", "--covariance", cov, "--out", dir.resolve("f.png").toString());
        assertEquals(2, n.code());
        assertTrue(n.err().startsWith("isorisk: error: 'isorisk chart weights' needs the expected returns"), n.err());
        assertFalse(Files.exists(dir.resolve("f.png")));
    }
}

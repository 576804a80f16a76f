package org.isorisk.notebooks;

import java.awt.Color;
import java.awt.Graphics2D;
import java.awt.image.BufferedImage;
import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.io.UncheckedIOException;
import java.time.LocalDate;
import java.time.OffsetDateTime;
import java.time.ZoneOffset;
import java.util.ArrayList;
import java.util.List;
import java.util.Optional;
import javax.imageio.ImageIO;
import org.isorisk.engine.explain.Caution;
import org.isorisk.notebooks.report.Table;

/** Pack contents for the notebook tests: invented numbers, with ordinary or hostile asset names. */
public final class Fixtures {
    private Fixtures() {
    }

    /** Ordinary names. */
    public static final List<String> PLAIN = List.of("Cash", "Government Bonds", "Domestic Equity");

    /** Names that try to break out of HTML, Markdown, maths, CSV and Python. */
    public static final List<String> HOSTILE = List.of(
            "<script>alert('x')</script>",
            "=HYPERLINK(\"http://example.invalid\",\"click\")",
            "*Bold* _it_ $x^2$ [link](http://example.invalid) | pipe",
            "-10 Minus, Start",
            "Caf\u00e9 \"Quoted\" \\ back");

    /** A complete pack with the given asset names (3 or more), two portfolios, two charts and a trade list. */
    public static PackContent content(List<String> assets) {
        int n = assets.size();
        Table.Builder a = Table.builder("assumptions", "Assumptions")
                .column(Table.Column.text("asset", "Asset"))
                .column(Table.Column.percent("expected_return", "Expected return"))
                .column(Table.Column.percent("volatility", "Volatility"));
        Table.Builder corr = Table.builder("correlation", "Correlation").column(Table.Column.text("asset", "Asset"));
        for (int j = 0; j < n; j++) {
            corr.column(Table.Column.decimal("a" + j, assets.get(j)));
        }
        Table.Builder w = Table.builder("weights", "Weights")
                .column(Table.Column.text("asset", "Asset"))
                .column(Table.Column.percent("minimum_variance", "Minimum variance"))
                .column(Table.Column.percent("target_1", "Target 5.00 %"));
        Table.Builder r = Table.builder("risk", "Risk of the proposal")
                .column(Table.Column.text("asset", "Asset"))
                .column(Table.Column.percent("weight", "Weight"))
                .column(Table.Column.number("marginal_risk", "Marginal risk"))
                .column(Table.Column.percent("contribution", "Contribution"));
        Table.Builder t = Table.builder("trades", "Trades")
                .column(Table.Column.text("asset", "Asset"))
                .column(Table.Column.percent("change", "Change of weight"))
                .column(Table.Column.amount("amount", "Amount"));
        for (int i = 0; i < n; i++) {
            a.row(assets.get(i), 0.01 + 0.015 * i, 0.005 + 0.06 * i);
            Object[] cr = new Object[n + 1];
            cr[0] = assets.get(i);
            for (int j = 0; j < n; j++) {
                cr[j + 1] = i == j ? 1.0 : 0.3 - 0.1 * Math.abs(i - j);
            }
            corr.row(cr);
            w.row(assets.get(i), i == 0 ? 0.9 : 0.1 / (n - 1), 1.0 / n);
            r.row(assets.get(i), 1.0 / n, 0.01 * i - 0.004, i == 1 ? Double.NaN : 0.002 * i);
            t.row(assets.get(i), -0.05 + 0.03 * i, -1_250_000.0 + 812_345.5 * i);
        }
        Table.Builder cons = Table.builder("constraints", "Shadow prices")
                .column(Table.Column.text("portfolio", "Portfolio"))
                .column(Table.Column.text("constraint", "Constraint"))
                .column(Table.Column.number("variance_per_unit", "∂V*/∂limit"))
                .column(Table.Column.number("volatility_per_unit", "∂σ*/∂limit"));
        cons.row("Target 5.00 %", "upper:" + assets.get(2), -0.0123456789, -0.00012345);
        cons.row("Target 5.00 %", "target_return", 0.5, 0.035);
        List<PackContent.Portfolio> ps = List.of(
                new PackContent.Portfolio("Minimum variance", false, 0.012, 0.0049, "closed-form",
                        "residuals ≤ 2.1e-16, passes", true),
                new PackContent.Portfolio("Target 5.00 %", true, 0.05, 0.081, "numerical",
                        "residuals ≤ 3.0e-9, passes", true));
        List<PackContent.Binding> bs = List.of(
                new PackContent.Binding("Target 5.00 %", "upper:" + assets.get(2), -0.0123456789, -0.00012345,
                        "Raising the upper limit of " + assets.get(2) + " by 1.00 % lowers volatility by 0.00 %."),
                new PackContent.Binding("Target 5.00 %", "target_return", 0.5, 0.035,
                        "Raising the return target by 0.10 % raises volatility by 0.00 %."));
        List<PackContent.Chart> charts = List.of(
                chart("frontier", PackContent.ChartKind.FRONTIER, "Efficient frontier of " + assets.get(0), Color.BLUE),
                chart("weights", PackContent.ChartKind.WEIGHTS, "Weights", Color.ORANGE));
        PackContent.Assumptions as = new PackContent.Assumptions(a.build(), corr.build(),
                new PackContent.Pair(assets.get(0), assets.get(n - 1), -0.1), new PackContent.Pair(assets.get(0),
                assets.get(1), 0.2), 0.15, 1234.5678, "Given as tables by the analyst for " + assets.get(0) + ".");
        List<String> mandate = new ArrayList<>();
        mandate.add("Fully invested: the weights add up to 100.00 %.");
        mandate.add(assets.get(1) + " between 0.00 % and 35.00 %.");
        PackContent.RunRecord run = new PackContent.RunRecord("0.1.0-test",
                OffsetDateTime.of(2025, 6, 30, 12, 0, 0, 0, ZoneOffset.UTC),
                List.of(new PackContent.Parameter("targets", "5.00 %"), new PackContent.Parameter("fund", assets.get(0))),
                List.of(new PackContent.InputFile("expected-returns", assets.get(0) + ".csv", "0".repeat(64))),
                List.of("Short positions are not allowed by the policy."));
        return new PackContent(new PackContent.Heading(assets.get(0) + " Pension Fund", "GBP", LocalDate.of(2025, 6, 30),
                "Invented fund; all figures illustrative.", Caution.TEXT), as, mandate, ps, Optional.empty(),
                w.build(), r.build(), bs, cons.build(), charts, Optional.of(t.build()), List.of(), run);
    }

    static PackContent.Chart chart(String name, PackContent.ChartKind kind, String title, Color color) {
        BufferedImage img = new BufferedImage(120, 80, BufferedImage.TYPE_INT_RGB);
        Graphics2D g = img.createGraphics();
        g.setColor(Color.WHITE);
        g.fillRect(0, 0, 120, 80);
        g.setColor(color);
        g.fillOval(20, 10, 60, 60);
        g.dispose();
        ByteArrayOutputStream png = new ByteArrayOutputStream();
        try {
            ImageIO.write(img, "png", png);
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
        String svg = "<svg xmlns=\"http://www.w3.org/2000/svg\" width=\"120\" height=\"80\"><circle cx=\"50\" cy=\"40\" "
                + "r=\"30\" fill=\"#336699\"/></svg>";
        return new PackContent.Chart(name, kind, title, "What to read from " + title + ".", png.toByteArray(), svg,
                new byte[]{'%', 'P', 'D', 'F'});
    }

    /**
     * Writes the files of {@code c} ({@link PackLayout#files}) into the folder {@code target}, created as needed,
     * for the outside tools to read (the atomic folder and its manifest are the command line's, tested there).
     */
    public static void write(java.nio.file.Path target, PackContent c) {
        try {
            for (PackLayout.Entry f : PackLayout.files(c)) {
                java.nio.file.Path file = target.resolve(f.path());
                java.nio.file.Files.createDirectories(file.getParent());
                try (java.io.OutputStream out = new java.io.BufferedOutputStream(
                        java.nio.file.Files.newOutputStream(file))) {
                    f.body().writeTo(out);
                }
            }
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }
}

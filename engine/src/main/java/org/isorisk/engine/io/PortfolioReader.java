package org.isorisk.engine.io;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.OptionalDouble;

/**
 * Reads a portfolio: weights ({@code asset,weight}) for a portfolio or benchmark, or holdings
 * ({@code asset,market_value}, converted to weights of the total). Assets are matched by name to the universe;
 * assets the file does not list have weight 0.
 */
public final class PortfolioReader {
    private PortfolioReader() {
    }

    /** The layout named in messages. */
    public static final String LAYOUT = "asset,weight (decimals) or asset,market_value (in the fund's currency)";

    /** Weights summing further than this from 1 get a warning (common practice, no source). */
    public static final double BUDGET_WARNING = 1e-6;

    /**
     * Reads {@code path} as {@code role} (e.g. {@code weights}, {@code benchmark}, {@code holdings}).
     *
     * @param universe asset names the portfolio must use
     * @param units    units of weights ({@link Units#PERCENT} divides them by 100); market values are not converted
     */
    public static PortfolioFile read(Path path, String role, List<String> universe, Units units) {
        return read(Csv.read(path, role), universe, units);
    }

    /** Reads a portfolio file wherever it lives (a local path, a Hadoop file system path, bytes in memory). */
    public static PortfolioFile read(InputFile file, String role, List<String> universe, Units units) {
        return read(Csv.read(file, role), universe, units);
    }

    /** Reads a table already parsed. */
    public static PortfolioFile read(CsvTable t, List<String> universe, Units units) {
        units = units == null ? Units.DECIMAL : units;
        int a = t.requireColumn("asset", "the layout is " + LAYOUT);
        int w = t.column("weight");
        int mv = t.column("market_value");
        if (w >= 0 && mv >= 0) {
            throw t.error("the file has both a 'weight' and a 'market_value' column").row(t.headerRow())
                    .fix("keep one of them").build();
        }
        if (w < 0 && mv < 0) {
            throw t.error("no column named 'weight' or 'market_value' in the header (row " + t.headerRow() + ")")
                    .value(t.headerLine()).fix("the layout is " + LAYOUT).build();
        }
        int v = w >= 0 ? w : mv;
        List<String> names = NamedValues.names(t, a);
        double[] weights = new double[universe.size()];
        double[] raw = new double[names.size()];
        List<String> warnings = new ArrayList<>();
        double total = 0;
        for (int k = 0; k < names.size(); k++) {
            CsvRow r = t.rows().get(k);
            String name = names.get(k);
            if (!universe.contains(name)) {
                throw Names.hint(t.error("the asset is not in the asset universe (the expected-returns and "
                                + "covariance files)").row(r.number()).column(t.header().get(a)).asset(name), name,
                        universe, "use the names of the expected-returns file, or delete the row").build();
            }
            raw[k] = t.number(r, v, name);
            total += raw[k];
        }
        OptionalDouble marketValue = OptionalDouble.empty();
        if (mv >= 0) {
            if (!(total > 0)) {
                throw t.error("the market values add up to " + NumberText.show(total) + ", not a positive total")
                        .column("market_value").fix("give the market value of each holding in the fund's currency")
                        .build();
            }
            marketValue = OptionalDouble.of(total);
            for (int k = 0; k < names.size(); k++) {
                weights[universe.indexOf(names.get(k))] = raw[k] / total;
            }
        } else {
            double sum = 0;
            for (int k = 0; k < names.size(); k++) {
                double x = units.rate(raw[k]);
                weights[universe.indexOf(names.get(k))] = x;
                sum += x;
            }
            if (units == Units.DECIMAL && Math.abs(total) > 50 && Math.abs(total) < 150) {
                warnings.add(String.format(Locale.ROOT, "%s: weights add up to %s and look like percent; if they are, "
                        + "add --units percent", t.source().path(), NumberText.show(total)));
            } else if (Math.abs(sum - 1) > BUDGET_WARNING) {
                warnings.add(String.format(Locale.ROOT, "%s: weights add up to %s, not 1; the portfolio is taken as "
                        + "given", t.source().path(), NumberText.show(sum)));
            }
        }
        List<String> missing = new ArrayList<>();
        for (String u : universe) {
            if (!names.contains(u)) {
                missing.add(u);
            }
        }
        if (!missing.isEmpty()) {
            warnings.add(t.source().path() + ": " + missing.size() + " asset" + (missing.size() == 1 ? " is not listed and counts"
                    : "s are not listed and count") + " as weight 0: " + String.join(", ", missing));
        }
        return new PortfolioFile(universe, weights, marketValue, t.source(), warnings);
    }
}

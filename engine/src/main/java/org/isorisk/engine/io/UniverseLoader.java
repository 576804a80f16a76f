package org.isorisk.engine.io;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import org.isorisk.engine.error.InputException;
import org.isorisk.engine.linalg.Cholesky;
import org.isorisk.engine.linalg.Definiteness;
import org.isorisk.engine.linalg.Spectrum;
import org.isorisk.engine.model.AssetUniverse;

/**
 * Reads and validates the assumptions of an asset universe: expected returns matched by name to a covariance
 * matrix (or to volatilities and a correlation matrix). The result is in decimals and positive definite;
 * anything else is an {@link InputException} naming file, row, column, asset, value and a fix.
 */
public final class UniverseLoader {
    private UniverseLoader() {
    }

    /** Layout of the expected-returns file, as named in messages. */
    public static final String RETURNS_LAYOUT = "asset,expected_return (one row per asset; more columns allowed)";
    /** Layout of a covariance file. */
    public static final String COVARIANCE_LAYOUT = "a square matrix: 'asset' in the top-left cell, asset names down "
            + "the first column and the same names across the header row, in any order";
    /** Layout of a volatilities file. */
    public static final String VOLATILITIES_LAYOUT = "asset,volatility (one row per asset)";
    /** Layout of a correlation file. */
    public static final String CORRELATION_LAYOUT = "a square matrix like the covariance, with ones on the diagonal";

    /**
     * Largest asymmetry accepted, relative to {@code sqrt(Σii Σjj)} (for a correlation: absolute). Files written
     * with six significant digits differ by less; a typed-in error differs by far more. Within it the matrix is
     * symmetrised by averaging the two entries (common practice, no source).
     */
    public static final double SYMMETRY_TOLERANCE = 1e-6;

    /** Above this condition number a warning says results are sensitive to small input changes (common practice). */
    public static final double CONDITION_WARNING = 1e8;

    /** Tolerance on the ones of a correlation matrix's diagonal. */
    public static final double UNIT_DIAGONAL_TOLERANCE = 1e-8;

    /** Reads the files and validates them. */
    public static LoadedUniverse load(UniverseFiles f) {
        CsvTable mu = f.expectedReturns() == null ? null : Csv.read(f.expectedReturns(), "expected-returns");
        CsvTable cov = f.covariance() == null ? null : Csv.read(f.covariance(), "covariance");
        CsvTable vol = f.volatilities() == null ? null : Csv.read(f.volatilities(), "volatilities");
        CsvTable cor = f.correlation() == null ? null : Csv.read(f.correlation(), "correlation");
        return build(mu, cov, vol, cor, f.units(), f.asOf());
    }

    /**
     * Reads and validates assumption files wherever they live (local paths, Hadoop file system paths); the
     * arguments are as in {@link UniverseFiles}, each null when not given.
     */
    public static LoadedUniverse load(InputFile expectedReturns, InputFile covariance, InputFile volatilities,
                                      InputFile correlation, Units units, java.time.LocalDate asOf) {
        CsvTable mu = expectedReturns == null ? null : Csv.read(expectedReturns, "expected-returns");
        CsvTable cov = covariance == null ? null : Csv.read(covariance, "covariance");
        CsvTable vol = volatilities == null ? null : Csv.read(volatilities, "volatilities");
        CsvTable cor = correlation == null ? null : Csv.read(correlation, "correlation");
        return build(mu, cov, vol, cor, units, asOf);
    }

    /**
     * Builds a validated universe from tables already read; {@code returns} may be null, and exactly one of
     * {@code covariance} or the pair ({@code volatilities}, {@code correlation}) must be given.
     */
    public static LoadedUniverse build(CsvTable returns, CsvTable covariance, CsvTable volatilities,
                                       CsvTable correlation, Units units, java.time.LocalDate asOf) {
        units = units == null ? Units.DECIMAL : units;
        if ((covariance == null) == (volatilities == null || correlation == null)) {
            throw InputException.of("give a covariance matrix, or volatilities with a correlation matrix")
                    .fix("give --covariance FILE, or --volatilities FILE with --correlation FILE").build();
        }
        List<String> warnings = new ArrayList<>();
        NamedValues mu = returns == null ? null : NamedValues.read(returns, "expected_return", RETURNS_LAYOUT);
        List<String> order;
        double[][] sigma;
        CsvTable riskTable;
        if (covariance != null) {
            NamedMatrix m = NamedMatrix.read(covariance, COVARIANCE_LAYOUT);
            checkSymmetric(m, false, warnings);
            checkVariances(m);
            order = mu != null ? mu.names() : m.names();
            int[] p = match(order, mu, m.names(), m.rows(), covariance);
            int n = order.size();
            sigma = new double[n][n];
            for (int i = 0; i < n; i++) {
                for (int j = 0; j < n; j++) {
                    sigma[i][j] = units.variance(0.5 * (m.values()[p[i]][p[j]] + m.values()[p[j]][p[i]]));
                }
            }
            riskTable = covariance;
            percentWarningsVariance(m, units, warnings);
        } else {
            NamedValues v = NamedValues.read(volatilities, "volatility", VOLATILITIES_LAYOUT);
            NamedMatrix r = NamedMatrix.read(correlation, CORRELATION_LAYOUT);
            checkVolatilities(v);
            checkCorrelation(r);
            checkSymmetric(r, true, warnings);
            order = mu != null ? mu.names() : v.names();
            NamedValues orderFile = mu != null ? mu : v;
            int[] pv = match(order, orderFile, v.names(), v.rows(), volatilities);
            int[] pr = match(order, orderFile, r.names(), r.rows(), correlation);
            int n = order.size();
            double[][] rho = new double[n][n];
            double[] sd = new double[n];
            for (int i = 0; i < n; i++) {
                sd[i] = units.rate(v.values()[pv[i]]);
            }
            sigma = new double[n][n];
            for (int i = 0; i < n; i++) {
                for (int j = 0; j < n; j++) {
                    rho[i][j] = i == j ? 1.0 : 0.5 * (r.values()[pr[i]][pr[j]] + r.values()[pr[j]][pr[i]]);
                    sigma[i][j] = sd[i] * sd[j] * rho[i][j];
                }
            }
            riskTable = correlation;
            percentWarningsVolatility(v, units, warnings);
            requirePositiveDefinite(rho, order, correlation, "correlation");
        }
        int n = order.size();
        if (n < 2) {
            CsvTable t = returns != null ? returns : riskTable;
            throw t.error("the file names only one asset ('" + order.get(0) + "'): with one asset there is nothing to "
                    + "allocate").fix("give at least two assets").build();
        }
        double[] expected = new double[n];
        if (mu != null) {
            for (int i = 0; i < n; i++) {
                expected[i] = units.rate(mu.values()[i]);
            }
            percentWarningsReturns(mu, units, warnings);
            equalReturnsWarning(mu, warnings);
        }
        Spectrum sp = requirePositiveDefinite(sigma, order, riskTable, "covariance");
        if (sp.conditionNumber() > CONDITION_WARNING) {
            warnings.add(String.format(Locale.ROOT, "%s: the covariance matrix is ill-conditioned (condition number "
                    + "%s): weights and multipliers react strongly to small changes in the inputs",
                    riskTable.source().path(), NumberText.show(sp.conditionNumber())));
        }
        List<CsvTable> tables = new ArrayList<>();
        for (CsvTable t : new CsvTable[] {returns, covariance, volatilities, correlation}) {
            if (t != null) {
                tables.add(t);
            }
        }
        Provenance prov = Provenance.of(tables, asOf, warnings);
        return new LoadedUniverse(new AssetUniverse(order, expected, sigma), mu != null, sp, prov, warnings);
    }

    /**
     * Position in {@code names} of each asset of {@code order}; errors for a name in the file that the order
     * lacks (unknown) and for an asset of the order that the file lacks (missing).
     */
    private static int[] match(List<String> order, NamedValues orderFile, List<String> names, int[] rows, CsvTable t) {
        for (int k = 0; k < names.size(); k++) {
            if (!order.contains(names.get(k))) {
                String other = orderFile.table().source().path();
                InputException.Builder b = t.error("the asset is not in the " + orderFile.table().source().role()
                        .replace('-', ' ') + " file (" + other + ")").row(rows[k]).asset(names.get(k));
                throw Names.hint(b, names.get(k), order, "add it to " + other + ", or delete it from "
                        + t.source().path()).build();
            }
        }
        int[] p = new int[order.size()];
        for (int i = 0; i < order.size(); i++) {
            p[i] = names.indexOf(order.get(i));
            if (p[i] < 0) {
                String other = orderFile.table().source().path();
                throw t.error("the asset of " + other + " row " + orderFile.rowOf(order.get(i)) + " is missing from "
                                + "this file").asset(order.get(i))
                        .fix("add it to " + t.source().path() + ", or remove it from " + other).build();
            }
        }
        return p;
    }

    private static void checkSymmetric(NamedMatrix m, boolean correlation, List<String> warnings) {
        int n = m.names().size();
        double[][] a = m.values();
        double worst = 0;
        String worstPair = null;
        for (int i = 0; i < n; i++) {
            for (int j = i + 1; j < n; j++) {
                double d = Math.abs(a[i][j] - a[j][i]);
                if (d == 0) {
                    continue;
                }
                double scale = correlation ? 1.0 : Math.sqrt(Math.abs(a[i][i] * a[j][j]));
                if (scale == 0) {
                    scale = Math.max(Math.abs(a[i][j]), Math.abs(a[j][i]));
                }
                double rel = d / scale;
                if (rel > SYMMETRY_TOLERANCE) {
                    String x = m.names().get(i);
                    String y = m.names().get(j);
                    throw m.table().error(String.format(Locale.ROOT, "the matrix is not symmetric: the entry for "
                                    + "(%s, %s) is %s but the entry for (%s, %s) is %s", x, y, m.text(i, j), y, x,
                                    m.text(j, i))).row(m.rows()[i]).column(y).asset(x).value(m.text(i, j))
                            .fix("make the two entries equal (a " + (correlation ? "correlation" : "covariance")
                                    + " matrix is symmetric)").build();
                }
                if (rel > worst) {
                    worst = rel;
                    worstPair = m.names().get(i) + "' and '" + m.names().get(j);
                }
            }
        }
        if (worstPair != null) {
            warnings.add(String.format(Locale.ROOT, "%s: the matrix was not exactly symmetric and was symmetrised by "
                    + "averaging (largest relative difference %.2g, between '%s')", m.table().source().path(), worst,
                    worstPair));
        }
    }

    private static void checkVariances(NamedMatrix m) {
        for (int i = 0; i < m.names().size(); i++) {
            double v = m.values()[i][i];
            if (v < 0) {
                throw m.table().error("the variance is negative").row(m.rows()[i]).column(m.names().get(i))
                        .asset(m.names().get(i)).value(m.text(i, i))
                        .fix("a variance is a squared volatility and cannot be negative; check the sign").build();
            }
            if (v == 0) {
                throw m.table().error("the variance is zero: a riskless asset makes the covariance matrix singular")
                        .row(m.rows()[i]).column(m.names().get(i)).asset(m.names().get(i)).value(m.text(i, i))
                        .fix("give it its (small) positive variance, or leave it out and pass its return as "
                                + "--risk-free").build();
            }
        }
    }

    private static void checkVolatilities(NamedValues v) {
        for (int i = 0; i < v.names().size(); i++) {
            double s = v.values()[i];
            if (s < 0) {
                throw v.table().error("the volatility is negative").row(v.rows()[i]).column(v.columnName())
                        .asset(v.names().get(i)).value(v.table().rows().get(i).cell(v.column()))
                        .fix("a volatility (standard deviation) cannot be negative; check the sign").build();
            }
            if (s == 0) {
                throw v.table().error("the volatility is zero: a riskless asset makes the covariance matrix singular")
                        .row(v.rows()[i]).column(v.columnName()).asset(v.names().get(i))
                        .value(v.table().rows().get(i).cell(v.column()))
                        .fix("give it its (small) positive volatility, or leave it out and pass its return as "
                                + "--risk-free").build();
            }
        }
    }

    private static void checkCorrelation(NamedMatrix r) {
        int n = r.names().size();
        for (int i = 0; i < n; i++) {
            if (Math.abs(r.values()[i][i] - 1.0) > UNIT_DIAGONAL_TOLERANCE) {
                throw r.table().error("the diagonal of a correlation matrix must be 1").row(r.rows()[i])
                        .column(r.names().get(i)).asset(r.names().get(i)).value(r.text(i, i))
                        .fix("write 1 on the diagonal (an asset is perfectly correlated with itself)").build();
            }
            for (int j = 0; j < n; j++) {
                if (Math.abs(r.values()[i][j]) > 1.0) {
                    throw r.table().error("a correlation lies outside [-1, 1]").row(r.rows()[i])
                            .column(r.names().get(j)).asset(r.names().get(i)).value(r.text(i, j))
                            .fix("correlations are between -1 and 1; if these are covariances, use --covariance")
                            .build();
                }
            }
        }
    }

    /**
     * Checks that symmetric {@code a} is positive definite (smallest eigenvalue above
     * {@value Definiteness#INPUT} of the largest, the threshold for assumption files) and returns its extreme
     * eigenvalues; otherwise an error on {@code t} naming the smallest eigenvalue and, if there is one, the
     * perfectly correlated pair {@link Definiteness#perfectlyCorrelatedPair} finds.
     *
     * @param a     the matrix (not modified)
     * @param names asset names in the matrix's order
     * @param what  {@code covariance} or {@code correlation}, for the message
     */
    public static Spectrum requirePositiveDefinite(double[][] a, List<String> names, CsvTable t, String what) {
        Cholesky chol = Cholesky.factor(a);
        Spectrum sp = chol == null ? Spectrum.of(a) : Spectrum.of(a, chol);
        if (chol != null && Definiteness.positiveDefinite(sp, Definiteness.INPUT)) {
            return sp;
        }
        Definiteness.Pair p = Definiteness.perfectlyCorrelatedPair(a);
        String pair = "";
        if (p != null) {
            String x = names.get(p.first());
            String y = names.get(p.second());
            String rho = NumberText.show(p.correlation());
            pair = p.outsideRange()
                    ? String.format(Locale.ROOT, "; the implied correlation of '%s' and '%s' is %s, outside [-1, 1]",
                            x, y, rho)
                    : String.format(Locale.ROOT, "; '%s' and '%s' are perfectly correlated (correlation %s)", x, y, rho);
        }
        String smallest = Double.isNaN(sp.smallest()) ? "not computed at this size" : NumberText.show(sp.smallest());
        InputException.Builder b = InputException.of(String.format(Locale.ROOT, "the %s matrix is not positive definite: "
                        + "smallest eigenvalue %s (largest %s)%s, so the minimum-variance portfolio is not unique",
                        what, smallest, NumberText.show(sp.largest()), pair))
                .value(smallest)
                .fix("correct the matrix, drop one asset of a perfectly correlated pair, or repair it to the nearest "
                        + "valid matrix with 'isorisk check --repair'");
        if (t != null) {
            b.file(t.source().path());
        }
        throw b.build();
    }

    private static void percentWarningsReturns(NamedValues mu, Units units, List<String> warnings) {
        int at = largest(mu.values());
        double big = Math.abs(mu.values()[at]);
        String file = mu.table().source().path();
        if (units == Units.DECIMAL && big > 1) {
            warnings.add(String.format(Locale.ROOT, "%s: expected returns look like percent ('%s' has %s, which in "
                    + "decimals means %s a year); if they are percent, add --units percent", file, mu.names().get(at),
                    NumberText.show(mu.values()[at]), org.isorisk.engine.explain.Explain.percent(mu.values()[at])));
        } else if (units == Units.PERCENT && big > 0 && big < 0.5) {
            warnings.add(String.format(Locale.ROOT, "%s: expected returns look like decimals (largest %s) but "
                    + "--units percent divides them by 100; drop --units percent if they are decimals", file,
                    NumberText.show(big)));
        }
    }

    private static void percentWarningsVariance(NamedMatrix m, Units units, List<String> warnings) {
        double[] diag = new double[m.names().size()];
        for (int i = 0; i < diag.length; i++) {
            diag[i] = m.values()[i][i];
        }
        int at = largest(diag);
        String file = m.table().source().path();
        if (units == Units.DECIMAL && diag[at] > 1) {
            warnings.add(String.format(Locale.ROOT, "%s: variances look like percent squared ('%s' has variance %s, a "
                    + "volatility above 100 %%); if they are, add --units percent (divides covariances by 10 000)", file,
                    m.names().get(at), NumberText.show(diag[at])));
        } else if (units == Units.PERCENT && diag[at] < 0.25) {
            warnings.add(String.format(Locale.ROOT, "%s: variances look like decimals (largest %s) but --units percent "
                    + "divides them by 10 000; drop --units percent if they are decimals", file,
                    NumberText.show(diag[at])));
        }
    }

    private static void percentWarningsVolatility(NamedValues v, Units units, List<String> warnings) {
        int at = largest(v.values());
        double big = Math.abs(v.values()[at]);
        String file = v.table().source().path();
        if (units == Units.DECIMAL && big > 1) {
            warnings.add(String.format(Locale.ROOT, "%s: volatilities look like percent ('%s' has %s, which in "
                    + "decimals means %s); if they are percent, add --units percent", file, v.names().get(at),
                    NumberText.show(big), org.isorisk.engine.explain.Explain.percent(big)));
        } else if (units == Units.PERCENT && big < 0.5) {
            warnings.add(String.format(Locale.ROOT, "%s: volatilities look like decimals (largest %s) but --units "
                    + "percent divides them by 100; drop --units percent if they are decimals", file,
                    NumberText.show(big)));
        }
    }

    private static void equalReturnsWarning(NamedValues mu, List<String> warnings) {
        double[] v = mu.values();
        for (double x : v) {
            if (x != v[0]) {
                return;
            }
        }
        warnings.add(String.format(Locale.ROOT, "%s: every asset has the same expected return (%s), so a return target "
                + "or a tangency portfolio cannot be set (only the minimum-variance portfolio)",
                mu.table().source().path(), NumberText.show(v[0])));
    }

    private static int largest(double[] v) {
        int at = 0;
        for (int i = 1; i < v.length; i++) {
            if (Math.abs(v[i]) > Math.abs(v[at])) {
                at = i;
            }
        }
        return at;
    }
}

package org.isorisk.engine.estimate;

import java.math.BigDecimal;
import java.time.LocalDate;
import java.time.temporal.ChronoUnit;
import java.util.ArrayList;
import java.util.EnumMap;
import java.util.HashMap;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import org.isorisk.engine.error.InputException;
import org.isorisk.engine.explain.Explain;
import org.isorisk.engine.linalg.Cholesky;
import org.isorisk.engine.linalg.Spectrum;

/**
 * The front door from a history to assumptions: assesses the data, computes returns, estimates the covariance
 * and the expected returns, annualises both with the same periods per year, and reports conditioning before and
 * after shrinkage.
 * <p>
 * Conventions: annualised mean = periods per year × mean per period; annualised covariance = periods per year ×
 * covariance per period (exact for independent log returns, the usual first-order approximation for simple
 * returns, which are not compounded here). The historical mean is the arithmetic mean of the returns used, for
 * every covariance method.
 */
public final class Estimator {
    private Estimator() {
    }

    /** At most this many findings of one kind are listed; the rest are counted in one more line. */
    public static final int MAX_LISTED = 10;

    /**
     * Estimates assumptions from a history.
     *
     * @param h    the history (not modified)
     * @param s    settings; {@link EstimationSettings#defaults()} for the defaults
     * @param mean where the expected returns come from
     * @return the estimate with its data-quality findings (warnings and notes)
     * @throws InputException when the history has an error (dates out of order or repeated, a non-positive
     *                        price, an impossible return, too few rows): the message is the first error's, with
     *                        the count of the others
     */
    public static Estimate estimate(History h, EstimationSettings s, MeanSpec mean) {
        if (s == null) {
            s = EstimationSettings.defaults();
        }
        if (mean == null) {
            mean = new MeanSpec.Historical();
        }
        int n = h.size();
        int rows = h.length();
        int minRows = h.kind() == ValueKind.PRICES ? 3 : 2;
        if (rows < minRows) {
            throw InputException.of(String.format(Locale.ROOT, "the history has %d data row%s; at least %d %s are "
                            + "needed for a covariance", rows, rows == 1 ? "" : "s", minRows,
                            h.kind() == ValueKind.PRICES ? "prices (2 returns)" : "returns"))
                    .file(h.source()).fix("give a longer history").build();
        }
        Findings f = new Findings();
        checkDates(h, f);
        checkValues(h, s.returnType(), f);
        f.throwIfErrors(h.source());

        // Frequency and the periods-per-year convention.
        LocalDate[] dates = h.dates();
        double median = Frequency.medianGapDays(dates);
        Frequency freq;
        boolean detected = s.frequency() == null;
        if (detected) {
            freq = Frequency.detect(dates, h.source()).frequency();
        } else {
            freq = s.frequency();
            Frequency looks = Frequency.matching(median);
            if (looks != null && looks != freq) {
                f.add(Issue.warning(Issue.Code.FREQUENCY_MISMATCH, null, 0, String.format(Locale.ROOT,
                        "the dates look %s (median interval %s) but the frequency was given as %s; "
                                + "annualisation uses %d periods a year; fix: check --frequency",
                        looks.label(), Frequency.format(median), freq.label(), periodsPerYear(s, freq))));
            }
        }
        int ppy = periodsPerYear(s, freq);
        checkGaps(h, freq, f);

        // Returns per period, NaN where a value is missing.
        double[][] r = returns(h, s.returnType());
        int offset = h.kind() == ValueKind.PRICES ? 1 : 0;
        int nRet = r.length;
        checkStale(h, r, offset, s.staleRun(), f);

        // Missing values.
        int missingCells = 0;
        int[] missingPerAsset = new int[n];
        for (int t = 0; t < rows; t++) {
            for (int j = 0; j < n; j++) {
                if (Double.isNaN(h.value(t, j))) {
                    missingCells++;
                    missingPerAsset[j]++;
                }
            }
        }
        boolean[] complete = new boolean[nRet];
        int nComplete = 0;
        for (int t = 0; t < nRet; t++) {
            boolean ok = true;
            for (int j = 0; j < n && ok; j++) {
                ok = !Double.isNaN(r[t][j]);
            }
            complete[t] = ok;
            nComplete += ok ? 1 : 0;
        }
        boolean pairwise = s.missing() == MissingPolicy.PAIRWISE;
        int used = pairwise ? nRet : nComplete;
        int dropped = pairwise ? 0 : nRet - nComplete;
        String missingText = missingCells == 0 ? "" : describeMissing(h, missingCells, missingPerAsset);
        if (!pairwise && nComplete < 2) {
            throw InputException.of(String.format(Locale.ROOT, "after listwise deletion of the return rows with a "
                            + "missing value only %d of %d return rows remain; at least 2 are needed (%s)", nComplete,
                            nRet, missingText))
                    .file(h.source()).fix("fill the empty cells, remove the assets with most of them, or use "
                            + "--missing pairwise").build();
        }
        if (missingCells > 0) {
            if (pairwise) {
                f.add(Issue.info(Issue.Code.MISSING_CELLS, null, 0, missingText + "; pairwise deletion keeps every "
                        + "return row: each mean uses the returns of its asset and each covariance the rows where "
                        + "both assets have returns"));
                f.add(Issue.warning(Issue.Code.PAIRWISE_DELETION, null, 0, "pairwise deletion can give a covariance "
                        + "matrix that is not positive semi-definite, because its entries come from different rows; "
                        + "check the smallest eigenvalue in this report, or use listwise deletion (the default)"));
            } else {
                f.add(Issue.info(Issue.Code.MISSING_CELLS, null, 0, String.format(Locale.ROOT,
                        "%s; listwise deletion dropped %d of %d return rows, leaving %d", missingText, dropped, nRet,
                        nComplete)));
            }
        }

        // Complete rows as columns x[j][t] (pairwise: all rows, NaN kept).
        double[][] x = new double[n][used];
        int first = -1;
        int last = -1;
        for (int t = 0, k = 0; t < nRet; t++) {
            if (pairwise || complete[t]) {
                for (int j = 0; j < n; j++) {
                    x[j][k] = r[t][j];
                }
                first = first < 0 ? t : first;
                last = t;
                k++;
            }
        }
        checkObservations(used, n, s, f);

        double[] meanPerPeriod;
        double[][] sample;       // per period, divisor n − 1
        double[][] est;          // per period
        double[] sampleVar;      // per period, for the mean's standard errors
        int[] perAssetCount = new int[n];
        Estimate.Shrinkage shrinkage = null;
        double decay = Double.NaN;
        if (pairwise) {
            int[][] counts = new int[n][n];
            sample = Moments.pairwiseCovariance(x, counts);
            meanPerPeriod = new double[n];
            for (int j = 0; j < n; j++) {
                double sum = 0;
                int k = 0;
                for (double v : x[j]) {
                    if (!Double.isNaN(v)) {
                        sum += v;
                        k++;
                    }
                }
                meanPerPeriod[j] = sum / k;
                perAssetCount[j] = k;
                for (int i = 0; i < n; i++) {
                    if (counts[i][j] < 2) {
                        throw InputException.of(String.format(Locale.ROOT, "assets '%s' and '%s' have %d return "
                                        + "row%s in common; a covariance needs at least 2", h.assets().get(i),
                                        h.assets().get(j), counts[i][j], counts[i][j] == 1 ? "" : "s"))
                                .file(h.source()).fix("fill the empty cells or remove one of the two assets").build();
                    }
                }
            }
            est = sample;
        } else {
            java.util.Arrays.fill(perAssetCount, used);
            meanPerPeriod = Moments.means(x);
            double[][] c = Moments.centred(x, meanPerPeriod);
            double[][] gram = Moments.cross(c, c, 1.0);
            sample = scaled(gram, 1.0 / (used - 1));
            checkVariances(h, sample);
            switch (s.method()) {
                case SAMPLE -> est = sample;
                case EWMA -> {
                    decay = s.resolvedDecay(freq);
                    est = ewma(x, decay);
                }
                case LEDOIT_WOLF_IDENTITY -> {
                    LedoitWolf.Result lw = LedoitWolf.identity(c, scaled(gram, 1.0 / used));
                    est = lw.covariance();
                    shrinkage = new Estimate.Shrinkage("scaled identity", lw.intensity());
                }
                case LEDOIT_WOLF_CONSTANT_CORRELATION -> {
                    LedoitWolf.Result lw = LedoitWolf.constantCorrelation(c, scaled(gram, 1.0 / used));
                    est = lw.covariance();
                    shrinkage = new Estimate.Shrinkage("constant correlation", lw.intensity());
                }
                default -> throw new IllegalStateException("unknown method " + s.method());
            }
        }
        sampleVar = new double[n];
        for (int j = 0; j < n; j++) {
            sampleVar[j] = sample[j][j];
        }
        double[][] covAnnual = scaled(est, ppy);
        double[][] sampleAnnual = est == sample ? covAnnual : scaled(sample, ppy);
        Cholesky afterFactor = Cholesky.factor(covAnnual);
        Spectrum after = afterFactor != null ? Spectrum.of(covAnnual, afterFactor) : Spectrum.of(covAnnual);
        Spectrum before = est == sample ? after : spectrum(sampleAnnual);
        if (!(after.smallest() > 0) || afterFactor == null) {
            f.add(Issue.warning(Issue.Code.NOT_POSITIVE_SEMIDEFINITE, null, 0, String.format(Locale.ROOT,
                    "the estimated covariance matrix is not positive definite (smallest eigenvalue %s), so solve "
                            + "will refuse it; fix: use --method ledoit-wolf-identity or "
                            + "ledoit-wolf-constant-correlation, listwise deletion, or repair it (%s)",
                    sci(after.smallest()), Repair.COMMAND)));
        }

        // Expected returns.
        double years = (double) used / ppy;
        double[] mu;
        Estimate.MeanInfo info;
        if (mean instanceof MeanSpec.Historical) {
            mu = new double[n];
            double[] se = new double[n];
            for (int j = 0; j < n; j++) {
                mu[j] = meanPerPeriod[j] * ppy;
                se[j] = Math.sqrt(sampleVar[j] * ppy / ((double) perAssetCount[j] / ppy));
            }
            info = new Estimate.MeanInfo("historical", null, se, years, Double.NaN, Double.NaN, Double.NaN,
                    Double.NaN);
            f.add(historicalWarning(h, se, years));
        } else if (mean instanceof MeanSpec.Supplied sup) {
            mu = byAsset(h, sup.expectedReturns(), sup.source(), "expected return");
            info = new Estimate.MeanInfo("supplied", sup.source(), null, years, Double.NaN, Double.NaN, Double.NaN,
                    Double.NaN);
        } else if (mean instanceof MeanSpec.Implied imp) {
            double[] w = byAsset(h, imp.weights(), imp.source(), "reference weight");
            double[] sw = new double[n];
            double var = 0;
            double sum = 0;
            for (int i = 0; i < n; i++) {
                double v = 0;
                for (int j = 0; j < n; j++) {
                    v += covAnnual[i][j] * w[j];
                }
                sw[i] = v;
                var += w[i] * v;
                sum += w[i];
            }
            double sigmaRef = Math.sqrt(Math.max(0, var));
            double delta = imp.riskAversion();
            if (Double.isNaN(delta)) {
                if (!(sigmaRef > 0)) {
                    throw InputException.of("the reference portfolio has zero volatility, so the Sharpe ratio implies "
                            + "no risk aversion").file(imp.source()).fix("give --risk-aversion instead").build();
                }
                delta = imp.sharpeRatio() / sigmaRef;
            }
            mu = new double[n];
            for (int i = 0; i < n; i++) {
                mu[i] = imp.riskFree() + delta * sw[i];
            }
            if (Math.abs(sum - 1) > 1e-9) {
                f.add(Issue.warning(Issue.Code.REFERENCE_WEIGHTS, null, 0, String.format(Locale.ROOT,
                        "the reference weights sum to %s, not 1; the implied returns are proportional to them",
                        plain(sum))));
            }
            info = new Estimate.MeanInfo("implied", imp.source(), null, years, delta, imp.sharpeRatio(),
                    imp.riskFree(), sigmaRef);
        } else {
            throw new IllegalArgumentException("unknown mean specification " + mean);
        }
        Estimate.Observations obs = new Estimate.Observations(rows, nRet, used, dropped, missingCells,
                h.date(first + offset), h.date(last + offset));
        return new Estimate(h.source(), h.assets(), mu, covAnnual, h.kind(), s.returnType(), freq, detected, median,
                ppy, s.method(), decay, shrinkage, info, obs, before, after, f.list());
    }

    /** The periods per year: the setting when given, else the frequency's convention. */
    static int periodsPerYear(EstimationSettings s, Frequency f) {
        return s.periodsPerYear() > 0 ? s.periodsPerYear() : f.periodsPerYear();
    }

    private static void checkDates(History h, Findings f) {
        Map<LocalDate, Integer> seen = new HashMap<>();
        for (int t = 0; t < h.length(); t++) {
            LocalDate d = h.date(t);
            Integer before = seen.putIfAbsent(d, t);
            if (before != null) {
                f.add(Issue.error(Issue.Code.DUPLICATE_DATE, null, h.row(t), String.format(Locale.ROOT,
                        "date %s appears twice (rows %d and %d); fix: keep one row per date", d, h.row(before),
                        h.row(t))));
            }
            if (t > 0 && d.isBefore(h.date(t - 1))) {
                f.add(Issue.error(Issue.Code.DATES_OUT_OF_ORDER, null, h.row(t), String.format(Locale.ROOT,
                        "dates out of order: row %d (%s) comes after row %d (%s); fix: sort the rows by date, "
                                + "oldest first", h.row(t), d, h.row(t - 1), h.date(t - 1))));
            }
        }
    }

    private static void checkValues(History h, ReturnType type, Findings f) {
        for (int t = 0; t < h.length(); t++) {
            for (int j = 0; j < h.size(); j++) {
                double v = h.value(t, j);
                if (Double.isNaN(v)) {
                    continue;
                }
                String a = h.assets().get(j);
                if (h.kind() == ValueKind.PRICES && !(v > 0)) {
                    f.add(Issue.error(Issue.Code.NON_POSITIVE_PRICE, a, h.row(t), String.format(Locale.ROOT,
                            "price %s of asset '%s' on %s (row %d) is not positive; returns need positive prices; "
                                    + "fix: correct the cell or leave it empty", plain(v), a, h.date(t), h.row(t))));
                } else if (h.kind() == ValueKind.RETURNS && type == ReturnType.SIMPLE && v < -1) {
                    f.add(Issue.error(Issue.Code.RETURN_BELOW_MINUS_ONE, a, h.row(t), String.format(Locale.ROOT,
                            "simple return %s of asset '%s' on %s (row %d) is below -1 (a loss of more than 100 %%); "
                                    + "fix: correct the cell (returns are decimals: 0.01 is 1 %%)", plain(v), a,
                            h.date(t), h.row(t))));
                }
            }
        }
    }

    private static void checkGaps(History h, Frequency freq, Findings f) {
        for (int t = 1; t < h.length(); t++) {
            long days = ChronoUnit.DAYS.between(h.date(t - 1), h.date(t));
            if (days > freq.maxNormalGapDays()) {
                f.add(Issue.warning(Issue.Code.GAP, null, h.row(t), String.format(Locale.ROOT,
                        "gap of %d days between %s (row %d) and %s (row %d), longer than the %d days expected "
                                + "between %s observations; the return across it covers more than one period",
                        days, h.date(t - 1), h.row(t - 1), h.date(t), h.row(t), freq.maxNormalGapDays(),
                        freq.label())));
            }
        }
    }

    /** Returns per period: {@code r[t][j]}; for prices row t is the change from row t to row t + 1. */
    static double[][] returns(History h, ReturnType type) {
        int n = h.size();
        if (h.kind() == ValueKind.RETURNS) {
            return h.values();
        }
        double[][] r = new double[h.length() - 1][n];
        for (int t = 1; t < h.length(); t++) {
            for (int j = 0; j < n; j++) {
                double p0 = h.value(t - 1, j);
                double p1 = h.value(t, j);
                r[t - 1][j] = type == ReturnType.SIMPLE ? p1 / p0 - 1 : Math.log(p1 / p0);
            }
        }
        return r;
    }

    private static void checkStale(History h, double[][] r, int offset, int threshold, Findings f) {
        for (int j = 0; j < h.size(); j++) {
            int start = -1;
            for (int t = 0; t <= r.length; t++) {
                boolean zero = t < r.length && r[t][j] == 0.0;
                if (zero && start < 0) {
                    start = t;
                } else if (!zero && start >= 0) {
                    int len = t - start;
                    if (len >= threshold) {
                        String a = h.assets().get(j);
                        int r0 = h.row(start + offset);
                        int r1 = h.row(t - 1 + offset);
                        f.add(Issue.warning(Issue.Code.STALE_PRICES, a, r0, String.format(Locale.ROOT,
                                "asset '%s' has %d consecutive zero returns from %s to %s (rows %d to %d), at or above "
                                        + "the stale-price threshold of %d: its %s may not have been updated; fix: "
                                        + "check the source, or remove the asset", a, len, h.date(start + offset),
                                h.date(t - 1 + offset), r0, r1, threshold,
                                h.kind() == ValueKind.PRICES ? "prices" : "returns")));
                    }
                    start = -1;
                }
            }
        }
    }

    private static void checkObservations(int used, int n, EstimationSettings s, Findings f) {
        boolean shrink = s.method().shrinks();
        if (used <= n) {
            f.add(Issue.warning(Issue.Code.TOO_FEW_OBSERVATIONS, null, 0, String.format(Locale.ROOT,
                    "too few observations: %d returns for %d assets, so the sample covariance is singular (rank at "
                            + "most %d)%s", used, n, used - 1, shrink
                            ? "; the Ledoit-Wolf shrinkage in use keeps the estimate positive definite"
                            : " and cannot be optimised; fix: use --method ledoit-wolf-identity or "
                            + "ledoit-wolf-constant-correlation, or a longer history")));
        } else if (used < (long) s.fewPerAsset() * n) {
            f.add(Issue.warning(Issue.Code.FEW_OBSERVATIONS, null, 0, String.format(Locale.ROOT,
                    "few observations: %d returns for %d assets (fewer than %d per asset, common practice), so "
                            + "sample estimates are noisy and badly conditioned%s", used, n, s.fewPerAsset(), shrink
                            ? "; the Ledoit-Wolf shrinkage in use reduces the noise"
                            : "; consider --method ledoit-wolf-identity or ledoit-wolf-constant-correlation")));
        }
    }

    private static void checkVariances(History h, double[][] sample) {
        for (int j = 0; j < sample.length; j++) {
            if (!(sample[j][j] > 0)) {
                throw InputException.of("the asset's returns are all equal over the rows used (zero variance), so "
                                + "no covariance or correlation with it can be estimated")
                        .file(h.source()).asset(h.assets().get(j)).fix("remove the asset or check its values").build();
            }
        }
    }

    private static String describeMissing(History h, int cells, int[] perAsset) {
        StringBuilder sb = new StringBuilder();
        sb.append(cells).append(cells == 1 ? " empty cell (" : " empty cells (");
        List<Integer> order = new ArrayList<>();
        for (int j = 0; j < perAsset.length; j++) {
            if (perAsset[j] > 0) {
                order.add(j);
            }
        }
        order.sort((a, b) -> perAsset[b] != perAsset[a] ? perAsset[b] - perAsset[a] : a - b);
        int shown = Math.min(order.size(), 5);
        for (int k = 0; k < shown; k++) {
            int j = order.get(k);
            sb.append(k == 0 ? "" : ", ").append('\'').append(h.assets().get(j)).append("' ").append(perAsset[j]);
        }
        if (order.size() > shown) {
            sb.append(", ").append(order.size() - shown).append(" more assets");
        }
        sb.append(')');
        return sb.toString();
    }

    /**
     * EWMA covariance of complete columns {@code x[j][t]} (oldest first): weights {@code λ^(T−1−t)} normalised to
     * sum to 1, centred on the exponentially weighted mean, no small-sample correction.
     */
    static double[][] ewma(double[][] x, double lambda) {
        int n = x.length;
        int len = x[0].length;
        double[] w = new double[len];
        double sum = 0;
        for (int t = len - 1; t >= 0; t--) {
            w[t] = t == len - 1 ? 1.0 : w[t + 1] * lambda;
            sum += w[t];
        }
        for (int t = 0; t < len; t++) {
            w[t] /= sum;
        }
        double[][] y = new double[n][len];
        for (int j = 0; j < n; j++) {
            double m = 0;
            for (int t = 0; t < len; t++) {
                m += w[t] * x[j][t];
            }
            for (int t = 0; t < len; t++) {
                y[j][t] = Math.sqrt(w[t]) * (x[j][t] - m);
            }
        }
        return Moments.cross(y, y, 1.0);
    }

    private static Issue historicalWarning(History h, double[] se, double years) {
        int lo = 0;
        int hi = 0;
        for (int j = 1; j < se.length; j++) {
            lo = se[j] < se[lo] ? j : lo;
            hi = se[j] > se[hi] ? j : hi;
        }
        String range = lo == hi
                ? String.format(Locale.ROOT, "%s for %s", Explain.percent(se[lo]), h.assets().get(lo))
                : String.format(Locale.ROOT, "from %s for %s to %s for %s", Explain.percent(se[lo]),
                h.assets().get(lo), Explain.percent(se[hi]), h.assets().get(hi));
        return Issue.warning(Issue.Code.HISTORICAL_MEAN, null, 0, String.format(Locale.ROOT,
                "the expected returns are historical means of %.1f years of returns: each has a standard error of "
                        + "about its volatility divided by the square root of the years (here %s), and an "
                        + "optimiser amplifies such errors; treat them as a starting point, or supply your own "
                        + "(--mean file) or use returns implied by a reference portfolio (--mean implied)",
                years, range));
    }

    private static double[] byAsset(History h, Map<String, Double> table, String source, String what) {
        int n = h.size();
        double[] v = new double[n];
        Map<String, Integer> index = new LinkedHashMap<>();
        for (int j = 0; j < n; j++) {
            index.put(h.assets().get(j), j);
        }
        for (String a : table.keySet()) {
            if (!index.containsKey(a)) {
                throw InputException.of("asset is not in the history " + h.source()).file(source).asset(a)
                        .fix("remove its row or add the asset to the history").build();
            }
        }
        for (int j = 0; j < n; j++) {
            Double x = table.get(h.assets().get(j));
            if (x == null) {
                throw InputException.of("no " + what + " for an asset of the history").file(source)
                        .asset(h.assets().get(j)).fix("add a row for it").build();
            }
            v[j] = x;
        }
        return v;
    }

    static double[][] scaled(double[][] a, double factor) {
        double[][] c = new double[a.length][a.length];
        for (int i = 0; i < a.length; i++) {
            for (int j = 0; j < a.length; j++) {
                c[i][j] = a[i][j] * factor;
            }
        }
        return c;
    }

    /** Extreme eigenvalues, with inverse iteration through a Cholesky factor when there is one. */
    static Spectrum spectrum(double[][] a) {
        Cholesky chol = Cholesky.factor(a);
        return chol != null ? Spectrum.of(a, chol) : Spectrum.of(a);
    }

    /** Plain decimal without trailing zeros: 1628.75, -3.5, 0. */
    static String plain(double v) {
        return BigDecimal.valueOf(v).stripTrailingZeros().toPlainString();
    }

    static String sci(double v) {
        return String.format(Locale.ROOT, "%.4g", v);
    }

    /** Findings in the order found, at most {@link #MAX_LISTED} of a kind, the rest counted. */
    private static final class Findings {
        private final List<Issue> list = new ArrayList<>();
        private final Map<Issue.Code, Integer> counts = new EnumMap<>(Issue.Code.class);
        private final Map<Issue.Code, Issue.Severity> severities = new EnumMap<>(Issue.Code.class);

        void add(Issue i) {
            int c = counts.merge(i.code(), 1, Integer::sum);
            severities.putIfAbsent(i.code(), i.severity());
            if (c <= MAX_LISTED) {
                list.add(i);
            }
        }

        List<Issue> list() {
            List<Issue> all = new ArrayList<>(list);
            for (Map.Entry<Issue.Code, Integer> e : counts.entrySet()) {
                if (e.getValue() > MAX_LISTED) {
                    int more = e.getValue() - MAX_LISTED;
                    all.add(new Issue(e.getKey(), severities.get(e.getKey()), null, 0, String.format(Locale.ROOT,
                            "%d more finding%s of the same kind (%s) not listed", more, more == 1 ? "" : "s",
                            e.getKey().label())));
                }
            }
            return all;
        }

        void throwIfErrors(String source) {
            List<Issue> errors = list.stream().filter(i -> i.severity() == Issue.Severity.ERROR).toList();
            if (errors.isEmpty()) {
                return;
            }
            int total = 0;
            for (Map.Entry<Issue.Code, Integer> e : counts.entrySet()) {
                if (severities.get(e.getKey()) == Issue.Severity.ERROR) {
                    total += e.getValue();
                }
            }
            String more = total > 1 ? String.format(Locale.ROOT, " (and %d more error%s)", total - 1,
                    total == 2 ? "" : "s") : "";
            String msg = errors.get(0).message();
            int fix = msg.indexOf("; fix: ");
            msg = fix < 0 ? msg + more : msg.substring(0, fix) + more + msg.substring(fix);
            throw InputException.of(msg).file(source).build();
        }
    }
}

package org.isorisk.engine.estimate;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.time.LocalDate;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import org.isorisk.engine.error.InputException;
import org.isorisk.engine.explain.Explain;
import org.junit.jupiter.api.Test;

/** Each data-quality problem with its exact message. */
class DataQualityTests {

    private static final EstimationSettings DEFAULTS = EstimationSettings.defaults();

    private static List<String> messages(Estimate e, Issue.Code code) {
        return e.issues().stream().filter(i -> i.code() == code).map(Issue::message).toList();
    }

    private static History prices(LocalDate[] dates, double[][] p) {
        return new History("prices.csv", Histories.names(p[0].length), dates, null, p, ValueKind.PRICES);
    }

    @Test
    void aRepeatedDateIsAnErrorNamingBothRows() {
        LocalDate[] d = Histories.weekdays(10);
        d[2] = d[1];
        InputException e = assertThrows(InputException.class,
                () -> Estimator.estimate(prices(d, Histories.prices(Histories.returns(9, 2, 1))), DEFAULTS, null));
        assertEquals("prices.csv: date 2020-01-07 appears twice (rows 3 and 4); fix: keep one row per date",
                e.getMessage());
    }

    @Test
    void datesOutOfOrderAreAnErrorNamingTheRows() {
        LocalDate[] d = Histories.weekdays(10);
        LocalDate tmp = d[1];
        d[1] = d[2];
        d[2] = tmp;
        InputException e = assertThrows(InputException.class,
                () -> Estimator.estimate(prices(d, Histories.prices(Histories.returns(9, 2, 1))), DEFAULTS, null));
        assertEquals("prices.csv: dates out of order: row 4 (2020-01-07) comes after row 3 (2020-01-08); fix: sort "
                + "the rows by date, oldest first", e.getMessage());
    }

    @Test
    void severalErrorsAreCountedInTheOneLineMessage() {
        LocalDate[] d = Histories.weekdays(10);
        d[2] = d[1];
        double[][] p = Histories.prices(Histories.returns(9, 2, 1));
        p[5][0] = 0;
        p[6][1] = -3.5;
        InputException e = assertThrows(InputException.class, () -> Estimator.estimate(prices(d, p), DEFAULTS, null));
        assertEquals("prices.csv: date 2020-01-07 appears twice (rows 3 and 4) (and 2 more errors); fix: keep one row "
                + "per date", e.getMessage());
    }

    @Test
    void aNonPositivePriceIsAnErrorNamingAssetDateAndRow() {
        double[][] p = Histories.prices(Histories.returns(19, 3, 2));
        p[5][2] = 0;
        InputException e = assertThrows(InputException.class,
                () -> Estimator.estimate(prices(Histories.weekdays(20), p), DEFAULTS, null));
        assertEquals("prices.csv: price 0 of asset 'Asset C' on 2020-01-13 (row 7) is not positive; returns need "
                + "positive prices; fix: correct the cell or leave it empty", e.getMessage());
        p[5][2] = -3.5;
        e = assertThrows(InputException.class,
                () -> Estimator.estimate(prices(Histories.weekdays(20), p), DEFAULTS, null));
        assertTrue(e.getMessage().startsWith("prices.csv: price -3.5 of asset 'Asset C' on 2020-01-13 (row 7)"),
                e.getMessage());
    }

    @Test
    void aSimpleReturnBelowMinusOneIsAnErrorButALogReturnIsNot() {
        double[][] r = Histories.returns(20, 2, 3);
        r[3][0] = -1.2;
        History h = new History("returns.csv", Histories.names(2), Histories.weekdays(20), null, r, ValueKind.RETURNS);
        InputException e = assertThrows(InputException.class, () -> Estimator.estimate(h, DEFAULTS, null));
        assertEquals("returns.csv: simple return -1.2 of asset 'Asset A' on 2020-01-09 (row 5) is below -1 (a loss of "
                + "more than 100 %); fix: correct the cell (returns are decimals: 0.01 is 1 %)", e.getMessage());
        Estimate log = Estimator.estimate(h, DEFAULTS.withReturnType(ReturnType.LOG), null);
        assertEquals(20, log.observations().used());
    }

    @Test
    void aGapLongerThanTheFrequencyAllowsIsAWarning() {
        LocalDate[] d = Histories.weekdays(40);
        for (int t = 20; t < 40; t++) {
            d[t] = d[t].plusDays(14);
        }
        Estimate e = Estimator.estimate(prices(d, Histories.prices(Histories.returns(39, 2, 4))), DEFAULTS, null);
        assertEquals(List.of("gap of 17 days between 2020-01-31 (row 21) and 2020-02-17 (row 22), longer than the 5 "
                + "days expected between daily observations; the return across it covers more than one period"),
                messages(e, Issue.Code.GAP));
        assertEquals(Issue.Severity.WARNING, e.issues().stream().filter(i -> i.code() == Issue.Code.GAP).findFirst()
                .orElseThrow().severity());
    }

    @Test
    void missingCellsAreDeletedListwiseByDefaultWithTheCountOfDroppedRows() {
        double[][] p = Histories.prices(Histories.returns(49, 3, 5));
        p[10][0] = Double.NaN;
        p[20][1] = Double.NaN;
        Estimate e = Estimator.estimate(prices(Histories.weekdays(50), p), DEFAULTS, null);
        assertEquals(List.of("2 empty cells ('Asset A' 1, 'Asset B' 1); listwise deletion dropped 4 of 49 return rows, "
                + "leaving 45"), messages(e, Issue.Code.MISSING_CELLS));
        assertEquals(45, e.observations().used());
        assertEquals(4, e.observations().dropped());
        assertEquals(2, e.observations().missingCells());
    }

    @Test
    void pairwiseDeletionKeepsEveryRowAndWarnsAboutPositiveDefiniteness() {
        double[][] p = Histories.prices(Histories.returns(49, 3, 5));
        p[10][0] = Double.NaN;
        p[20][1] = Double.NaN;
        Estimate e = Estimator.estimate(prices(Histories.weekdays(50), p),
                DEFAULTS.withMissing(MissingPolicy.PAIRWISE), null);
        assertEquals(List.of("2 empty cells ('Asset A' 1, 'Asset B' 1); pairwise deletion keeps every return row: each "
                + "mean uses the returns of its asset and each covariance the rows where both assets have returns"),
                messages(e, Issue.Code.MISSING_CELLS));
        assertEquals(List.of("pairwise deletion can give a covariance matrix that is not positive semi-definite, "
                + "because its entries come from different rows; check the smallest eigenvalue in this report, or use "
                + "listwise deletion (the default)"), messages(e, Issue.Code.PAIRWISE_DELETION));
        assertEquals(0, e.observations().dropped());
    }

    @Test
    void pairwiseEstimatesThatAreNotPositiveDefiniteAreFlaggedWithAPointerToTheRepair() {
        // Three assets, each pair observed on its own block of rows: A = B, then B = C, then A = −C.
        double[][] r = new double[30][3];
        java.util.Random rnd = new java.util.Random(6);
        for (int t = 0; t < 30; t++) {
            double z = 0.01 * rnd.nextGaussian();
            double noise = 0.0005 * rnd.nextGaussian();
            if (t < 10) {
                r[t] = new double[] {z, z + noise, Double.NaN};
            } else if (t < 20) {
                r[t] = new double[] {Double.NaN, z, z + noise};
            } else {
                r[t] = new double[] {z, Double.NaN, -z + noise};
            }
        }
        History h = new History("returns.csv", Histories.names(3), Histories.weekdays(30), null, r, ValueKind.RETURNS);
        Estimate e = Estimator.estimate(h, DEFAULTS.withMissing(MissingPolicy.PAIRWISE), null);
        assertTrue(e.after().smallest() < 0, e.after().toString());
        assertEquals(List.of(String.format(Locale.ROOT, "the estimated covariance matrix is not positive definite "
                + "(smallest eigenvalue %.4g), so solve will refuse it; fix: use --method ledoit-wolf-identity or "
                + "ledoit-wolf-constant-correlation, listwise deletion, or repair it (isorisk check --repair)",
                e.after().smallest())), messages(e, Issue.Code.NOT_POSITIVE_SEMIDEFINITE));
        // Listwise deletion leaves no complete row at all here.
        InputException ex = assertThrows(InputException.class, () -> Estimator.estimate(h, DEFAULTS, null));
        assertEquals("returns.csv: after listwise deletion of the return rows with a missing value only 0 of 30 "
                + "return rows remain; at least 2 are needed (30 empty cells ('Asset A' 10, 'Asset B' 10, 'Asset C' "
                + "10)); fix: fill the empty cells, remove the assets with most of them, or use --missing pairwise",
                ex.getMessage());
    }

    @Test
    void aLongRunOfZeroReturnsIsReportedAsStalePrices() {
        double[][] p = Histories.prices(Histories.returns(59, 2, 7));
        for (int t = 21; t <= 27; t++) {
            p[t][1] = p[20][1];
        }
        Estimate e = Estimator.estimate(prices(Histories.weekdays(60), p), DEFAULTS, null);
        assertEquals(List.of("asset 'Asset B' has 7 consecutive zero returns from 2020-02-04 to 2020-02-12 (rows 23 to "
                + "29), at or above the stale-price threshold of 5: its prices may not have been updated; fix: check "
                + "the source, or remove the asset"), messages(e, Issue.Code.STALE_PRICES));
        // Four zero returns stay below the default threshold; a threshold of 4 reports them.
        for (int t = 21; t <= 27; t++) {
            p[t][1] = p[20][1] * (1 + 0.001 * (t - 20));
        }
        for (int t = 31; t <= 34; t++) {
            p[t][1] = p[30][1];
        }
        Estimate short4 = Estimator.estimate(prices(Histories.weekdays(60), p), DEFAULTS, null);
        assertEquals(List.of(), messages(short4, Issue.Code.STALE_PRICES));
        Estimate at4 = Estimator.estimate(prices(Histories.weekdays(60), p), DEFAULTS.withStaleRun(4), null);
        assertEquals(1, messages(at4, Issue.Code.STALE_PRICES).size());
    }

    @Test
    void fewerReturnsThanAssetsIsSaidAndShrinkageRecommended() {
        History h = Histories.returnHistory(30, 40, 8);
        Estimate sample = Estimator.estimate(h, DEFAULTS, null);
        assertEquals(List.of("too few observations: 30 returns for 40 assets, so the sample covariance is singular "
                + "(rank at most 29) and cannot be optimised; fix: use --method ledoit-wolf-identity or "
                + "ledoit-wolf-constant-correlation, or a longer history"),
                messages(sample, Issue.Code.TOO_FEW_OBSERVATIONS));
        Estimate lw = Estimator.estimate(h, DEFAULTS.withMethod(CovarianceMethod.LEDOIT_WOLF_IDENTITY), null);
        assertEquals(List.of("too few observations: 30 returns for 40 assets, so the sample covariance is singular "
                + "(rank at most 29); the Ledoit-Wolf shrinkage in use keeps the estimate positive definite"),
                messages(lw, Issue.Code.TOO_FEW_OBSERVATIONS));
    }

    @Test
    void fewerThanTenReturnsPerAssetIsAWarning() {
        Estimate e = Estimator.estimate(Histories.returnHistory(100, 20, 9), DEFAULTS, null);
        assertEquals(List.of("few observations: 100 returns for 20 assets (fewer than 10 per asset, common practice), "
                + "so sample estimates are noisy and badly conditioned; consider --method ledoit-wolf-identity or "
                + "ledoit-wolf-constant-correlation"), messages(e, Issue.Code.FEW_OBSERVATIONS));
        assertEquals(List.of(), messages(Estimator.estimate(Histories.returnHistory(200, 20, 9), DEFAULTS, null),
                Issue.Code.FEW_OBSERVATIONS));
    }

    @Test
    void aGivenFrequencyThatTheDatesContradictIsAWarning() {
        Estimate e = Estimator.estimate(Histories.returnHistory(50, 2, 10), DEFAULTS.withFrequency(Frequency.MONTHLY),
                null);
        assertEquals(List.of("the dates look daily (median interval 1 day) but the frequency was given as monthly; "
                + "annualisation uses 12 periods a year; fix: check --frequency"),
                messages(e, Issue.Code.FREQUENCY_MISMATCH));
        assertEquals(12, e.periodsPerYear());
    }

    @Test
    void historicalMeansComeWithAWarningAboutEstimationError() {
        Estimate e = Estimator.estimate(Histories.priceHistory(505, 3, 11), DEFAULTS, null);
        double[] se = e.mean().standardErrors();
        int lo = 0;
        int hi = 0;
        for (int j = 1; j < 3; j++) {
            lo = se[j] < se[lo] ? j : lo;
            hi = se[j] > se[hi] ? j : hi;
        }
        assertEquals(List.of("the expected returns are historical means of 2.0 years of returns: each has a standard "
                + "error of about its volatility divided by the square root of the years (here from "
                + Explain.percent(se[lo]) + " for " + e.assets().get(lo) + " to " + Explain.percent(se[hi]) + " for "
                + e.assets().get(hi) + "), and an optimiser amplifies such errors; treat them as a starting point, or "
                + "supply your own (--mean file) or use returns implied by a reference portfolio (--mean implied)"),
                messages(e, Issue.Code.HISTORICAL_MEAN));
    }

    @Test
    void referenceWeightsThatDoNotSumToOneAreAWarning() {
        History h = Histories.priceHistory(100, 2, 12);
        Map<String, Double> w = new LinkedHashMap<>();
        w.put("Asset A", 0.5);
        w.put("Asset B", 0.4);
        Estimate e = Estimator.estimate(h, DEFAULTS, new MeanSpec.Implied(w, 3, Double.NaN, 0, "w.csv"));
        assertEquals(List.of("the reference weights sum to 0.9, not 1; the implied returns are proportional to them"),
                messages(e, Issue.Code.REFERENCE_WEIGHTS));
    }

    @Test
    void tablesThatDoNotCoverTheAssetsNameTheAsset() {
        History h = Histories.priceHistory(100, 2, 12);
        Map<String, Double> mu = new LinkedHashMap<>();
        mu.put("Asset A", 0.05);
        InputException e = assertThrows(InputException.class,
                () -> Estimator.estimate(h, DEFAULTS, new MeanSpec.Supplied(mu, "mu.csv")));
        assertEquals("mu.csv, asset 'Asset B': no expected return for an asset of the history; fix: add a row for it",
                e.getMessage());
        mu.put("Asset B", 0.05);
        mu.put("Asset Z", 0.05);
        e = assertThrows(InputException.class,
                () -> Estimator.estimate(h, DEFAULTS, new MeanSpec.Supplied(mu, "mu.csv")));
        assertEquals("mu.csv, asset 'Asset Z': asset is not in the history prices.csv; fix: remove its row or add the "
                + "asset to the history", e.getMessage());
    }

    @Test
    void tooShortAHistoryOrAFrequencyThatCannotBeToldIsABadInput() {
        double[][] p = {{100, 100}, {101, 99}};
        InputException e = assertThrows(InputException.class,
                () -> Estimator.estimate(prices(Histories.weekdays(2), p), DEFAULTS, null));
        assertEquals("prices.csv: the history has 2 data rows; at least 3 prices (2 returns) are needed for a "
                + "covariance; fix: give a longer history", e.getMessage());
        LocalDate[] d = new LocalDate[20];
        for (int t = 0; t < 20; t++) {
            d[t] = LocalDate.of(2020, 1, 1).plusDays(15L * t);
        }
        e = assertThrows(InputException.class, () -> Estimator.estimate(
                new History("f.csv", Histories.names(2), d, null, Histories.returns(20, 2, 1), ValueKind.RETURNS),
                DEFAULTS, null));
        assertEquals("f.csv, column 'date': cannot tell the frequency from the dates: the median interval is 15 days, "
                + "which is not daily (1-4), weekly (5-10), monthly (25-35) or quarterly (80-100); fix: give the "
                + "frequency (--frequency daily|weekly|monthly|quarterly)", e.getMessage());
    }

    @Test
    void anAssetWithoutVariationIsRefused() {
        double[][] p = Histories.prices(Histories.returns(29, 2, 13));
        for (double[] row : p) {
            row[1] = 50;
        }
        InputException e = assertThrows(InputException.class,
                () -> Estimator.estimate(prices(Histories.weekdays(30), p), DEFAULTS, null));
        assertEquals("prices.csv, asset 'Asset B': the asset's returns are all equal over the rows used (zero "
                + "variance), so no covariance or correlation with it can be estimated; fix: remove the asset or check "
                + "its values", e.getMessage());
    }

    @Test
    void theDailyEwmaPresetIsNotAppliedToOtherFrequencies() {
        LocalDate[] d = new LocalDate[30];
        for (int t = 0; t < 30; t++) {
            d[t] = LocalDate.of(2015, 1, 31).plusMonths(t);
        }
        History h = new History("m.csv", Histories.names(2), d, null, Histories.returns(30, 2, 14), ValueKind.RETURNS);
        InputException e = assertThrows(InputException.class,
                () -> Estimator.estimate(h, DEFAULTS.withMethod(CovarianceMethod.EWMA), null));
        assertEquals("the EWMA preset 0.94 is the RiskMetrics (1996) value for daily data, but the history is monthly; "
                + "fix: give --decay L or --half-life N for monthly data", e.getMessage());
    }

    @Test
    void findingsOfOneKindAreListedUpToTenAndTheRestCounted() {
        LocalDate[] d = Histories.weekdays(80);
        for (int t = 1; t < 80; t++) {
            d[t] = d[t - 1].plusDays(t % 6 == 0 ? 12 : 1);
        }
        Estimate e = Estimator.estimate(prices(d, Histories.prices(Histories.returns(79, 2, 15))), DEFAULTS, null);
        List<String> gaps = messages(e, Issue.Code.GAP);
        assertEquals(Estimator.MAX_LISTED + 1, gaps.size());
        assertEquals("3 more findings of the same kind (gap) not listed", gaps.get(gaps.size() - 1));
    }
}

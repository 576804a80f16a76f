package org.isorisk.engine.estimate;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assumptions.assumeTrue;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import org.isorisk.engine.ExternalTools;
import org.isorisk.engine.Tolerances;
import org.isorisk.engine.error.NoSolutionException;
import org.isorisk.engine.io.DateFormat;
import org.isorisk.engine.io.HistoryReader;
import org.isorisk.engine.model.AllocationRequest;
import org.isorisk.engine.model.Mandate;
import org.isorisk.engine.model.Objective;
import org.isorisk.engine.model.Solution;
import org.isorisk.engine.solve.Allocator;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.EnumSource;

/**
 * The open dataset {@code datasets::EuStockMarkets} shipped with R (Debian r-base-core): exported by
 * {@code eustockmarkets_reference.R}, read by the history reader, and compared with R's own {@code colMeans},
 * {@code cov} and {@code quadprog::solve.QP} (Debian r-cran-quadprog, Goldfarb–Idnani dual method).
 */
class EuStockMarketsTests {

    @TempDir
    static Path dir;
    static Map<String, Double> reference;
    static History prices;

    @BeforeAll
    static void export() throws IOException {
        String r = ExternalTools.rscript();
        ExternalTools.runOrFail(List.of(r, ExternalTools.scripts().resolve("eustockmarkets_reference.R").toString(),
                dir.toString()), 120);
        reference = new HashMap<>();
        List<String> lines = Files.readAllLines(dir.resolve("reference.csv"));
        for (String line : lines.subList(1, lines.size())) {
            String[] f = line.split(",", -1);
            reference.put(f[0] + "|" + f[1] + "|" + f[2], Double.parseDouble(f[3]));
        }
        prices = HistoryReader.read(dir.resolve("eustockmarkets.csv"), ValueKind.PRICES, DateFormat.ISO);
    }

    private static double ref(String quantity, String a, String b) {
        Double v = reference.get(quantity + "|" + a + "|" + b);
        if (v == null) {
            throw new AssertionError("no reference value " + quantity + " " + a + " " + b);
        }
        return v;
    }

    private static Estimate estimate(ReturnType type) {
        // R's ts has frequency 260 (weekdays); the periods-per-year convention is given accordingly.
        return Estimator.estimate(prices, EstimationSettings.defaults().withReturnType(type).withPeriodsPerYear(260),
                null);
    }

    @Test
    void theExportedHistoryIsTheWholeDataset() {
        assertEquals(List.of("DAX", "SMI", "CAC", "FTSE"), prices.assets());
        assertEquals((int) ref("rows", "", ""), prices.length());
        assertEquals(260, (int) ref("periods_per_year", "", ""));
        Estimate e = estimate(ReturnType.SIMPLE);
        assertEquals(Frequency.DAILY, e.frequency());
        assertEquals(1859, e.observations().used());
    }

    @ParameterizedTest
    @EnumSource(ReturnType.class)
    void meansAndCovariancesMatchColMeansAndCov(ReturnType type) {
        Estimate e = estimate(type);
        String k = type.label();
        for (int i = 0; i < 4; i++) {
            String a = e.assets().get(i);
            assertEquals(ref("mean_" + k, a, ""), e.expectedReturns()[i], Tolerances.CLOSED_FORM, "R colMeans " + a);
            for (int j = 0; j < 4; j++) {
                String b = e.assets().get(j);
                assertEquals(ref("cov_" + k, a, b), e.covariance(i, j), Tolerances.CLOSED_FORM, "R cov " + a + "," + b);
            }
        }
    }

    @ParameterizedTest
    @EnumSource(ReturnType.class)
    void theMinimumVariancePortfolioMatchesQuadprog(ReturnType type) {
        Estimate e = estimate(type);
        Solution s = Allocator.solve(AllocationRequest.of(e.universe(), Mandate.fullyInvested(4),
                new Objective.MinimumVariance()));
        for (int i = 0; i < 4; i++) {
            assertEquals(ref("gmv_" + type.label(), e.assets().get(i), ""), s.weight(i), Tolerances.GENERAL,
                    "quadprog::solve.QP, budget only, " + e.assets().get(i));
        }
    }

    @ParameterizedTest
    @EnumSource(ReturnType.class)
    void theLongOnlyMinimumVariancePortfolioMatchesQuadprog(ReturnType type) {
        Estimate e = estimate(type);
        double[] lo = new double[4];
        double[] hi = {Double.POSITIVE_INFINITY, Double.POSITIVE_INFINITY, Double.POSITIVE_INFINITY,
                Double.POSITIVE_INFINITY};
        Mandate longOnly = Mandate.fullyInvested(4).withBounds(lo, hi);
        Solution s;
        try {
            s = Allocator.solve(AllocationRequest.of(e.universe(), longOnly, new Objective.MinimumVariance()));
        } catch (NoSolutionException ex) {
            // Enabled by itself once the bounded solvers are behind Allocator.solve.
            assumeTrue(!ex.getMessage().contains("is not available in this build"),
                    "skipped until the bounded solvers land: " + ex.getMessage());
            throw ex;
        }
        for (int i = 0; i < 4; i++) {
            assertEquals(ref("gmv_long_only_" + type.label(), e.assets().get(i), ""), s.weight(i), Tolerances.GENERAL,
                    "quadprog::solve.QP, budget and w >= 0, " + e.assets().get(i));
        }
    }
}

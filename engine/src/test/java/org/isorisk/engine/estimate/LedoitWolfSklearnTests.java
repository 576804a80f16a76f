package org.isorisk.engine.estimate;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import org.isorisk.engine.ExternalTools;
import org.isorisk.engine.Tolerances;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * Ledoit–Wolf identity-target shrinkage against scikit-learn's {@code LedoitWolf} (Debian python3-sklearn), an
 * independent implementation. Conventions mapped: scikit-learn centres on the sample mean and uses X'X/n, as the
 * paper and this estimator do; this estimator annualises, so its matrix is divided by the periods per year.
 */
class LedoitWolfSklearnTests {

    /** Sizes: more returns than assets, fewer returns than assets, and a longer history. */
    private static final int[][] CASES = {{60, 8, 31}, {30, 40, 32}, {500, 12, 33}};

    @Test
    void intensityAndMatrixMatchScikitLearn(@TempDir Path dir) throws IOException {
        List<History> histories = new ArrayList<>();
        List<String> args = new ArrayList<>();
        args.add(ExternalTools.scripts().resolve("ledoit_wolf_sklearn.py").toString());
        for (int[] c : CASES) {
            History h = Histories.returnHistory(c[0], c[1], c[2]);
            histories.add(h);
            StringBuilder csv = new StringBuilder(String.join(",", h.assets()).replace(' ', '_')).append('\n');
            for (int t = 0; t < h.length(); t++) {
                for (int j = 0; j < h.size(); j++) {
                    csv.append(j == 0 ? "" : ",").append(h.value(t, j));
                }
                csv.append('\n');
            }
            Path file = dir.resolve("returns-" + c[0] + "x" + c[1] + ".csv");
            Files.writeString(file, csv);
            args.add(file.toString());
        }
        JsonNode all = new ObjectMapper().readTree(ExternalTools.python("python3-sklearn", args, 120));
        for (int k = 0; k < CASES.length; k++) {
            check(histories.get(k), all.get(k), CASES[k][0] + " returns, " + CASES[k][1] + " assets");
        }
    }

    private static void check(History h, JsonNode ref, String label) {
        int n = h.size();
        Estimate e = Estimator.estimate(h, EstimationSettings.defaults().withFrequency(Frequency.DAILY)
                .withMethod(CovarianceMethod.LEDOIT_WOLF_IDENTITY), null);
        double delta = ref.get("shrinkage").asDouble();
        assertTrue(delta > 0 && delta < 1, label + ": partial shrinkage expected: " + delta);
        assertEquals(delta, e.shrinkage().intensity(), Tolerances.CLOSED_FORM, label + ": scikit-learn shrinkage_");
        double scale = 0;
        for (int i = 0; i < n; i++) {
            scale = Math.max(scale, ref.get("covariance").get(i).get(i).asDouble());
        }
        for (int i = 0; i < n; i++) {
            for (int j = 0; j < n; j++) {
                double sk = ref.get("covariance").get(i).get(j).asDouble();
                assertEquals(sk, e.covariance(i, j) / e.periodsPerYear(), Tolerances.CLOSED_FORM * scale,
                        label + ": scikit-learn covariance_[" + i + "][" + j + "]");
            }
            // scikit-learn's location_ is the sample mean, which is also the historical expected return per period.
            assertEquals(ref.get("location").get(i).asDouble(), e.expectedReturns()[i] / e.periodsPerYear(),
                    Tolerances.TIGHT, label + ": scikit-learn location_");
        }
    }
}

package org.isorisk.engine.resampling;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import org.isorisk.engine.ExternalTools;
import org.isorisk.engine.error.InputException;
import org.isorisk.engine.random.RandomStreams;
import org.isorisk.engine.random.Xoshiro256PlusPlus;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** Type-7 quantiles by hand and against numpy's default {@code quantile}. */
class QuantilesTests {

    @Test
    void quantilesOfFourValuesByHand() {
        double[] v = {4, 1, 3, 2};
        // Hand-computed: sorted 1 2 3 4, h = 3p; p = 0.5 → h = 1.5 → 2 + 0.5·1; p = 0.05 → h = 0.15 → 1.15;
        // p = 0.95 → h = 2.85 → 3.85.
        assertEquals(2.5, Quantiles.of(v, 0.5), 0.0);
        assertEquals(1.15, Quantiles.of(v, 0.05), 1e-15);
        assertEquals(3.85, Quantiles.of(v, 0.95), 1e-15);
        assertEquals(1, Quantiles.of(v, 0), 0.0);
        assertEquals(4, Quantiles.of(v, 1), 0.0);
        assertEquals(3, Quantiles.of(v, 2.0 / 3), 0.0, "h = 2 exactly: an order statistic");
        assertArrayEquals(new double[] {4, 1, 3, 2}, v, "the input is not modified");
        assertEquals(7.5, Quantiles.of(new double[] {7.5}, 0.3), 0.0, "one value is every quantile");
    }

    @Test
    void badProbabilitiesAndValuesAreRefused() {
        assertThrows(InputException.class, () -> Quantiles.of(new double[] {1, 2}, 1.01));
        assertThrows(InputException.class, () -> Quantiles.of(new double[] {1, 2}, -0.01));
        assertThrows(InputException.class, () -> Quantiles.of(new double[] {1, 2}, Double.NaN));
        assertThrows(IllegalArgumentException.class, () -> Quantiles.of(new double[] {1, Double.NaN}, 0.5));
        assertThrows(IllegalArgumentException.class, () -> Quantiles.of(new double[0], 0.5));
    }

    @Test
    void quantilesAgreeWithNumpyBitForBit(@TempDir Path dir) throws IOException {
        double[] ps = {0, 0.05, 0.5, 0.95, 1, 0.01, 0.25, 0.75, 0.99, 0.123456789, 1.0 / 3, 2.0 / 3, 0.999999};
        List<double[]> sets = new ArrayList<>();
        Xoshiro256PlusPlus g = new RandomStreams(77).stream(0);
        for (int n : new int[] {1, 2, 3, 5, 10, 19, 20, 21, 100, 1000, 10_001}) {
            double[] v = new double[n];
            for (int i = 0; i < n; i++) {
                v[i] = 0.3 * g.nextGaussian() + 0.1;
            }
            sets.add(v);
        }
        sets.add(new double[] {1, 1, 1, 2, 2, 3, -0.5, -0.5}); // ties
        sets.add(new double[] {1e-300, 1e300, -1e300, 0}); // wide range
        List<Map<String, Object>> cases = new ArrayList<>();
        for (double[] v : sets) {
            cases.add(Map.of("values", v, "probabilities", ps));
        }
        Path file = dir.resolve("cases.json");
        ObjectMapper json = new ObjectMapper();
        Files.writeString(file, json.writeValueAsString(cases));
        // numpy.quantile, default method "linear" (Debian python3-numpy).
        JsonNode ref = json.readTree(ExternalTools.python("python3-numpy",
                List.of(ExternalTools.scripts().resolve("quantiles_numpy.py").toString(), file.toString()), 60));
        for (int c = 0; c < sets.size(); c++) {
            double[] ours = Quantiles.of(sets.get(c), ps);
            for (int k = 0; k < ps.length; k++) {
                assertEquals(ref.get(c).get(k).asDouble(), ours[k], 0.0,
                        "case " + c + " (" + sets.get(c).length + " values), p = " + ps[k]);
            }
        }
    }
}

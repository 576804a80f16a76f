package org.isorisk.engine.random;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import org.apache.commons.math3.distribution.NormalDistribution;
import org.apache.commons.math3.stat.inference.KolmogorovSmirnovTest;
import org.isorisk.engine.ExternalTools;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * Wichura's AS241 (1988) against two independent implementations of the normal quantile function, and the
 * normal draws' moments and distribution.
 */
class GaussianTests {

    /**
     * Relative agreement with an independent quantile function: AS241 is accurate to about 1e-16 (Wichura
     * 1988), each reference to a few units in the last place; measured worst case about 1e-15.
     */
    private static final double QUANTILE_AGREEMENT = 2e-15;

    @Test
    void centralQuantilesAgreeWithCommonsMath() {
        // Commons Math's NormalDistribution.inverseCumulativeProbability computes sqrt(2)·erfInv(2p − 1); the
        // subtraction 2p − 1 is exact only for p in [1/4, 1] (Sterbenz), and for p below 1/4 it loses the low
        // digits of p, so the comparison is made where it is exact: p in [1/4, 3/4], both sides of the centre
        // and across AS241's central region.
        NormalDistribution n = new NormalDistribution(0, 1);
        double worst = 0;
        for (int k = 0; k <= 10_000; k++) {
            double p = 0.25 + 0.5 * k / 10_000.0;
            if (p == 0.5) {
                assertEquals(0.0, Gaussian.inverseCdf(p), 0.0, "the median");
                continue;
            }
            double ref = n.inverseCumulativeProbability(p);
            worst = Math.max(worst, Math.abs(Gaussian.inverseCdf(p) - ref) / Math.abs(ref));
        }
        assertTrue(worst <= QUANTILE_AGREEMENT, "worst relative difference from Commons Math: " + worst);
    }

    @Test
    void tailQuantilesReproduceTheirProbabilityUnderCommonsMath() {
        // In the tails Commons Math's inverse loses digits (above), so its distribution function is the
        // reference there: Φ(x) by 0.5·erfc(−x/√2), accurate relative to p. An error dp in p moves x by
        // dp/φ(x) ≈ dp/(p|x|) (Mills' ratio), so a relative error ε in x shows as about ε·x² in p: the check asks
        // Φ(AS241(p)) = p to (QUANTILE_AGREEMENT·x² + 1e-14) relative, the last term for Φ's own rounding.
        NormalDistribution n = new NormalDistribution(0, 1);
        for (int e = 1; e <= 300; e++) {
            for (double m : new double[] {1, 2.5, 7.3}) {
                double p = m * Math.pow(10, -e);
                if (p >= 0.25) {
                    continue;
                }
                double x = Gaussian.inverseCdf(p);
                assertTrue(x < 0, "lower tail p = " + p);
                double back = n.cumulativeProbability(x);
                if (x > -37) { // below about −37 Commons Math's Φ returns 0 (it cuts off at 40 standard deviations)
                    assertEquals(p, back, (QUANTILE_AGREEMENT * x * x + 1e-14) * p, "Φ(AS241(p)) for p = " + p);
                }
            }
        }
    }

    @Test
    void quantilesAgreeWithScipyOverTheWholeRange(@TempDir Path dir) throws IOException {
        // scipy.special.ndtri (the Cephes library's algorithm, Debian python3-scipy, installed with python3-sklearn),
        // an independent implementation of the same function, including both far tails.
        List<Double> ps = new ArrayList<>();
        for (int k = 1; k < 2000; k++) {
            ps.add(k / 2000.0);
        }
        for (int e = 1; e <= 307; e++) {
            ps.add(Math.pow(10, -e));
            ps.add(3 * Math.pow(10, -e));
            if (e <= 15) {
                ps.add(1 - Math.pow(10, -e));
            }
        }
        ps.add(0x1.0p-53);
        ps.add(1 - 0x1.0p-53);
        ps.add(0.075);
        ps.add(0.925);
        ps.add(Math.exp(-25)); // where AS241 switches from its second to its third approximation
        StringBuilder text = new StringBuilder();
        for (double p : ps) {
            text.append(Double.toHexString(p)).append('\n');
        }
        Path file = dir.resolve("probabilities.txt");
        Files.writeString(file, text, StandardCharsets.US_ASCII);
        String out = ExternalTools.python("python3-scipy",
                List.of(ExternalTools.scripts().resolve("normal_quantile_scipy.py").toString(), file.toString()), 60);
        String[] lines = out.strip().split("\n");
        assertEquals(ps.size(), lines.length);
        for (int i = 0; i < lines.length; i++) {
            double ref = Double.parseDouble(lines[i].strip());
            double x = Gaussian.inverseCdf(ps.get(i));
            double rel = ref == 0 ? Math.abs(x) : Math.abs(x - ref) / Math.abs(ref);
            assertTrue(rel <= QUANTILE_AGREEMENT, "p = " + ps.get(i) + ": " + x + " vs scipy " + ref);
        }
    }

    @Test
    void quantilesAreSymmetricAndMonotone() {
        double previous = Double.NEGATIVE_INFINITY;
        for (int k = 1; k < 100_000; k++) {
            double p = k / 100_000.0;
            double x = Gaussian.inverseCdf(p);
            assertTrue(x > previous, "increasing at p = " + p);
            previous = x;
            if (p >= 0.5) {
                // 1 − p is exact for p ≥ 1/2, so the mirror image must be exact too.
                assertEquals(-x, Gaussian.inverseCdf(1 - p), 0.0, "symmetry at p = " + p);
            }
        }
        assertThrows(IllegalArgumentException.class, () -> Gaussian.inverseCdf(0));
        assertThrows(IllegalArgumentException.class, () -> Gaussian.inverseCdf(1));
        assertThrows(IllegalArgumentException.class, () -> Gaussian.inverseCdf(Double.NaN));
    }

    @Test
    void normalDrawsHaveTheMomentsOfTheStandardNormal() {
        Xoshiro256PlusPlus g = new RandomStreams(11).stream(3);
        int n = 1_000_000;
        double[] x = new double[n];
        g.nextGaussians(x);
        double mean = 0;
        for (double v : x) {
            mean += v;
        }
        mean /= n;
        double m2 = 0;
        double m3 = 0;
        double m4 = 0;
        for (double v : x) {
            double d = v - mean;
            m2 += d * d;
            m3 += d * d * d;
            m4 += d * d * d * d;
        }
        m2 /= n;
        m3 /= n;
        m4 /= n;
        double skew = m3 / Math.pow(m2, 1.5);
        double kurt = m4 / (m2 * m2) - 3;
        // Large-sample standard errors of the sample moments of a normal sample (common knowledge, e.g.
        // Kendall & Stuart): mean 1/√n, variance √(2/n), skewness √(6/n), excess kurtosis √(24/n); four of them.
        assertEquals(0, mean, 4 / Math.sqrt(n), "mean");
        assertEquals(1, m2, 4 * Math.sqrt(2.0 / n), "variance");
        assertEquals(0, skew, 4 * Math.sqrt(6.0 / n), "skewness");
        assertEquals(0, kurt, 4 * Math.sqrt(24.0 / n), "excess kurtosis");
    }

    @Test
    void normalDrawsPassKolmogorovSmirnovAgainstCommonsMath() {
        // Commons Math's KolmogorovSmirnovTest against its NormalDistribution(0, 1), three streams.
        KolmogorovSmirnovTest ks = new KolmogorovSmirnovTest();
        NormalDistribution normal = new NormalDistribution(0, 1);
        for (long s = 0; s < 3; s++) {
            double[] x = new double[100_000];
            new RandomStreams(2024).stream(s).nextGaussians(x);
            double p = ks.kolmogorovSmirnovTest(normal, x);
            assertTrue(p > 0.01, "stream " + s + ": p = " + p);
        }
    }
}

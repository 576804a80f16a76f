package org.isorisk.bench;

import static org.junit.jupiter.api.Assertions.assertEquals;

import org.isorisk.engine.model.AssetUniverse;
import org.junit.jupiter.api.Test;

/**
 * Pins the bench's signed-loading factor model to the bit, so that moving or tidying its code cannot change the
 * problems the benchmark figures were measured on. The pinned values were printed by this generator itself
 * (they are regression values, not outside references).
 */
class FactorModelPinTests {

    @Test
    void theSignedFactorModelIsBitForBitTheOneTheFiguresWereMeasuredOn() {
        AssetUniverse small = FactorModel.universe(150, 3);
        assertEquals(0x7c07d8bd180236ffL, hash(small));
        assertEquals(0.0216102603680911, small.expectedReturns()[0]);
        assertEquals(0.07159895007411941, small.covariance()[0][0]);
        assertEquals(0.05727620039022713, small.covariance()[3][7]);
        assertEquals(0.01816796042670979, small.covariance()[149][148]);
        assertEquals("Asset 150", small.assets().get(149));
        AssetUniverse bench = FactorModel.universe(500, 20_260_101L + 500); // the seed the cases use at n = 500
        assertEquals(0xe2a5cd706abb6703L, hash(bench));
        assertEquals(0.016279598097674063, bench.expectedReturns()[0]);
        assertEquals(0.15455463939152986, bench.covariance()[0][0]);
        assertEquals(0.027264505527308344, bench.covariance()[499][498]);
    }

    /** An FNV-style hash over the bits of μ, then Σ row by row. */
    static long hash(AssetUniverse u) {
        long h = 0xcbf29ce484222325L;
        for (double v : u.expectedReturns()) {
            h = (h ^ Double.doubleToLongBits(v)) * 0x100000001b3L;
        }
        for (double[] row : u.covariance()) {
            for (double v : row) {
                h = (h ^ Double.doubleToLongBits(v)) * 0x100000001b3L;
            }
        }
        return h;
    }
}

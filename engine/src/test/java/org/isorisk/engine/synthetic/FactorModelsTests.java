package org.isorisk.engine.synthetic;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.isorisk.engine.linalg.Cholesky;
import org.isorisk.engine.model.AssetUniverse;
import org.junit.jupiter.api.Test;

class FactorModelsTests {

    /**
     * The signed recipe used to live in the bench module; the benchmark figures were measured on its numbers.
     * These values were printed by that generator before the move (regression values, not outside references),
     * so the recipe here must reproduce it to the bit.
     */
    @Test
    void theSignedRecipeIsBitForBitTheOneTheBenchmarkFiguresWereMeasuredOn() {
        AssetUniverse small = FactorModels.signedUniverse(150, 3);
        assertEquals(0x7c07d8bd180236ffL, hash(small));
        assertEquals(0.0216102603680911, small.expectedReturns()[0]);
        assertEquals(0.07159895007411941, small.covariance()[0][0]);
        assertEquals(0.05727620039022713, small.covariance()[3][7]);
        assertEquals(0.01816796042670979, small.covariance()[149][148]);
        assertEquals("Asset 150", small.assets().get(149));
        AssetUniverse bench = FactorModels.signedUniverse(500, 20_260_101L + 500); // the bench cases' seed at n = 500
        assertEquals(0xe2a5cd706abb6703L, hash(bench));
        assertEquals(0.016279598097674063, bench.expectedReturns()[0]);
        assertEquals(0.15455463939152986, bench.covariance()[0][0]);
        assertEquals(0.027264505527308344, bench.covariance()[499][498]);
    }

    @Test
    void bothRecipesAreReproducibleAndPositiveDefinite() {
        AssetUniverse a = FactorModels.signedUniverse(150, 3);
        assertEquals(a, FactorModels.signedUniverse(150, 3));
        assertNotNull(Cholesky.factor(a.covariance()));
        AssetUniverse b = FactorModels.universe(150, 3);
        assertEquals(b, FactorModels.universe(150, 3));
        assertNotNull(Cholesky.factor(b.covariance()));
    }

    @Test
    void theSignedRecipeHasManyMoreNegativeCovariancesThanTheMarketRecipe() {
        // market recipe: every asset loads positively on one dominant factor, so covariances are mostly positive;
        // signed recipe: loadings of either sign and no common factor, so about half are negative (follows from
        // the recipes: the sign of a sum of symmetric products is symmetric about zero)
        int market = negativeCovariances(FactorModels.universe(100, 5));
        int signed = negativeCovariances(FactorModels.signedUniverse(100, 5));
        assertTrue(signed > 100 * 99 / 3, "negative off-diagonal entries, signed recipe: " + signed);
        assertTrue(market < signed / 4, "negative off-diagonal entries, market " + market + ", signed " + signed);
    }

    @Test
    void fewerThanTwoAssetsAreRefused() {
        assertThrows(IllegalArgumentException.class, () -> FactorModels.signedUniverse(1, 3));
        assertThrows(IllegalArgumentException.class, () -> FactorModels.universe(1, 3));
    }

    private static int negativeCovariances(AssetUniverse u) {
        int count = 0;
        double[][] s = u.covariance();
        for (int i = 0; i < s.length; i++) {
            for (int j = 0; j < s.length; j++) {
                if (i != j && s[i][j] < 0) {
                    count++;
                }
            }
        }
        return count;
    }

    /** An FNV-style hash over the bits of μ, then Σ row by row. */
    private static long hash(AssetUniverse u) {
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

package org.isorisk.engine.risk;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;

import java.util.List;
import org.isorisk.engine.error.InputException;
import org.isorisk.engine.model.AssetUniverse;
import org.junit.jupiter.api.Test;

class CorrelationsTests {

    @Test
    void correlationsAreCovarianceOverTheProductOfVolatilities() {
        // Σ built from volatilities (0.1, 0.2, 0.3) and correlations (0.5, -0.2, 0.1): Σij = ρij σi σj
        // (the definition of correlation), so the matrix must come back exactly up to rounding.
        double[] s = {0.1, 0.2, 0.3};
        double[][] rho = {{1, 0.5, -0.2}, {0.5, 1, 0.1}, {-0.2, 0.1, 1}};
        double[][] cov = new double[3][3];
        for (int i = 0; i < 3; i++) {
            for (int j = 0; j < 3; j++) {
                cov[i][j] = rho[i][j] * s[i] * s[j];
            }
        }
        Correlations c = Correlations.of(new AssetUniverse(List.of("A", "B", "C"), new double[3], cov));
        for (int i = 0; i < 3; i++) {
            for (int j = 0; j < 3; j++) {
                assertEquals(rho[i][j], c.get(i, j), 1e-15);
            }
        }
        assertEquals(new Correlations.Pair("A", "C", c.get(0, 2)), c.lowest());
        assertEquals(new Correlations.Pair("A", "B", c.get(0, 1)), c.highest());
        assertEquals((0.5 - 0.2 + 0.1) / 3, c.average(), 1e-15);
    }

    @Test
    void anAssetWithoutVarianceIsNamed() {
        double[][] cov = {{0.01, 0}, {0, 0}};
        InputException e = assertThrows(InputException.class,
                () -> Correlations.of(new AssetUniverse(List.of("A", "Flat"), new double[2], cov)));
        assertEquals("asset 'Flat': the asset has zero variance, so its correlations are undefined (value '0.0'); "
                + "fix: give every asset a positive variance", e.getMessage());
    }
}

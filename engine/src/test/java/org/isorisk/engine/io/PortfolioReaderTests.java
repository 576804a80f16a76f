package org.isorisk.engine.io;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import org.isorisk.engine.Tolerances;
import org.isorisk.engine.error.InputException;
import org.junit.jupiter.api.Test;

class PortfolioReaderTests {

    private static final List<String> U = List.of("A", "B", "C");

    private static PortfolioFile read(String text, Units units) {
        return PortfolioReader.read(Csv.parse("w.csv", "weights", text), U, units);
    }

    private static String error(String text) {
        return assertThrows(InputException.class, () -> read(text, Units.DECIMAL)).getMessage();
    }

    @Test
    void weightsAreAlignedToTheUniverseByName() {
        PortfolioFile p = read("asset,weight\nC,0.5\nA,0.2\nB,0.3\n", Units.DECIMAL);
        assertArrayEquals(new double[] {0.2, 0.3, 0.5}, p.weights());
        assertTrue(p.marketValue().isEmpty());
        assertTrue(p.warnings().isEmpty(), p.warnings().toString());
    }

    @Test
    void marketValuesBecomeWeightsOfTheTotal() {
        PortfolioFile p = read("asset,market_value\nA,250\nB,250\nC,500\n", Units.PERCENT);
        assertArrayEquals(new double[] {0.25, 0.25, 0.5}, p.weights(), Tolerances.TIGHT);
        assertEquals(1000.0, p.marketValue().orElseThrow());
    }

    @Test
    void percentWeightsAreConvertedOrWarnedAbout() {
        assertArrayEquals(new double[] {0.2, 0.3, 0.5},
                read("asset,weight\nA,20\nB,30\nC,50\n", Units.PERCENT).weights(), Tolerances.TIGHT);
        assertEquals(List.of("w.csv: weights add up to 100 and look like percent; if they are, add --units percent"),
                read("asset,weight\nA,20\nB,30\nC,50\n", Units.DECIMAL).warnings());
    }

    @Test
    void unlistedAssetsCountAsZeroWithAWarning() {
        PortfolioFile p = read("asset,weight\nA,0.4\nB,0.6\n", Units.DECIMAL);
        assertArrayEquals(new double[] {0.4, 0.6, 0}, p.weights());
        assertEquals(List.of("w.csv: 1 asset is not listed and counts as weight 0: C"), p.warnings());
    }

    @Test
    void weightsNotAddingUpToOneGetAWarning() {
        assertEquals(List.of("w.csv: weights add up to 0.9, not 1; the portfolio is taken as given"),
                read("asset,weight\nA,0.4\nB,0.3\nC,0.2\n", Units.DECIMAL).warnings());
    }

    @Test
    void badFilesAreRefusedWithRowAndFix() {
        assertEquals("w.csv, row 3, column 'asset', asset 'D': the asset is not in the asset universe (the "
                        + "expected-returns and covariance files); fix: use the names of the expected-returns file, or "
                        + "delete the row", error("asset,weight\nA,0.5\nD,0.5\n"));
        assertEquals("w.csv, row 1: the file has both a 'weight' and a 'market_value' column; fix: keep one of them",
                error("asset,weight,market_value\nA,0.5,1\n"));
        assertEquals("w.csv: no column named 'weight' or 'market_value' in the header (row 1) (value 'asset,w'); fix: "
                + "the layout is " + PortfolioReader.LAYOUT, error("asset,w\nA,1\n"));
        assertEquals("w.csv, column 'market_value': the market values add up to 0, not a positive total; fix: give the "
                + "market value of each holding in the fund's currency", error("asset,market_value\nA,0\n"));
        assertEquals("w.csv, row 2, column 'weight', asset 'A': the number uses a decimal comma (value '0,5'); fix: "
                + NumberText.DECIMAL_COMMA_FIX, error("asset,weight\nA,\"0,5\"\n"));
    }
}

package org.isorisk.notebooks.chart;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.awt.Color;
import java.util.HashSet;
import java.util.List;
import org.isorisk.engine.error.InputException;
import org.junit.jupiter.api.Test;

class PaletteTests {

    @Test
    void theHuesAreTheOkabeItoPalette() {
        // Okabe & Ito (2008), Color Universal Design, the eight published sRGB values.
        assertEquals(new Color(230, 159, 0), Palette.ORANGE);
        assertEquals(new Color(86, 180, 233), Palette.SKY_BLUE);
        assertEquals(new Color(0, 158, 115), Palette.BLUISH_GREEN);
        assertEquals(new Color(240, 228, 66), Palette.YELLOW);
        assertEquals(new Color(0, 114, 178), Palette.BLUE);
        assertEquals(new Color(213, 94, 0), Palette.VERMILLION);
        assertEquals(new Color(204, 121, 167), Palette.REDDISH_PURPLE);
    }

    @Test
    void neighbouringAssetColoursDifferInGreyscaleLightness() {
        List<Color> c = Palette.ASSET_CYCLE;
        assertEquals(14, new HashSet<>(c).size());
        for (int i = 0; i < c.size(); i++) {
            double a = Palette.luma(c.get(i));
            double b = Palette.luma(c.get((i + 1) % c.size()));
            // about 15 % of the grey range apart (common practice for print, no source)
            assertTrue(Math.abs(a - b) >= 38, "colours " + i + " and " + (i + 1) + " print as similar greys");
        }
    }

    @Test
    void anAssetKeepsItsColourAcrossChartsOfARun() {
        AssetColours colours = AssetColours.of(ChartFixtures.SAMPLE_ASSETS);
        assertEquals(colours.colour("Cash"), AssetColours.of(ChartFixtures.SAMPLE_ASSETS).colour("Cash"));
        assertNotEquals(colours.colour("Cash"), colours.colour("Government Bonds"));
        InputException e = assertThrows(InputException.class, () -> colours.colour("Gold"));
        assertEquals("asset 'Gold': the chart has no colour for this asset: it is not in the run's universe; fix: "
                + "build the colour assignment from the same asset list as the chart data", e.getMessage());
    }

    @Test
    void theContextRefusesAMissingHashAndSaysWhenTheDateIsUnknown() {
        assertThrows(InputException.class, () -> new ChartContext(null, "xyz", "Fund"));
        ChartContext c = new ChartContext(null, "ABCDEF0123456789", "");
        assertEquals("as-of date of the assumptions not given \u00b7 inputs #abcdef012345", c.provenanceLine());
    }
}

package org.isorisk.notebooks.chart;

import java.awt.Color;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.isorisk.engine.error.InputException;

/**
 * One colour per asset for every chart of a run, so that "Domestic Equity" is the same colour on the frontier,
 * the weights bands and the risk bars. Create it once from the universe's asset list and pass it to each chart.
 */
public final class AssetColours {
    private final Map<String, Color> colours;

    private AssetColours(Map<String, Color> colours) {
        this.colours = colours;
    }

    /**
     * Assigns {@link Palette#ASSET_CYCLE} to the assets in the given order (repeating after fourteen).
     *
     * @param assets asset names in the universe's order (not modified)
     */
    public static AssetColours of(List<String> assets) {
        if (assets == null || assets.isEmpty()) {
            throw InputException.of("no assets to assign chart colours to").fix("give at least one asset").build();
        }
        Map<String, Color> m = new LinkedHashMap<>();
        for (String a : assets) {
            if (!m.containsKey(a)) {
                m.put(a, Palette.ASSET_CYCLE.get(m.size() % Palette.ASSET_CYCLE.size()));
            }
        }
        return new AssetColours(m);
    }

    /** The asset's colour; fails for an asset the run did not assign. */
    public Color colour(String asset) {
        Color c = colours.get(asset);
        if (c == null) {
            throw InputException.of("the chart has no colour for this asset: it is not in the run's universe")
                    .asset(asset).fix("build the colour assignment from the same asset list as the chart data")
                    .build();
        }
        return c;
    }

    /** True when the asset has a colour. */
    public boolean contains(String asset) {
        return colours.containsKey(asset);
    }

    /** The assets in assignment order. */
    public List<String> assets() {
        return List.copyOf(colours.keySet());
    }
}

package org.isorisk.notebooks.pack;

import java.util.List;
import org.isorisk.notebooks.PackContent;

/**
 * Draws the pack's charts from its results. {@link PackComposer} calls it once with everything a chart may need;
 * it returns the charts it drew (PNG, SVG and, when asked, PDF), named and placed by kind.
 */
@FunctionalInterface
public interface ChartMaker {

    /** Draws the charts {@code results.spec().charts()} asks for. */
    List<PackContent.Chart> draw(PackResults results);
}

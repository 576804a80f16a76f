package org.isorisk.engine.stress;

import java.util.Locale;
import org.isorisk.engine.error.InputException;

/** A grid of return targets written {@code a:b:step} (decimals), e.g. {@code 0.04:0.09:0.0025}. */
public final class TargetGrid {
    private TargetGrid() {
    }

    /** Most targets a grid may have: 10 000, far beyond any committee table; common practice, no source. */
    public static final int MAX_POINTS = 10_000;

    /**
     * Parses {@code a:b:step} into the targets {@code a, a + step, …} up to b (b included when it falls on the grid,
     * within 1e-9 of a step).
     *
     * @param text   the grid as typed
     * @param option the option name for messages, e.g. {@code --targets}
     */
    public static double[] parse(String text, String option) {
        String[] p = text == null ? new String[0] : text.trim().split(":");
        if (p.length != 3) {
            throw InputException.of(option + " must be written from:to:step").value(text)
                    .fix("write e.g. 0.04:0.09:0.0025").build();
        }
        double a;
        double b;
        double step;
        try {
            a = Double.parseDouble(p[0].trim());
            b = Double.parseDouble(p[1].trim());
            step = Double.parseDouble(p[2].trim());
        } catch (NumberFormatException e) {
            throw InputException.of(option + " must be three decimal numbers from:to:step").value(text)
                    .fix("write e.g. 0.04:0.09:0.0025 (decimals, a point as decimal separator)").build();
        }
        return of(a, b, step, option, text);
    }

    static double[] of(double a, double b, double step, String option, String text) {
        if (!Double.isFinite(a) || !Double.isFinite(b) || !(step > 0) || !Double.isFinite(step)) {
            throw InputException.of(option + " needs finite bounds and a positive step").value(text)
                    .fix("write e.g. 0.04:0.09:0.0025").build();
        }
        if (b < a) {
            throw InputException.of(option + ": the end is below the start").value(text)
                    .fix("write the lower target first, e.g. 0.04:0.09:0.0025").build();
        }
        long count = (long) Math.floor((b - a) / step + 1e-9) + 1;
        if (count > MAX_POINTS) {
            throw InputException.of(String.format(Locale.ROOT, "%s has %d targets, more than %d", option, count,
                    MAX_POINTS)).value(text).fix("use a larger step").build();
        }
        double[] t = new double[(int) count];
        for (int k = 0; k < count; k++) {
            t[k] = a + k * step;
        }
        return t;
    }
}

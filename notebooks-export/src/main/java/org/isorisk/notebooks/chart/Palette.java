package org.isorisk.notebooks.chart;

import java.awt.Color;
import java.util.List;

/**
 * The chart colours. The hues are the eight-colour palette published by Okabe and Ito (2008, "Color Universal
 * Design: how to make figures and presentations that are friendly to colorblind people"), chosen because readers
 * with the common colour-vision deficiencies can still tell them apart. Printed in grayscale several of them
 * share a lightness, so charts never rely on colour alone: lines differ in dash, markers in shape, and the asset
 * colours below are ordered so that neighbours (adjacent bands in a stacked chart) alternate light and dark.
 */
public final class Palette {
    private Palette() {
    }

    // Okabe–Ito hues (sRGB values as published).
    public static final Color BLACK = new Color(0x000000);
    public static final Color ORANGE = new Color(0xE69F00);
    public static final Color SKY_BLUE = new Color(0x56B4E9);
    public static final Color BLUISH_GREEN = new Color(0x009E73);
    public static final Color YELLOW = new Color(0xF0E442);
    public static final Color BLUE = new Color(0x0072B2);
    public static final Color VERMILLION = new Color(0xD55E00);
    public static final Color REDDISH_PURPLE = new Color(0xCC79A7);

    /** Neutral greys for axes, grid, guides and the "other" group. */
    public static final Color DARK_GREY = new Color(0x404040);
    public static final Color MID_GREY = new Color(0x8C8C8C);
    public static final Color LIGHT_GREY = new Color(0xD9D9D9);
    public static final Color GRID = new Color(0xEBEBEB);
    /** Near-white fill for hollow-looking markers. */
    public static final Color WHITE_SMOKE = new Color(0xF5F5F5);

    /**
     * Fourteen asset colours: the seven Okabe–Ito hues (black is kept for the frontier itself) plus darker and
     * lighter tints of them, ordered so that the grayscale lightness of neighbours differs by at least about 15 %
     * (luma 0.299R + 0.587G + 0.114B, ITU-R BT.601). After fourteen assets the list repeats; charts with more
     * assets group small ones or thin their labels.
     */
    public static final List<Color> ASSET_CYCLE = List.of(
            BLUE,                       // luma  87
            YELLOW,                     // luma 213
            BLUISH_GREEN,               // luma 106
            ORANGE,                     // luma 162
            VERMILLION,                 // luma 119
            SKY_BLUE,                   // luma 158
            shade(BLUE, 0.5),           // luma  43
            REDDISH_PURPLE,             // luma 151
            shade(BLUISH_GREEN, 0.5),   // luma  53
            tint(ORANGE, 0.5),          // luma 209
            shade(REDDISH_PURPLE, 0.5), // luma  76
            tint(SKY_BLUE, 0.5),        // luma 206
            shade(VERMILLION, 0.5),     // luma  60
            tint(VERMILLION, 0.5));     // luma 187

    /** {@code c} mixed with black: {@code keep} = 1 leaves it unchanged, 0 gives black. */
    static Color shade(Color c, double keep) {
        return new Color((int) Math.round(c.getRed() * keep), (int) Math.round(c.getGreen() * keep),
                (int) Math.round(c.getBlue() * keep));
    }

    /** {@code c} mixed with white: {@code keep} = 1 leaves it unchanged, 0 gives white. */
    static Color tint(Color c, double keep) {
        return new Color((int) Math.round(255 - (255 - c.getRed()) * keep),
                (int) Math.round(255 - (255 - c.getGreen()) * keep), (int) Math.round(255 - (255 - c.getBlue()) * keep));
    }

    /** The same colour with alpha {@code a} in [0, 1]. */
    static Color alpha(Color c, double a) {
        return new Color(c.getRed(), c.getGreen(), c.getBlue(), (int) Math.round(255 * a));
    }

    /** Grayscale lightness (ITU-R BT.601 luma), 0 to 255. */
    static double luma(Color c) {
        return 0.299 * c.getRed() + 0.587 * c.getGreen() + 0.114 * c.getBlue();
    }

    /** Black or white, whichever reads better on {@code background}. */
    static Color textOn(Color background) {
        return luma(background) > 140 ? BLACK : Color.WHITE;
    }
}

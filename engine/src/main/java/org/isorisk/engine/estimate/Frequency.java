package org.isorisk.engine.estimate;

import java.time.LocalDate;
import java.time.temporal.ChronoUnit;
import java.util.Arrays;
import java.util.Locale;
import org.isorisk.engine.error.InputException;

/**
 * Observation frequency of a history, with the periods-per-year convention used to annualise means and
 * covariances: 252 trading days a year for daily data (common practice, no source; 260 weekdays is the other
 * usual choice and can be given instead), 52 weeks, 12 months, 4 quarters.
 */
public enum Frequency {
    DAILY("daily", 252, 1, 4, 5),
    WEEKLY("weekly", 52, 5, 10, 10),
    MONTHLY("monthly", 12, 25, 35, 35),
    QUARTERLY("quarterly", 4, 80, 100, 100);

    private final String label;
    private final int periodsPerYear;
    private final int minMedianGap;
    private final int maxMedianGap;
    private final int maxNormalGap;

    Frequency(String label, int periodsPerYear, int minMedianGap, int maxMedianGap, int maxNormalGap) {
        this.label = label;
        this.periodsPerYear = periodsPerYear;
        this.minMedianGap = minMedianGap;
        this.maxMedianGap = maxMedianGap;
        this.maxNormalGap = maxNormalGap;
    }

    /** The name used on the command line and in reports. */
    public String label() {
        return label;
    }

    /** Default periods per year: 252, 52, 12, 4. */
    public int periodsPerYear() {
        return periodsPerYear;
    }

    /**
     * Longest interval between consecutive dates, in calendar days, that still counts as one period: 5 for daily
     * data (a weekend plus a holiday, e.g. Thursday to Tuesday), 10 weekly, 35 monthly, 100 quarterly. Longer
     * intervals are reported as gaps (common practice, no source).
     */
    public int maxNormalGapDays() {
        return maxNormalGap;
    }

    /** Parses a label such as {@code monthly}; null when unknown. */
    public static Frequency fromLabel(String s) {
        for (Frequency f : values()) {
            if (f.label.equalsIgnoreCase(s)) {
                return f;
            }
        }
        return null;
    }

    /**
     * The frequency whose typical interval contains the median interval between consecutive dates, in calendar
     * days: 1–4 daily, 5–10 weekly, 25–35 monthly, 80–100 quarterly.
     *
     * @param dates   observation dates in order (not modified); at least two
     * @param source  name of the history, for the error message
     * @throws InputException when the median falls between the ranges
     */
    public static Detection detect(LocalDate[] dates, String source) {
        double median = medianGapDays(dates);
        Frequency f = matching(median);
        if (f != null) {
            return new Detection(f, median);
        }
        throw InputException.of(String.format(Locale.ROOT, "cannot tell the frequency from the dates: the median "
                        + "interval is %s, which is not daily (1-4), weekly (5-10), monthly (25-35) or quarterly "
                        + "(80-100)", format(median)))
                .file(source).column("date").fix("give the frequency (--frequency daily|weekly|monthly|quarterly)")
                .build();
    }

    /** The frequency whose range of typical intervals holds {@code medianDays}, or null. */
    static Frequency matching(double medianDays) {
        for (Frequency f : values()) {
            if (medianDays >= f.minMedianGap && medianDays <= f.maxMedianGap) {
                return f;
            }
        }
        return null;
    }

    /** Median of the intervals between consecutive dates, in calendar days (absolute values). */
    static double medianGapDays(LocalDate[] dates) {
        if (dates.length < 2) {
            return Double.NaN;
        }
        long[] gaps = new long[dates.length - 1];
        for (int i = 1; i < dates.length; i++) {
            gaps[i - 1] = Math.abs(ChronoUnit.DAYS.between(dates[i - 1], dates[i]));
        }
        Arrays.sort(gaps);
        int m = gaps.length / 2;
        return gaps.length % 2 == 1 ? gaps[m] : (gaps[m - 1] + gaps[m]) / 2.0;
    }

    /** A number of days in words: "1 day", "7 days", "1.5 days". */
    static String format(double days) {
        String v = days == Math.rint(days) ? String.valueOf((long) days) : String.format(Locale.ROOT, "%.1f", days);
        return v + (days == 1 ? " day" : " days");
    }

    /**
     * A detected frequency.
     *
     * @param frequency     the frequency whose range holds the median interval
     * @param medianGapDays the median interval between consecutive dates, calendar days
     */
    public record Detection(Frequency frequency, double medianGapDays) {
    }
}

package org.isorisk.engine.estimate;

import java.time.DayOfWeek;
import java.time.LocalDate;
import java.util.ArrayList;
import java.util.List;
import java.util.Random;

/** Invented, seeded histories for tests (illustrative numbers, no real data). */
final class Histories {
    private Histories() {
    }

    /** {@code count} consecutive weekdays from Monday 2020-01-06. */
    static LocalDate[] weekdays(int count) {
        LocalDate[] d = new LocalDate[count];
        LocalDate day = LocalDate.of(2020, 1, 6);
        for (int t = 0; t < count; t++) {
            while (day.getDayOfWeek() == DayOfWeek.SATURDAY || day.getDayOfWeek() == DayOfWeek.SUNDAY) {
                day = day.plusDays(1);
            }
            d[t] = day;
            day = day.plusDays(1);
        }
        return d;
    }

    static List<String> names(int n) {
        List<String> a = new ArrayList<>();
        for (int j = 0; j < n; j++) {
            a.add("Asset " + (char) ('A' + j % 26) + (j >= 26 ? String.valueOf(j / 26) : ""));
        }
        return a;
    }

    /**
     * Correlated returns from a one-factor model with fat-ish tails (a factor plus asset noise, each scaled by a
     * random volatility), seeded.
     */
    static double[][] returns(int rows, int n, long seed) {
        Random rnd = new Random(seed);
        double[] beta = new double[n];
        double[] vol = new double[n];
        double[] drift = new double[n];
        for (int j = 0; j < n; j++) {
            beta[j] = 0.3 + 0.9 * rnd.nextDouble();
            vol[j] = 0.004 + 0.012 * rnd.nextDouble();
            drift[j] = 0.0002 + 0.0004 * rnd.nextDouble();
        }
        double[][] r = new double[rows][n];
        for (int t = 0; t < rows; t++) {
            double f = 0.008 * rnd.nextGaussian() * (rnd.nextDouble() < 0.05 ? 2.5 : 1.0);
            for (int j = 0; j < n; j++) {
                r[t][j] = drift[j] + beta[j] * f + vol[j] * rnd.nextGaussian();
            }
        }
        return r;
    }

    /** Prices starting at 100 that compound the given simple returns (one more row than returns). */
    static double[][] prices(double[][] simpleReturns) {
        int n = simpleReturns[0].length;
        double[][] p = new double[simpleReturns.length + 1][n];
        java.util.Arrays.fill(p[0], 100.0);
        for (int t = 0; t < simpleReturns.length; t++) {
            for (int j = 0; j < n; j++) {
                p[t + 1][j] = p[t][j] * (1 + simpleReturns[t][j]);
            }
        }
        return p;
    }

    static History priceHistory(int rows, int n, long seed) {
        double[][] p = prices(returns(rows - 1, n, seed));
        return new History("prices.csv", names(n), weekdays(rows), null, p, ValueKind.PRICES);
    }

    static History returnHistory(int rows, int n, long seed) {
        return new History("returns.csv", names(n), weekdays(rows), null, returns(rows, n, seed), ValueKind.RETURNS);
    }

    /** Column-major copy: {@code out[j][t] = a[t][j]}. */
    static double[][] columns(double[][] a) {
        double[][] c = new double[a[0].length][a.length];
        for (int t = 0; t < a.length; t++) {
            for (int j = 0; j < a[0].length; j++) {
                c[j][t] = a[t][j];
            }
        }
        return c;
    }

    static double maxAbsDiff(double[][] a, double[][] b) {
        double m = 0;
        for (int i = 0; i < a.length; i++) {
            for (int j = 0; j < a[i].length; j++) {
                m = Math.max(m, Math.abs(a[i][j] - b[i][j]));
            }
        }
        return m;
    }

    static double maxAbs(double[][] a) {
        double m = 0;
        for (double[] row : a) {
            for (double v : row) {
                m = Math.max(m, Math.abs(v));
            }
        }
        return m;
    }
}

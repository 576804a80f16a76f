package org.isorisk.engine.resampling;

import org.isorisk.engine.error.InputException;
import org.isorisk.engine.estimate.ReturnMoments;
import org.isorisk.engine.random.RandomStreams;
import org.isorisk.engine.random.Xoshiro256PlusPlus;

/**
 * Bootstrap draws of a history: each draw resamples whole rows (dates) of the history's returns, so that the
 * assets' returns on a date stay together and their co-movement is kept, and re-estimates the assumptions from
 * the resampled rows with the given estimator. With a block length b > 1 it is the moving-block bootstrap
 * (Künsch 1989, "The jackknife and the bootstrap for general stationary observations", Annals of Statistics
 * 17(3)): blocks of b consecutive rows, each starting at a uniformly drawn row among the T − b + 1 possible
 * starts, are laid end to end and the last one is cut at the draw's length; this keeps serial dependence shorter
 * than b. With b = 1 it is the ordinary bootstrap of rows (Efron 1979).
 *
 * <p>Immutable and thread-safe.
 */
public final class BootstrapDraws implements AssumptionDraws {
    private final RandomStreams streams;
    private final double[][] rows;
    private final int periodsPerYear;
    private final int blockLength;
    private final int length;
    private final Reestimation estimator;

    private BootstrapDraws(RandomStreams streams, double[][] rows, int periodsPerYear, int blockLength, int length,
                           Reestimation estimator) {
        this.streams = streams;
        this.rows = rows;
        this.periodsPerYear = periodsPerYear;
        this.blockLength = blockLength;
        this.length = length;
        this.estimator = estimator;
    }

    /**
     * Draws from a history's complete return rows (e.g. {@link ReturnMoments#completeReturnRows}).
     *
     * @param returnRows     {@code returnRows[t][j]}: return of asset j on date t, per period, finite; copied
     * @param periodsPerYear P, to annualise the re-estimated moments
     * @param blockLength    b, rows per block, 1 ≤ b ≤ T (1: rows drawn one by one)
     * @param length         rows per drawn sample, at least 2 (usually T, the history's length)
     * @param estimator      the estimator applied to each sample
     * @param seed           the seed of the draws' streams
     */
    public static BootstrapDraws of(double[][] returnRows, int periodsPerYear, int blockLength, int length,
                                    Reestimation estimator, long seed) {
        int t = returnRows.length;
        if (t < 2) {
            throw InputException.of("a bootstrap needs at least 2 complete return rows").value(t)
                    .fix("give a longer history").build();
        }
        int n = returnRows[0].length;
        double[][] copy = new double[t][];
        for (int r = 0; r < t; r++) {
            if (returnRows[r].length != n) {
                throw new IllegalArgumentException("return row " + r + " has " + returnRows[r].length + " values for "
                        + n + " assets");
            }
            copy[r] = returnRows[r].clone();
            for (double v : copy[r]) {
                if (!Double.isFinite(v)) {
                    throw new IllegalArgumentException("return row " + r + " holds a value that is not finite: " + v);
                }
            }
        }
        if (blockLength < 1 || blockLength > t) {
            throw InputException.of("the block length must lie between 1 and the number of rows, " + t)
                    .key("block_length").value(blockLength).fix("give a block length such as 3").build();
        }
        if (length < 2) {
            throw InputException.of("a drawn sample needs at least 2 rows").key("observations").value(length)
                    .fix("give a length of at least 2, usually the history's").build();
        }
        if (periodsPerYear < 1) {
            throw InputException.of("the periods per year must be at least 1").key("periods_per_year")
                    .value(periodsPerYear).fix("give e.g. 12 for monthly observations").build();
        }
        return new BootstrapDraws(new RandomStreams(seed), copy, periodsPerYear, blockLength, length, estimator);
    }

    @Override
    public DrawnAssumptions draw(long index) {
        int[] pick = rowIndices(index);
        int n = rows[0].length;
        double[][] x = new double[n][pick.length];
        for (int k = 0; k < pick.length; k++) {
            double[] row = rows[pick[k]];
            for (int j = 0; j < n; j++) {
                x[j][k] = row[j];
            }
        }
        ReturnMoments.Result r = ReturnMoments.of(x, estimator.method(), estimator.decay());
        return Annualise.result(index, r, periodsPerYear);
    }

    /**
     * The history rows (zero-based) that draw {@code index} takes, in order: {@code ⌈length/b⌉} block starts
     * drawn uniformly from {@code 0 … T − b}, each followed by its b − 1 successors, cut at the draw's length.
     */
    public int[] rowIndices(long index) {
        Xoshiro256PlusPlus g = streams.stream(index);
        int starts = rows.length - blockLength + 1;
        int[] pick = new int[length];
        for (int k = 0; k < length; k += blockLength) {
            int start = g.nextInt(starts);
            for (int o = 0; o < blockLength && k + o < length; o++) {
                pick[k + o] = start + o;
            }
        }
        return pick;
    }

    @Override
    public long seed() {
        return streams.seed();
    }

    @Override
    public int observations() {
        return length;
    }

    @Override
    public int periodsPerYear() {
        return periodsPerYear;
    }

    /** Rows per block. */
    public int blockLength() {
        return blockLength;
    }

    /** Number of rows in the history drawn from. */
    public int historyLength() {
        return rows.length;
    }

    /** The estimator applied to each draw. */
    public Reestimation estimator() {
        return estimator;
    }
}

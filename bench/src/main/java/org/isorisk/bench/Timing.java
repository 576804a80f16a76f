package org.isorisk.bench;

import java.lang.management.ManagementFactory;
import java.lang.management.MemoryPoolMXBean;
import java.lang.management.MemoryType;
import java.util.Arrays;

/** Median wall-clock time after warm-up, and peak heap use, measured in this process. */
public final class Timing {
    private Timing() {
    }

    /** Work to time; returns something derived from its result so that the JIT cannot drop it. */
    public interface Work {
        double run() throws Exception;
    }

    /**
     * A measurement.
     *
     * @param medianSeconds median over the measured repetitions
     * @param minSeconds    fastest repetition
     * @param maxSeconds    slowest repetition
     * @param peakHeapBytes highest heap occupancy seen during the measured repetitions (all heap pools)
     * @param checksum      sum of the work's return values (printed nowhere; keeps the work alive)
     */
    public record Result(double medianSeconds, double minSeconds, double maxSeconds, long peakHeapBytes, double checksum) {
    }

    /**
     * Least time spent warming up, whatever the count: small problems run in microseconds, and the JIT compiler
     * only compiles a loop after some thousands of passes, so a fixed count of warm-up runs would time
     * interpreted code.
     */
    public static final double WARMUP_SECONDS = 1.0;

    /**
     * Runs at least {@code warmup} unmeasured repetitions of {@code work} (more until {@link #WARMUP_SECONDS}
     * have passed), then {@code reps} measured ones.
     */
    public static Result measure(int warmup, int reps, Work work) throws Exception {
        double checksum = 0;
        long start0 = System.nanoTime();
        for (int i = 0; i < warmup || (warmup > 0 && System.nanoTime() - start0 < WARMUP_SECONDS * 1e9); i++) {
            checksum += work.run();
        }
        System.gc();
        resetPeaks();
        double[] t = new double[reps];
        for (int i = 0; i < reps; i++) {
            long start = System.nanoTime();
            checksum += work.run();
            t[i] = (System.nanoTime() - start) / 1e9;
        }
        long peak = peakHeap();
        Arrays.sort(t);
        double median = reps % 2 == 1 ? t[reps / 2] : 0.5 * (t[reps / 2 - 1] + t[reps / 2]);
        return new Result(median, t[0], t[reps - 1], peak, checksum);
    }

    /** The median of {@code values} (not modified). */
    public static double median(double[] values) {
        double[] t = values.clone();
        Arrays.sort(t);
        int n = t.length;
        return n % 2 == 1 ? t[n / 2] : 0.5 * (t[n / 2 - 1] + t[n / 2]);
    }

    /**
     * Heap in use after full collections ({@link System#gc()} three times, the least use seen): what is still
     * referenced by the caller plus the JVM's own, so the difference of two calls around building something that
     * the caller keeps is that thing's retained size. A figure of live data, unlike {@link Result#peakHeapBytes()},
     * which also counts garbage not yet collected.
     */
    public static long liveHeap() {
        long least = Long.MAX_VALUE;
        for (int i = 0; i < 3; i++) {
            System.gc();
            least = Math.min(least, ManagementFactory.getMemoryMXBean().getHeapMemoryUsage().getUsed());
        }
        return least;
    }

    private static void resetPeaks() {
        for (MemoryPoolMXBean p : ManagementFactory.getMemoryPoolMXBeans()) {
            if (p.getType() == MemoryType.HEAP) {
                p.resetPeakUsage();
            }
        }
    }

    /** Sum over heap pools of their peak use since the last reset (an upper bound of the true joint peak). */
    private static long peakHeap() {
        long sum = 0;
        for (MemoryPoolMXBean p : ManagementFactory.getMemoryPoolMXBeans()) {
            if (p.getType() == MemoryType.HEAP) {
                sum += p.getPeakUsage().getUsed();
            }
        }
        return sum;
    }
}

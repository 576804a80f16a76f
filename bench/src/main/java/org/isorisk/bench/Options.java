package org.isorisk.bench;

import java.util.ArrayList;
import java.util.List;

/**
 * Command-line options shared by every case.
 *
 * @param sizes     problem sizes (number of assets); empty means each case's own default
 * @param reps      measured repetitions (the median is reported); 0 means each case's default
 * @param warmup    least number of unmeasured repetitions first (they also last at least
 *                  {@link Timing#WARMUP_SECONDS}), so that the JIT compiler has compiled the hot loops; 0: none
 * @param threads   worker threads for dense linear algebra; default: available processors
 * @param reference whether to time outside references (numpy) beside isorisk
 */
public record Options(List<Integer> sizes, int reps, int warmup, int threads, boolean reference) {

    public Options {
        sizes = List.copyOf(sizes);
    }

    /** Defaults: each case's sizes and repetitions, 3 warm-up runs, all processors, references on. */
    public static Options defaults() {
        return new Options(List.of(), 0, 3, Runtime.getRuntime().availableProcessors(), true);
    }

    /** The sizes to run: the given ones, or {@code fallback}. */
    public List<Integer> sizesOr(List<Integer> fallback) {
        return sizes.isEmpty() ? fallback : sizes;
    }

    /** The repetitions to measure: the given number, or {@code fallback}. */
    public int repsOr(int fallback) {
        return reps > 0 ? reps : fallback;
    }

    /**
     * Parses {@code --sizes 100,500}, {@code --reps 7}, {@code --warmup 3}, {@code --threads 2},
     * {@code --no-reference}; returns the options and leaves the case names in {@code rest}.
     */
    public static Options parse(String[] args, List<String> rest) {
        Options o = defaults();
        List<Integer> sizes = new ArrayList<>(o.sizes());
        int reps = o.reps();
        int warmup = o.warmup();
        int threads = o.threads();
        boolean reference = o.reference();
        for (int i = 0; i < args.length; i++) {
            String a = args[i];
            switch (a) {
                case "--sizes" -> {
                    sizes.clear();
                    for (String s : value(args, ++i, a).split(",")) {
                        sizes.add(positive(s.trim(), a));
                    }
                }
                case "--reps" -> reps = positive(value(args, ++i, a), a);
                case "--warmup" -> warmup = nonNegative(value(args, ++i, a), a);
                case "--threads" -> threads = positive(value(args, ++i, a), a);
                case "--no-reference" -> reference = false;
                default -> {
                    if (a.startsWith("--")) {
                        throw new IllegalArgumentException("unknown option " + a
                                + " (known: --sizes N,N --reps N --warmup N --threads N --no-reference)");
                    }
                    rest.add(a);
                }
            }
        }
        return new Options(sizes, reps, warmup, threads, reference);
    }

    private static String value(String[] args, int i, String option) {
        if (i >= args.length) {
            throw new IllegalArgumentException(option + " needs a value");
        }
        return args[i];
    }

    private static int positive(String s, String option) {
        int v = nonNegative(s, option);
        if (v < 1) {
            throw new IllegalArgumentException(option + " must be at least 1, not " + s);
        }
        return v;
    }

    private static int nonNegative(String s, String option) {
        try {
            int v = Integer.parseInt(s);
            if (v < 0) {
                throw new NumberFormatException();
            }
            return v;
        } catch (NumberFormatException e) {
            throw new IllegalArgumentException(option + " takes a whole number, not '" + s + "'");
        }
    }
}

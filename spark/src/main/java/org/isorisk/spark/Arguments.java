package org.isorisk.spark;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import org.isorisk.engine.book.BookSpec;
import org.isorisk.engine.book.Job;
import org.isorisk.engine.error.InputException;
import org.isorisk.engine.explain.Caution;
import org.isorisk.engine.io.Units;
import org.isorisk.engine.model.Status;

/**
 * The arguments of the Spark job, named as {@code isorisk batch}'s options: {@code --book}, {@code --job},
 * {@code --expected-returns}, {@code --covariance}, {@code --volatilities}, {@code --correlation},
 * {@code --assumption-sets}, {@code --policy}, {@code --scenarios}, {@code --units}, {@code --out-dir} (not
 * {@code --json}: the single commands' JSON shapes belong to the command line); and the job's own
 * {@code --partitions N} and {@code --format csv|parquet|both} (default both).
 * Paths are Hadoop paths (a local path, {@code hdfs://...}, {@code s3a://...}).
 *
 * @param spec    what to run
 * @param outDir  the output folder
 * @param options partitions and formats
 */
record Arguments(BookSpec spec, String outDir, BookOnSpark.Options options) {

    /** The usage line of a refusal. */
    static final String USAGE = "usage: spark-submit --class org.isorisk.spark.BookOnSpark isorisk-spark.jar --book "
            + "BOOK.csv --job solve|rebalance|stress --out-dir DIR [--expected-returns FILE --covariance FILE] "
            + "[--assumption-sets FILE] [--policy FILE] [--scenarios FILE] [--units decimal|percent] "
            + "[--partitions N] [--format csv|parquet|both]";

    static Arguments parse(String[] args) {
        String book = null;
        String job = null;
        String out = null;
        String mu = null;
        String cov = null;
        String vol = null;
        String cor = null;
        String sets = null;
        String policy = null;
        String scenarios = null;
        Units units = Units.DECIMAL;
        int partitions = 0;
        String format = "both";
        List<String> a = List.of(args);
        for (int i = 0; i < a.size(); i++) {
            String k = a.get(i);
            if (k.equals("--json")) {
                throw refuse("--json (each portfolio's JSON) is written by isorisk batch; the Spark job writes the "
                        + "tables (CSV and Parquet)");
            }
            if (i + 1 >= a.size()) {
                throw refuse("option " + k + " needs a value");
            }
            String v = a.get(++i);
            switch (k) {
                case "--book" -> book = v;
                case "--job" -> job = v;
                case "--out-dir" -> out = v;
                case "--expected-returns" -> mu = v;
                case "--covariance" -> cov = v;
                case "--volatilities" -> vol = v;
                case "--correlation" -> cor = v;
                case "--assumption-sets" -> sets = v;
                case "--policy" -> policy = v;
                case "--scenarios" -> scenarios = v;
                case "--units" -> {
                    units = null;
                    for (Units u : Units.values()) {
                        if (u.label().equals(v.toLowerCase(Locale.ROOT))) {
                            units = u;
                        }
                    }
                    if (units == null) {
                        throw refuse("--units '" + v + "' is not a unit; use decimal or percent");
                    }
                }
                case "--partitions" -> {
                    try {
                        partitions = Integer.parseInt(v);
                    } catch (NumberFormatException e) {
                        throw refuse("--partitions '" + v + "' is not a whole number");
                    }
                }
                case "--format" -> format = v.toLowerCase(Locale.ROOT);
                default -> throw refuse("unknown option " + k);
            }
        }
        if (book == null || job == null || out == null) {
            throw refuse("--book, --job and --out-dir are required");
        }
        Job j = Job.of(job);
        if (j == null) {
            throw refuse("--job '" + job + "' is not known; use solve, rebalance or stress");
        }
        if (!List.of("csv", "parquet", "both").contains(format)) {
            throw refuse("--format '" + format + "' is not known; use csv, parquet or both");
        }
        BookSpec spec = new BookSpec(j, book, mu, cov, vol, cor, sets, policy, scenarios, units, false);
        return new Arguments(spec, out, new BookOnSpark.Options(partitions, !format.equals("parquet"),
                !format.equals("csv")));
    }

    private static InputException refuse(String problem) {
        return InputException.of(problem).fix(USAGE).build();
    }

    /** The summary printed at the end: counts by status, files, time, the caution. */
    static String summary(Arguments a, BookOnSpark.Outcome o, double seconds) {
        List<String> lines = new ArrayList<>();
        lines.add(String.format(Locale.ROOT, "isorisk on Spark: %s for %d portfolios of %s", a.spec().job().label(),
                o.summary().total(), a.spec().book()));
        for (Status s : Status.values()) {
            lines.add(String.format(Locale.ROOT, "  %-14s %,10d", s.label(), o.summary().count(s)));
        }
        lines.add(String.format(Locale.ROOT, "%.1f s; wrote %s: %s", seconds, a.outDir(), String.join(", ",
                o.files())));
        lines.add("Caution: " + Caution.TEXT);
        return String.join("\n", lines);
    }
}

package org.isorisk.engine.bench;

import java.io.IOException;
import java.io.Writer;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.DayOfWeek;
import java.time.LocalDate;
import java.util.Comparator;
import java.util.Locale;
import java.util.Random;
import java.util.stream.Stream;
import org.isorisk.engine.estimate.CovarianceMethod;
import org.isorisk.engine.estimate.EstimationSettings;
import org.isorisk.engine.estimate.Estimate;
import org.isorisk.engine.estimate.Estimator;
import org.isorisk.engine.estimate.History;
import org.isorisk.engine.estimate.ValueKind;
import org.isorisk.engine.io.AssumptionFiles;
import org.isorisk.engine.io.AtomicWrite;
import org.isorisk.engine.io.DateFormat;
import org.isorisk.engine.io.HistoryReader;

/**
 * Benchmark (not a test): ten years of daily prices (2,600 rows) for 500 assets from an invented factor model,
 * written to a temporary CSV; times reading it, estimating with each method, and writing the tables. Target:
 * Ledoit–Wolf estimate under 2 s, with reading not dominating. Each figure is wall time and the process's CPU
 * time over all threads (on a busy machine the wall time includes waiting for a core).
 * <p>
 * Run: {@code java -cp engine/target/classes:engine/target/test-classes:<dependencies>
 * org.isorisk.engine.bench.EstimateBenchmark [rows] [assets] [repeats]}.
 */
public final class EstimateBenchmark {
    private EstimateBenchmark() {
    }

    public static void main(String[] args) throws IOException {
        int rows = args.length > 0 ? Integer.parseInt(args[0]) : 2600;
        int n = args.length > 1 ? Integer.parseInt(args[1]) : 500;
        int repeats = args.length > 2 ? Integer.parseInt(args[2]) : 3;
        Path dir = Files.createTempDirectory("isorisk-bench");
        try {
            Path csv = dir.resolve("history.csv");
            writeHistory(csv, rows, n);
            System.out.printf(Locale.ROOT, "history: %d rows x %d assets, %.1f MB; %d cores; Java %s%n", rows, n,
                    Files.size(csv) / 1e6, Runtime.getRuntime().availableProcessors(),
                    System.getProperty("java.version"));
            for (int rep = 1; rep <= repeats; rep++) {
                long t0 = System.nanoTime();
                long c0 = cpu();
                History h = HistoryReader.read(csv, ValueKind.PRICES, DateFormat.ISO);
                long t1 = System.nanoTime();
                StringBuilder line = new StringBuilder(String.format(Locale.ROOT, "run %d: read %s", rep,
                        ms(t1 - t0, cpu() - c0)));
                Estimate last = null;
                for (CovarianceMethod m : CovarianceMethod.values()) {
                    long s0 = System.nanoTime();
                    long k0 = cpu();
                    last = Estimator.estimate(h, EstimationSettings.defaults().withMethod(m), null);
                    long s1 = System.nanoTime();
                    line.append(String.format(Locale.ROOT, " | %s %s", m.label(), ms(s1 - s0, cpu() - k0)));
                    if (last.shrinkage() != null) {
                        line.append(String.format(Locale.ROOT, " (intensity %.4f)", last.shrinkage().intensity()));
                    }
                }
                long w0 = System.nanoTime();
                long q0 = cpu();
                Path out = dir.resolve("out" + rep);
                Estimate written = last;
                AtomicWrite.folder(out, folder -> AssumptionFiles.estimate(folder, written));
                long w1 = System.nanoTime();
                line.append(String.format(Locale.ROOT, " | write %s", ms(w1 - w0, cpu() - q0)));
                System.out.println(line);
                if (rep == repeats) {
                    System.out.printf(Locale.ROOT, "conditioning (last method): before %.4g, after %.4g; smallest "
                                    + "eigenvalue before %.4g, after %.4g%n", last.before().conditionNumber(),
                            last.after().conditionNumber(), last.before().smallest(), last.after().smallest());
                }
            }
        } finally {
            try (Stream<Path> s = Files.walk(dir)) {
                s.sorted(Comparator.reverseOrder()).forEach(p -> p.toFile().delete());
            }
        }
    }

    /** CPU time of the whole process (all threads), ns: unaffected by other programs competing for the cores. */
    private static long cpu() {
        java.lang.management.OperatingSystemMXBean os = java.lang.management.ManagementFactory
                .getOperatingSystemMXBean();
        return os instanceof com.sun.management.OperatingSystemMXBean sun ? sun.getProcessCpuTime() : -1;
    }

    private static String ms(long wallNs, long cpuNs) {
        return String.format(Locale.ROOT, "%.0f ms (cpu %.0f ms)", wallNs / 1e6, cpuNs / 1e6);
    }

    /** Invented prices: three factors plus asset noise, compounded from 100. */
    static void writeHistory(Path file, int rows, int n) throws IOException {
        Random rnd = new Random(2024);
        double[][] beta = new double[n][3];
        double[] vol = new double[n];
        double[] price = new double[n];
        for (int j = 0; j < n; j++) {
            for (int k = 0; k < 3; k++) {
                beta[j][k] = (k == 0 ? 0.6 : 0.0) + 0.4 * rnd.nextGaussian();
            }
            vol[j] = 0.005 + 0.015 * rnd.nextDouble();
            price[j] = 100;
        }
        try (Writer w = Files.newBufferedWriter(file, StandardCharsets.UTF_8)) {
            StringBuilder sb = new StringBuilder("date");
            for (int j = 0; j < n; j++) {
                sb.append(",Asset ").append(j + 1);
            }
            w.write(sb.append('\n').toString());
            LocalDate d = LocalDate.of(2014, 1, 1);
            for (int t = 0; t < rows; t++) {
                while (d.getDayOfWeek() == DayOfWeek.SATURDAY || d.getDayOfWeek() == DayOfWeek.SUNDAY) {
                    d = d.plusDays(1);
                }
                double[] f = {0.01 * rnd.nextGaussian(), 0.005 * rnd.nextGaussian(), 0.004 * rnd.nextGaussian()};
                sb.setLength(0);
                sb.append(d);
                for (int j = 0; j < n; j++) {
                    if (t > 0) {
                        double r = 0.0003 + beta[j][0] * f[0] + beta[j][1] * f[1] + beta[j][2] * f[2]
                                + vol[j] * rnd.nextGaussian();
                        price[j] *= 1 + r;
                    }
                    sb.append(',').append(String.format(Locale.ROOT, "%.4f", price[j]));
                }
                w.write(sb.append('\n').toString());
                d = d.plusDays(1);
            }
        }
    }
}

package org.isorisk.bench;

import com.sun.management.GarbageCollectionNotificationInfo;
import java.io.BufferedReader;
import java.io.File;
import java.io.InputStreamReader;
import java.lang.management.GarbageCollectorMXBean;
import java.lang.management.ManagementFactory;
import java.lang.management.MemoryUsage;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.concurrent.atomic.AtomicInteger;
import java.util.concurrent.atomic.AtomicLong;
import javax.management.NotificationEmitter;
import javax.management.openmbean.CompositeData;
import org.isorisk.engine.frontier.Frontiers;
import org.isorisk.engine.frontier.Grid;
import org.isorisk.engine.model.AssetUniverse;
import org.isorisk.engine.model.Frontier;
import org.isorisk.engine.model.Mandate;
import org.isorisk.engine.model.SolverSettings;
import org.isorisk.engine.synthetic.FactorModels;

/**
 * The heap check of the critical-line case, in a JVM of its own started with a hard heap limit: builds the
 * whole mandate frontier (both branches) of the case's problem a few times and reports, from the
 * collector's own notifications, the most the heap held at any collection (garbage included) and the most it
 * still held after one, and how many collections there were. Completing at all under the limit is the test: a
 * heap that needed more would end in an {@link OutOfMemoryError}.
 */
public final class HeapProbe {
    private HeapProbe() {
    }

    /** Heap limit of the probe's JVM, as a -Xmx value. */
    static final String LIMIT = "2g";

    /**
     * What the probe saw.
     *
     * @param completed  every frontier was built under the limit
     * @param peakBytes  largest heap occupancy at the start of a collection, or at the end if larger
     * @param afterBytes largest heap occupancy right after a collection
     * @param young      number of young (or mixed) collections
     * @param full       number of full collections
     * @param seconds    wall time of the last frontier
     * @param detail     the probe's output when it did not complete
     */
    record Report(boolean completed, long peakBytes, long afterBytes, int young, int full, double seconds,
                  String detail) {
    }

    /**
     * Runs the probe for the case's model ("bench" or "market") and n assets in a child JVM capped at
     * {@link #LIMIT} and reads its one-line report.
     */
    static Report run(String model, int n, int threads) throws Exception {
        String java = ProcessHandle.current().info().command().orElse("java");
        List<String> cmd = new ArrayList<>(List.of(java, "-Xmx" + LIMIT, "-cp", System.getProperty("java.class.path"),
                HeapProbe.class.getName(), model, Integer.toString(n), Integer.toString(threads)));
        Process p = new ProcessBuilder(cmd).redirectErrorStream(true).redirectInput(new File("/dev/null")).start();
        StringBuilder all = new StringBuilder();
        String last = "";
        try (BufferedReader r = new BufferedReader(new InputStreamReader(p.getInputStream(), StandardCharsets.UTF_8))) {
            for (String line = r.readLine(); line != null; line = r.readLine()) {
                all.append(line).append('\n');
                last = line;
            }
        }
        int rc = p.waitFor();
        String[] f = last.trim().split(" ");
        if (rc != 0 || f.length != 7 || !f[0].equals("heap-probe")) {
            return new Report(false, 0, 0, 0, 0, Double.NaN, all.toString().trim());
        }
        return new Report(f[1].equals("ok"), Long.parseLong(f[2]), Long.parseLong(f[3]), Integer.parseInt(f[4]),
                Integer.parseInt(f[5]), Double.parseDouble(f[6]), "");
    }

    /** Child side: {@code HeapProbe model n threads}; prints {@code heap-probe ok peak after young full seconds}. */
    public static void main(String[] args) throws Exception {
        String model = args[0];
        int n = Integer.parseInt(args[1]);
        int threads = Integer.parseInt(args[2]);
        AtomicLong peak = new AtomicLong();
        AtomicLong after = new AtomicLong();
        AtomicInteger young = new AtomicInteger();
        AtomicInteger full = new AtomicInteger();
        for (GarbageCollectorMXBean gc : ManagementFactory.getGarbageCollectorMXBeans()) {
            ((NotificationEmitter) gc).addNotificationListener((note, handback) -> {
                if (!note.getType().equals(GarbageCollectionNotificationInfo.GARBAGE_COLLECTION_NOTIFICATION)) {
                    return;
                }
                GarbageCollectionNotificationInfo info =
                        GarbageCollectionNotificationInfo.from((CompositeData) note.getUserData());
                long before = 0;
                long left = 0;
                for (MemoryUsage u : info.getGcInfo().getMemoryUsageBeforeGc().values()) {
                    before += u.getUsed();
                }
                for (MemoryUsage u : info.getGcInfo().getMemoryUsageAfterGc().values()) {
                    left += u.getUsed();
                }
                peak.accumulateAndGet(before, Math::max);
                after.accumulateAndGet(left, Math::max);
                (info.getGcAction().contains("major") ? full : young).incrementAndGet();
            }, null, null);
        }
        AssetUniverse u = model.equals("bench") ? FactorModels.signedUniverse(n, CriticalLineCase.SEED + n)
                : FactorModels.universe(n, FactorModels.DEFAULT_SEED);
        Mandate m = FactorModels.longOnlyCapped(n);
        SolverSettings settings = SolverSettings.defaults().withThreads(threads);
        double seconds = Double.NaN;
        int corners = 0;
        for (int rep = 0; rep < 3; rep++) {
            long t0 = System.nanoTime();
            Frontier fr = Frontiers.mandate(u, m, Grid.none(), true, settings);
            seconds = (System.nanoTime() - t0) / 1e9;
            corners += fr.corners().size() + fr.inefficientCorners().size();
        }
        Thread.sleep(200); // notifications arrive on another thread
        peak.accumulateAndGet(ManagementFactory.getMemoryMXBean().getHeapMemoryUsage().getUsed(), Math::max);
        System.out.printf(Locale.ROOT, "heap-probe %s %d %d %d %d %.3f%n", corners > 0 ? "ok" : "empty", peak.get(),
                after.get(), young.get(), full.get(), seconds);
    }
}

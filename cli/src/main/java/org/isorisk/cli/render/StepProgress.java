package org.isorisk.cli.render;

import java.io.PrintWriter;
import java.time.Duration;
import java.util.Locale;
import java.util.concurrent.Executors;
import java.util.concurrent.ScheduledExecutorService;
import java.util.concurrent.TimeUnit;
import org.isorisk.engine.stress.StressProgress;

/**
 * Progress of a command made of steps (the pack: portfolios, frontier, trades, stress runs, charts, files) on
 * standard error, never on standard output. A step is shown only once it has run for {@link #AFTER} (one second),
 * so a quick run prints nothing. Not on a terminal (a file, a pipe, CI) each update is one plain line without
 * control characters: the step when it has run a second ({@code pack: drawing the charts ...}), for a step that
 * counts its solves a line at every further tenth of them ({@code pack: stress scenarios at the targets: 12 of 40
 * solves done (30 %)}), and the time the step took when it ends ({@code pack: drawing the charts done in 2.3 s}).
 * On a terminal one line is redrawn in place (with the time so far) and cleared when the step ends. Thread-safe: the
 * stress runs report from worker threads, and a timer thread announces a step that has run long.
 */
public final class StepProgress implements AutoCloseable {
    /** How long a step runs before it is shown: one second. */
    public static final Duration AFTER = Duration.ofSeconds(1);
    /** How often the timer looks at the running step, and the least time between two redraws on a terminal. */
    static final long TICK_MILLIS = 100;

    private final PrintWriter err;
    private final boolean terminal;
    private final String label;
    private final long afterNanos;
    private final ScheduledExecutorService timer;

    private String step;
    private long started;
    private boolean shown;
    private int done;
    private int total;
    private int lastTenth = -1;
    private long lastDraw;
    private boolean drawn;

    /**
     * Progress shown after {@link #AFTER}, checked by a timer thread.
     *
     * @param err      standard error
     * @param terminal true when standard error is a terminal ({@link ProgressLine#stderrIsTerminal()})
     * @param label    the command, at the start of each line, e.g. "pack"
     */
    public StepProgress(PrintWriter err, boolean terminal, String label) {
        this(err, terminal, label, AFTER, true);
    }

    /**
     * @param after how long a step runs before it is shown ({@link Duration#ZERO}: at once, for tests)
     * @param timer true to announce a silent long step from a timer thread; false to look only when the step
     *              reports (tests)
     */
    StepProgress(PrintWriter err, boolean terminal, String label, Duration after, boolean timer) {
        this.err = err;
        this.terminal = terminal;
        this.label = label;
        this.afterNanos = after.toNanos();
        if (timer) {
            this.timer = Executors.newSingleThreadScheduledExecutor(r -> {
                Thread t = new Thread(r, "isorisk-progress");
                t.setDaemon(true);
                return t;
            });
            this.timer.scheduleAtFixedRate(this::tick, TICK_MILLIS, TICK_MILLIS, TimeUnit.MILLISECONDS);
        } else {
            this.timer = null;
        }
    }

    /** A step starts, e.g. "sampling the frontier"; the one before it ends. */
    public synchronized void step(String what) {
        end();
        step = what;
        started = System.nanoTime();
        shown = false;
        done = 0;
        total = 0;
        lastTenth = -1;
        tick();
    }

    /** A step that counts its solves starts; the progress returned receives the counts (from any thread). */
    public StressProgress counted(String what) {
        step(what);
        return (d, t, point) -> count(what, d, t);
    }

    private synchronized void count(String what, int d, int t) {
        if (!what.equals(step) || t <= 0) {
            return; // a count of a step that has ended
        }
        done = d;
        total = t;
        tick();
    }

    /** Looks at the running step: shows it when it has run long enough, and its count when it moved on. */
    synchronized void tick() {
        if (step == null) {
            return;
        }
        long now = System.nanoTime();
        if (now - started < afterNanos) {
            return;
        }
        if (terminal) {
            if (now - lastDraw < TICK_MILLIS * 1_000_000L && shown) {
                return;
            }
            lastDraw = now;
            shown = true;
            drawn = true;
            err.print(String.format(Locale.ROOT, "\r%-78s", line(now)));
            err.flush();
            return;
        }
        if (!shown) {
            shown = true;
            err.println(line(now));
            err.flush();
            lastTenth = total > 0 ? (int) Math.floor(10.0 * done / total) : 0;
            return;
        }
        if (total > 0) {
            int tenth = (int) Math.floor(10.0 * done / total);
            if (tenth > lastTenth) {
                lastTenth = tenth;
                err.println(line(now));
                err.flush();
            }
        }
    }

    /** "pack: drawing the charts ...", "pack: stress ...: 12 of 40 solves done (30 %)"; on a terminal with the time. */
    private String line(long now) {
        String counts = total > 0 ? String.format(Locale.ROOT, ": %d of %d solves done (%d %%)", done, total,
                100 * done / total) : terminal ? "" : " ...";
        return label + ": " + step + counts + (terminal ? ", " + seconds(now - started) : "");
    }

    private static String seconds(long nanos) {
        return String.format(Locale.ROOT, "%.1f s", nanos / 1e9);
    }

    /** Ends the running step: a step that was shown says how long it took. */
    private void end() {
        if (step == null || !shown) {
            step = null;
            return;
        }
        String took = String.format(Locale.ROOT, "%s: %s done in %s", label, step, seconds(System.nanoTime() - started));
        if (terminal) {
            err.print(String.format(Locale.ROOT, "\r%-78s\r", ""));
            drawn = false;
        }
        err.println(took);
        err.flush();
        step = null;
    }

    /** Ends the last step and stops the timer. */
    @Override
    public synchronized void close() {
        if (timer != null) {
            timer.shutdownNow();
        }
        end();
        if (terminal && drawn) {
            err.println();
        }
        err.flush();
    }
}

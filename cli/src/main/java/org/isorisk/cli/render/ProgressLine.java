package org.isorisk.cli.render;

import java.io.PrintWriter;
import java.util.Locale;
import org.isorisk.engine.batch.Progress;
import org.isorisk.engine.stress.StressProgress;

/**
 * Progress of a long sweep on standard error, never on standard output. On a terminal one line is redrawn in
 * place (carriage return, at most ten times a second); otherwise (a file, a pipe, CI) a plain line is written at
 * every tenth of the work, so that logs stay short and free of control characters. Thread-safe: the engine
 * reports from its worker threads.
 */
public final class ProgressLine implements StressProgress, Progress.Listener, AutoCloseable {
    /** Width of the bar drawn on a terminal, in characters. */
    static final int WIDTH = 30;
    /** Smallest interval between two redraws on a terminal: 100 ms. */
    static final long REDRAW_NANOS = 100_000_000L;

    private final PrintWriter err;
    private final boolean terminal;
    private final String label;
    private long lastDraw;
    private int lastTenth = -1;
    private boolean drawn;

    /**
     * @param err      standard error
     * @param terminal true when standard error is a terminal (redraw in place)
     * @param label    what is running, e.g. "stress"
     */
    public ProgressLine(PrintWriter err, boolean terminal, String label) {
        this.err = err;
        this.terminal = terminal;
        this.label = label;
    }

    /** True when this JVM's standard streams are attached to a terminal. */
    public static boolean stderrIsTerminal() {
        return System.console() != null && System.getenv("TERM") != null && !"dumb".equals(System.getenv("TERM"));
    }

    @Override
    public synchronized void step(int done, int total, String what) {
        if (total <= 0) {
            return;
        }
        if (terminal) {
            long now = System.nanoTime();
            if (done < total && now - lastDraw < REDRAW_NANOS) {
                return;
            }
            lastDraw = now;
            int filled = (int) Math.round(WIDTH * (double) done / total);
            String bar = "#".repeat(filled) + ".".repeat(WIDTH - filled);
            err.print(String.format(Locale.ROOT, "\r%s [%s] %d/%d %-40s", label, bar, done, total, clip(what)));
            err.flush();
            drawn = true;
        } else {
            int tenth = (int) Math.floor(10.0 * done / total);
            if (tenth > lastTenth) {
                lastTenth = tenth;
                err.println(String.format(Locale.ROOT, "%s: %d of %d solves done (%d %%)", label, done, total,
                        100 * done / total));
                err.flush();
            }
        }
    }

    /**
     * A book run's progress: count, rate and time left ({@code done} of {@code total} portfolios); on a terminal
     * one redrawn line, otherwise a line at every tenth.
     */
    @Override
    public synchronized void update(Progress p) {
        long total = p.total();
        if (total <= 0) {
            return;
        }
        String rate = Double.isNaN(p.perSecond()) ? "" : String.format(Locale.ROOT, ", %,.0f a second", p.perSecond());
        String left = Double.isNaN(p.secondsLeft()) ? "" : ", about " + duration(p.secondsLeft()) + " left";
        if (terminal) {
            long now = System.nanoTime();
            if (p.done() < total && now - lastDraw < REDRAW_NANOS) {
                return;
            }
            lastDraw = now;
            int filled = (int) Math.round(WIDTH * (double) p.done() / total);
            String bar = "#".repeat(filled) + ".".repeat(WIDTH - filled);
            err.print(String.format(Locale.ROOT, "\r%s [%s] %,d/%,d%s%s   ", label, bar, p.done(), total, rate, left));
            err.flush();
            drawn = true;
        } else {
            int tenth = (int) Math.floor(10.0 * p.done() / total);
            if (tenth > lastTenth) {
                lastTenth = tenth;
                err.println(String.format(Locale.ROOT, "%s: %d of %d portfolios done (%d %%)%s%s", label, p.done(),
                        total, 100 * p.done() / total, rate, left));
                err.flush();
            }
        }
    }

    /** Seconds as people read them: {@code 42 s}, {@code 3 min 05 s}, {@code 1 h 02 min}. */
    static String duration(double seconds) {
        long s = Math.round(seconds);
        if (s < 60) {
            return s + " s";
        }
        if (s < 3600) {
            return String.format(Locale.ROOT, "%d min %02d s", s / 60, s % 60);
        }
        return String.format(Locale.ROOT, "%d h %02d min", s / 3600, (s % 3600) / 60);
    }

    private static String clip(String s) {
        return s.length() <= 40 ? s : s.substring(0, 39) + "…";
    }

    /** Ends the redrawn line so that what follows starts on a fresh line. */
    @Override
    public synchronized void close() {
        if (terminal && drawn) {
            err.println();
            err.flush();
        }
    }
}

package org.isorisk.bench;

import java.io.PrintStream;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;

/**
 * Entry point of {@code bench/run}: {@code list}, {@code all}, or case names, with shared options
 * ({@link Options#parse}). Exit codes: 0 done, 2 usage error, 1 a case failed.
 */
public final class Bench {
    private Bench() {
    }

    static final String USAGE = "usage: bench/run list | all | CASE... [--sizes N,N,...] [--reps N] [--warmup N] "
            + "[--threads N] [--no-reference]";

    public static void main(String[] args) {
        System.exit(run(args, System.out, System.err));
    }

    /** Runs the command line and returns the exit code. */
    static int run(String[] args, PrintStream out, PrintStream err) {
        List<String> names = new ArrayList<>();
        Options options;
        try {
            options = Options.parse(args, names);
        } catch (IllegalArgumentException e) {
            err.println("bench: " + e.getMessage());
            err.println(USAGE);
            return 2;
        }
        Map<String, BenchCase> cases = Cases.all();
        if (names.isEmpty() || names.contains("help")) {
            (names.isEmpty() ? err : out).println(USAGE);
            return names.isEmpty() ? 2 : 0;
        }
        if (names.equals(List.of("list"))) {
            for (BenchCase c : cases.values()) {
                out.printf("%-16s %s%n", c.name(), c.description());
            }
            return 0;
        }
        List<BenchCase> run = new ArrayList<>();
        for (String name : names) {
            if (name.equals("all")) {
                run.addAll(cases.values());
            } else if (cases.containsKey(name)) {
                run.add(cases.get(name));
            } else {
                err.println("bench: unknown case '" + name + "' (bench/run list shows the cases)");
                return 2;
            }
        }
        for (BenchCase c : run) {
            out.println("== " + c.name() + ": " + c.description());
            try {
                c.run(options, out);
            } catch (Exception e) {
                err.println("bench: case " + c.name() + " failed: " + e);
                return 1;
            }
            out.println();
        }
        return 0;
    }
}

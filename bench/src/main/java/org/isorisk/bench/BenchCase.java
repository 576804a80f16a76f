package org.isorisk.bench;

import java.io.PrintStream;

/** One named benchmark: generates its own inputs, measures, and prints a table. */
public interface BenchCase {

    /** The name used on the command line, e.g. {@code closed-form}. */
    String name();

    /** One line saying what is measured. */
    String description();

    /**
     * Runs the case and prints its table.
     *
     * @param options sizes, repetitions, threads and whether to run outside references
     * @param out     where the table goes
     */
    void run(Options options, PrintStream out) throws Exception;
}

package org.isorisk.cli.commands;

/** What the {@link ErrorHandler} needs to know about the command that failed. */
public interface Reporting {

    /** True when the command was asked for JSON, so that errors are also printed as a JSON object. */
    boolean jsonOutput();

    /** Milliseconds since the command started (excluding JVM start-up). */
    double elapsedMillis();
}

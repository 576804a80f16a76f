package org.isorisk.cli.commands;

/** The process exit codes, documented in the README. */
public enum ExitCode {
    /** Success (also for {@code --help} and {@code --version}). */
    OK(0),
    /** An internal error: a bug, reported with its stack trace. */
    INTERNAL(1),
    /** Bad input or usage: a file, cell, asset or option that cannot be used as given. */
    BAD_INPUT(2),
    /** The inputs are valid but the problem has no (unique) solution. */
    NO_SOLUTION(3);

    private final int code;

    ExitCode(int code) {
        this.code = code;
    }

    /** The number the process exits with. */
    public int code() {
        return code;
    }
}

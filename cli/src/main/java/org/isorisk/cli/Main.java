package org.isorisk.cli;

import java.io.FileDescriptor;
import java.io.FileOutputStream;
import java.io.OutputStreamWriter;
import java.io.PrintWriter;
import java.nio.charset.StandardCharsets;

/** Entry point of the {@code isorisk} command; the only place that calls {@link System#exit(int)}. */
public final class Main {
    private Main() {
    }

    public static void main(String[] args) {
        // UTF-8 whatever the platform's default, so that asset names and symbols print the same everywhere.
        PrintWriter out = new PrintWriter(new OutputStreamWriter(new FileOutputStream(FileDescriptor.out),
                StandardCharsets.UTF_8), true);
        PrintWriter err = new PrintWriter(new OutputStreamWriter(new FileOutputStream(FileDescriptor.err),
                StandardCharsets.UTF_8), true);
        int code = Cli.commandLine(out, err, false, args).execute(args);
        out.flush();
        err.flush();
        System.exit(code);
    }
}

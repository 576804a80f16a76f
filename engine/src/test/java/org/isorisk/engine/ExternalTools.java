package org.isorisk.engine;

import static org.junit.jupiter.api.Assumptions.assumeTrue;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.TimeUnit;

/**
 * Runs the reference scripts in {@code engine/src/test/scripts} with outside tools (Rscript, Debian's
 * /usr/bin/python3 with scikit-learn). A test whose tool is missing is skipped with a message saying which
 * Debian package provides it; CI installs them, and under CI a missing tool fails the test ({@link #available}).
 */
public final class ExternalTools {
    private ExternalTools() {
    }

    /** The folder of the reference scripts, found from the module or the repository root. */
    public static Path scripts() {
        for (String p : new String[] {"src/test/scripts", "engine/src/test/scripts", "../engine/src/test/scripts"}) {
            Path d = Path.of(p);
            if (Files.isDirectory(d)) {
                return d;
            }
        }
        throw new IllegalStateException("reference scripts not found from " + Path.of("").toAbsolutePath());
    }

    /** Rscript with the quadprog package, or the test is skipped. */
    public static String rscript() {
        String exe = onPath("Rscript");
        assumeTrue(exe != null, "Rscript not found: install Debian packages r-base-core r-cran-quadprog");
        Result r = run(List.of(exe, "-e", "suppressPackageStartupMessages(library(quadprog))"), 60);
        assumeTrue(r.exit == 0, "R package quadprog missing: install Debian package r-cran-quadprog");
        return exe;
    }

    /**
     * Runs a Python reference script with Debian's /usr/bin/python3 (the python3 first on PATH may lack the
     * Debian modules); skips the test when the interpreter or the module is missing.
     *
     * @param debianPackage the package that provides the module, named in the skip message
     */
    public static String python(String debianPackage, List<String> scriptAndArgs, int timeoutSeconds) {
        String exe = "/usr/bin/python3";
        available(Files.isExecutable(Path.of(exe)), "/usr/bin/python3 not found: install Debian package "
                + debianPackage);
        List<String> command = new ArrayList<>();
        command.add(exe);
        command.addAll(scriptAndArgs);
        Result r = run(command, timeoutSeconds);
        available(!(r.exit != 0 && r.stderr.contains("ModuleNotFoundError")),
                "Python module missing for /usr/bin/python3: install Debian package " + debianPackage);
        if (r.exit != 0) {
            throw new AssertionError("reference command failed (" + r.exit + "): " + command + "\n" + r.stderr);
        }
        return r.stdout;
    }

    /**
     * Skips the test when an outside tool is missing, except under CI (environment {@code CI=true}), where
     * {@code .ci/run} installs every tool and a missing one fails the test instead.
     */
    public static void available(boolean present, String message) {
        if ("true".equals(System.getenv("CI"))) {
            org.junit.jupiter.api.Assertions.assertTrue(present, "CI must provide it: " + message);
        }
        assumeTrue(present, message);
    }

    /** Output of a finished process. */
    public record Result(int exit, String stdout, String stderr) {
    }

    /** Runs a command with a time limit; fails the test when the command fails. */
    public static String runOrFail(List<String> command, int timeoutSeconds) {
        Result r = run(command, timeoutSeconds);
        if (r.exit != 0) {
            throw new AssertionError("reference command failed (" + r.exit + "): " + command + "\n" + r.stderr);
        }
        return r.stdout;
    }

    static Result run(List<String> command, int timeoutSeconds) {
        try {
            Path out = Files.createTempFile("isorisk-ref", ".out");
            Path err = Files.createTempFile("isorisk-ref", ".err");
            try {
                Process p = new ProcessBuilder(command).redirectOutput(out.toFile()).redirectError(err.toFile())
                        .start();
                if (!p.waitFor(timeoutSeconds, TimeUnit.SECONDS)) {
                    p.destroyForcibly();
                    throw new AssertionError("reference command timed out after " + timeoutSeconds + " s: " + command);
                }
                return new Result(p.exitValue(), Files.readString(out, StandardCharsets.UTF_8),
                        Files.readString(err, StandardCharsets.UTF_8));
            } finally {
                Files.deleteIfExists(out);
                Files.deleteIfExists(err);
            }
        } catch (IOException e) {
            return new Result(127, "", e.getMessage());
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            throw new AssertionError("interrupted", e);
        }
    }

    private static String onPath(String name) {
        List<String> dirs = new ArrayList<>(List.of(System.getenv().getOrDefault("PATH", "").split(":")));
        dirs.add("/usr/bin");
        for (String d : dirs) {
            if (!d.isEmpty() && Files.isExecutable(Path.of(d, name))) {
                return Path.of(d, name).toString();
            }
        }
        return null;
    }
}

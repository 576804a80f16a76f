package org.isorisk.notebooks;

import java.io.IOException;
import java.io.UncheckedIOException;
import java.net.URISyntaxException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.TimeUnit;
import org.junit.jupiter.api.Assumptions;

/**
 * Runs the outside tools the notebook tests compare with: Debian's Python 3 with nbformat, nbconvert, nbclient,
 * ipykernel and pandas. The Python on PATH may be another installation without them, so the Debian interpreter
 * is called by its path. Tests that need a tool skip (JUnit assumption) with a message naming the package.
 */
public final class ExternalTools {
    private ExternalTools() {
    }

    /** Debian's interpreter, where {@code apt-get install python3-nbformat} puts the modules. */
    public static final String PYTHON = "/usr/bin/python3";

    /** Output of a finished process. */
    public record Run(int exit, String out, String err) {
        public String both() {
            return out + err;
        }
    }

    /** Skips the calling test unless Debian's Python can import every module; names the Debian packages. */
    public static void assumeModules(String packages, String... modules) {
        Assumptions.assumeTrue(Files.isExecutable(Path.of(PYTHON)),
                () -> "skipped: " + PYTHON + " is missing; install Debian's " + packages);
        StringBuilder imp = new StringBuilder();
        for (String m : modules) {
            imp.append("import ").append(m).append("\n");
        }
        Run r = run(Path.of("."), 60, PYTHON, "-c", imp.toString());
        Assumptions.assumeTrue(r.exit() == 0,
                () -> "skipped: " + PYTHON + " cannot import " + String.join(", ", modules) + "; install Debian's "
                        + packages + " (apt-get install -y " + packages + ")");
    }

    /**
     * The path of a test resource script, e.g. {@code python/validate_notebook.py}; when the resource is inside a
     * jar (this module's test jar, as other modules' tests see it) it is copied to a temporary file first.
     */
    public static Path script(String name) {
        java.net.URL url = ExternalTools.class.getResource("/" + name);
        if (url == null) {
            throw new IllegalStateException("test resource " + name + " not found");
        }
        try {
            if (url.getProtocol().equals("file")) {
                return Path.of(url.toURI());
            }
            Path copy = Files.createTempFile("isorisk-test-", "-" + Path.of(name).getFileName());
            copy.toFile().deleteOnExit();
            try (java.io.InputStream in = url.openStream()) {
                Files.copy(in, copy, java.nio.file.StandardCopyOption.REPLACE_EXISTING);
            }
            return copy;
        } catch (URISyntaxException | java.io.IOException e) {
            throw new IllegalStateException("test resource " + name + " could not be read", e);
        }
    }

    /** Runs a command in {@code dir}, waiting at most {@code seconds}; fails the test on a timeout. */
    public static Run run(Path dir, int seconds, String... command) {
        return runWithInput(dir, seconds, "", command);
    }

    /** Like {@link #run}, with {@code input} as the process's standard input (UTF-8). */
    public static Run runWithInput(Path dir, int seconds, String input, String... command) {
        try {
            Path out = Files.createTempFile("isorisk-tool", ".out");
            Path err = Files.createTempFile("isorisk-tool", ".err");
            try {
                ProcessBuilder pb = new ProcessBuilder(List.of(command)).directory(dir.toFile())
                        .redirectOutput(out.toFile()).redirectError(err.toFile());
                pb.environment().put("PYTHONDONTWRITEBYTECODE", "1");
                pb.environment().put("PYTHONIOENCODING", "utf-8");
                Path in = Files.createTempFile("isorisk-tool", ".in");
                Files.writeString(in, input, StandardCharsets.UTF_8);
                pb.redirectInput(in.toFile());
                Process p = pb.start();
                Files.deleteIfExists(in);
                if (!p.waitFor(seconds, TimeUnit.SECONDS)) {
                    p.destroyForcibly();
                    throw new AssertionError("timed out after " + seconds + " s: " + String.join(" ", command));
                }
                return new Run(p.exitValue(), Files.readString(out, StandardCharsets.UTF_8),
                        Files.readString(err, StandardCharsets.UTF_8));
            } finally {
                Files.deleteIfExists(out);
                Files.deleteIfExists(err);
            }
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            throw new AssertionError("interrupted", e);
        }
    }

    /** {@code /usr/bin/python3 -W error validate_notebook.py NOTEBOOK}: strict nbformat validation. */
    public static Run validate(Path notebook) {
        assumeModules("python3-nbformat", "nbformat");
        return run(notebook.getParent(), 120, PYTHON, "-W", "error", script("python/validate_notebook.py").toString(),
                notebook.toString());
    }

    /** Renders a notebook to HTML with nbconvert and returns the HTML file. */
    public static Path html(Path notebook, Path outDir) {
        assumeModules("jupyter-nbconvert", "nbconvert");
        List<String> cmd = new ArrayList<>(List.of(PYTHON, "-m", "nbconvert", "--to", "html", "--output-dir",
                outDir.toString(), notebook.toString()));
        Run r = run(notebook.getParent(), 180, cmd.toArray(String[]::new));
        if (r.exit() != 0) {
            throw new AssertionError("nbconvert failed (exit " + r.exit() + "): " + r.both());
        }
        String stem = notebook.getFileName().toString().replaceFirst("\\.ipynb$", "");
        return outDir.resolve(stem + ".html");
    }

    /** Executes a notebook's code cells with nbclient and returns the executed copy. */
    public static Path execute(Path notebook, Path executed) {
        assumeModules("python3-nbclient python3-ipykernel python3-pandas", "nbclient", "ipykernel", "pandas");
        Run r = run(notebook.getParent(), 300, PYTHON, script("python/execute_notebook.py").toString(),
                notebook.toString(), executed.toString());
        if (r.exit() != 0) {
            throw new AssertionError("nbclient failed (exit " + r.exit() + "): " + r.both());
        }
        return executed;
    }
}

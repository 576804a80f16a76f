package org.isorisk.bench;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.IOException;
import java.io.OutputStream;
import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.concurrent.TimeUnit;

/**
 * Runs {@code bench/numpy_reference.py} on the same matrices as a Java case: writes them to temporary files
 * of little-endian float64 (what {@code numpy.fromfile(..., dtype="<f8")} reads) and parses the JSON it
 * prints. The interpreter is Debian's {@code /usr/bin/python3} (the one with python3-numpy), or
 * {@code $ISORISK_BENCH_PYTHON}.
 */
public final class NumpyReference {

    /** Environment variables some machines set to work around old OpenBLAS bugs; unset for the reference. */
    static final List<String> OPENBLAS_OVERRIDES = List.of("OPENBLAS_CORETYPE", "OPENBLAS_L2_SIZE");

    /**
     * What the reference reported.
     *
     * @param choleskySeconds median time of {@code numpy.linalg.cholesky} alone
     * @param totalSeconds    median time of the whole closed-form job
     * @param description     numpy version, triangular solver and OpenBLAS core, for the table's header
     */
    public record Timing(double choleskySeconds, double totalSeconds, String description) {
    }

    private final Path script;
    private final String python;

    private NumpyReference(Path script, String python) {
        this.script = script;
        this.python = python;
    }

    /** The reference next to the benchmark sources, or null (with the reason printed) when it cannot run. */
    public static NumpyReference find(java.io.PrintStream out) {
        Path script = script("numpy_reference.py", "numpy", out);
        String python = python("numpy", "python3-numpy", out);
        return script == null || python == null ? null : new NumpyReference(script, python);
    }

    /** A reference script in the bench folder, or null (with the reason printed) when it is missing. */
    static Path script(String file, String what, java.io.PrintStream out) {
        String dir = System.getProperty("isorisk.bench.dir", "bench");
        Path script = Path.of(dir, file);
        if (!Files.isRegularFile(script)) {
            out.println(what + " reference: skipped (" + script + " not found; run through bench/run)");
            return null;
        }
        return script;
    }

    /**
     * The interpreter for the references: Debian's {@code /usr/bin/python3} (the {@code python3} on PATH may be
     * another one without Debian's packages), or {@code $ISORISK_BENCH_PYTHON}; null (with the reason printed)
     * when it is missing.
     */
    static String python(String what, String debianPackage, java.io.PrintStream out) {
        String python = System.getenv().getOrDefault("ISORISK_BENCH_PYTHON", "/usr/bin/python3");
        if (!Files.isExecutable(Path.of(python))) {
            out.println(what + " reference: skipped (" + python + " not found; install Debian's " + debianPackage
                    + ")");
            return null;
        }
        return python;
    }

    /**
     * Runs a reference script with {@link #OPENBLAS_OVERRIDES} unset, no standard input, and parses the JSON
     * object on the last line of its output.
     */
    static JsonNode runJson(String python, Path script, List<String> args) throws IOException, InterruptedException {
        List<String> cmd = new ArrayList<>(List.of(python, script.toString()));
        cmd.addAll(args);
        ProcessBuilder pb = new ProcessBuilder(cmd);
        Map<String, String> env = pb.environment();
        for (String v : OPENBLAS_OVERRIDES) {
            env.remove(v);
        }
        pb.redirectErrorStream(true);
        Process p = pb.start();
        p.getOutputStream().close();
        byte[] output = p.getInputStream().readAllBytes();
        String text = new String(output, StandardCharsets.UTF_8).trim();
        if (!p.waitFor(30, TimeUnit.MINUTES) || p.exitValue() != 0) {
            throw new IOException(script.getFileName() + " failed: " + text);
        }
        String last = text.substring(text.lastIndexOf('\n') + 1);
        return new ObjectMapper().readTree(last);
    }

    /** Deletes a temporary folder of reference inputs (flat). */
    static void deleteFlat(Path dir) throws IOException {
        try (var files = Files.list(dir)) {
            for (Path f : (Iterable<Path>) files::iterator) {
                Files.deleteIfExists(f);
            }
        }
        Files.deleteIfExists(dir);
    }

    /** The OpenBLAS override variables set in this environment, with their values. */
    public static String overridesNote() {
        List<String> set = new ArrayList<>();
        for (String v : OPENBLAS_OVERRIDES) {
            String x = System.getenv(v);
            if (x != null) {
                set.add(v + "=" + x);
            }
        }
        return set.isEmpty() ? "no OpenBLAS override variables set"
                : String.join(", ", set) + " set here; unset for the reference process only";
    }

    /** Times the reference on Σ and μ. */
    public Timing run(double[][] sigma, double[] mu, int warmup, int reps, int points, double span)
            throws IOException, InterruptedException {
        int n = mu.length;
        Path dir = Files.createTempDirectory("isorisk-bench");
        try {
            Path s = dir.resolve("sigma.f8");
            Path m = dir.resolve("mu.f8");
            writeMatrix(s, sigma);
            writeVector(m, mu);
            JsonNode j = runJson(python, script, List.of("--sigma", s.toString(), "--mu", m.toString(),
                    "--n", Integer.toString(n), "--reps", Integer.toString(reps), "--warmup", Integer.toString(warmup),
                    "--points", Integer.toString(points), "--span", Double.toString(span)));
            String desc = "numpy " + j.path("numpy").asText() + " (" + j.path("openblas").asText() + "; triangular "
                    + "solves: " + j.path("triangular").asText() + ")";
            return new Timing(j.path("cholesky_s").asDouble(), j.path("total_s").asDouble(), desc);
        } finally {
            deleteFlat(dir);
        }
    }

    /** Writes a square matrix row by row as little-endian float64. */
    static void writeMatrix(Path file, double[][] a) throws IOException {
        try (OutputStream o = Files.newOutputStream(file)) {
            for (double[] row : a) {
                o.write(bytes(row));
            }
        }
    }

    static void writeVector(Path file, double[] v) throws IOException {
        Files.write(file, bytes(v));
    }

    static byte[] bytes(double[] v) {
        ByteBuffer b = ByteBuffer.allocate(8 * v.length).order(ByteOrder.LITTLE_ENDIAN);
        for (double x : v) {
            b.putDouble(x);
        }
        return b.array();
    }
}

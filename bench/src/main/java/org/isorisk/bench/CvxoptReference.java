package org.isorisk.bench;

import com.fasterxml.jackson.databind.JsonNode;
import java.io.IOException;
import java.io.PrintStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;

/**
 * Runs {@code bench/cvxopt_reference.py} (CVXOPT's interior-point QP, Debian's {@code python3-cvxopt}) on the
 * same bounded problems as the {@code qp} case, in the same run, with the interpreter and the OpenBLAS variable
 * handling of {@link NumpyReference}.
 */
public final class CvxoptReference {

    /**
     * What the reference reported (medians after warm-up, solve call only).
     *
     * @param defaultSeconds    one minimum-variance solve at CVXOPT's default tolerances
     * @param tightSeconds      the same at tolerances 1e-13 (full accuracy)
     * @param sweepSeconds      every target solved one by one at default tolerances
     * @param weightsDiffTight  largest |w_cvxopt − w_isorisk| of the tight minimum-variance solve
     * @param status            the solver's statuses and iteration counts, for a note
     * @param description       CVXOPT version and OpenBLAS core, for the table's header
     */
    public record Timing(double defaultSeconds, double tightSeconds, double sweepSeconds, double weightsDiffTight,
                         String status, String description) {
    }

    private final Path script;
    private final String python;

    private CvxoptReference(Path script, String python) {
        this.script = script;
        this.python = python;
    }

    /** The reference next to the benchmark sources, or null (with the reason printed) when it cannot run. */
    public static CvxoptReference find(PrintStream out) {
        Path script = NumpyReference.script("cvxopt_reference.py", "CVXOPT", out);
        String python = NumpyReference.python("CVXOPT", "python3-cvxopt", out);
        return script == null || python == null ? null : new CvxoptReference(script, python);
    }

    /**
     * Times CVXOPT on minimise {@code w'Σw} with {@code Σw = 1}, {@code 0 ≤ w ≤ upper}, and with each target.
     *
     * @param isoriskWeights isorisk's minimum-variance weights, compared with CVXOPT's
     */
    public Timing run(double[][] sigma, double[] mu, double upper, double[] targets, double[] isoriskWeights,
                      int warmup, int reps, int sweepReps) throws IOException, InterruptedException {
        Path dir = Files.createTempDirectory("isorisk-bench");
        try {
            Path s = dir.resolve("sigma.f8");
            Path m = dir.resolve("mu.f8");
            Path t = dir.resolve("targets.f8");
            Path w = dir.resolve("weights.f8");
            NumpyReference.writeMatrix(s, sigma);
            NumpyReference.writeVector(m, mu);
            NumpyReference.writeVector(t, targets);
            NumpyReference.writeVector(w, isoriskWeights);
            JsonNode j = NumpyReference.runJson(python, script, List.of("--sigma", s.toString(), "--mu", m.toString(),
                    "--targets", t.toString(), "--weights", w.toString(), "--n", Integer.toString(mu.length),
                    "--upper", Double.toString(upper), "--reps", Integer.toString(reps),
                    "--warmup", Integer.toString(warmup), "--sweep-reps", Integer.toString(sweepReps)));
            String status = String.format(java.util.Locale.ROOT, "default %s in %d iterations, tight %s in %d, "
                            + "sweep %s", j.path("minvar_default_status").asText(),
                    j.path("minvar_default_iterations").asInt(), j.path("minvar_tight_status").asText(),
                    j.path("minvar_tight_iterations").asInt(), j.path("sweep_status").asText());
            String desc = "cvxopt " + j.path("cvxopt").asText() + ", python " + j.path("python").asText() + " ("
                    + j.path("openblas").asText() + ")";
            return new Timing(j.path("minvar_default_s").asDouble(), j.path("minvar_tight_s").asDouble(),
                    j.path("sweep_s").asDouble(), j.path("weights_diff_tight").asDouble(), status, desc);
        } finally {
            NumpyReference.deleteFlat(dir);
        }
    }
}

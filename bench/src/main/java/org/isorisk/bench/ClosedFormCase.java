package org.isorisk.bench;

import java.io.PrintStream;
import java.util.List;
import java.util.Locale;
import org.isorisk.engine.linalg.Cholesky;
import org.isorisk.engine.linalg.Spectrum;
import org.isorisk.engine.model.AllocationRequest;
import org.isorisk.engine.model.AssetUniverse;
import org.isorisk.engine.model.Mandate;
import org.isorisk.engine.model.Method;
import org.isorisk.engine.model.Objective;
import org.isorisk.engine.model.Solution;
import org.isorisk.engine.model.SolverSettings;
import org.isorisk.engine.solve.Allocator;
import org.isorisk.engine.solve.Factored;
import org.isorisk.engine.synthetic.FactorModels;

/**
 * The closed-form job through the public API: factor Σ once ({@link Factored}), the global minimum-variance
 * portfolio, then a 25-point frontier of target returns, each with weights, multipliers and certificate
 * ({@link Allocator#closedForm}). Side by side with numpy doing the same on the same matrices.
 */
final class ClosedFormCase implements BenchCase {
    static final List<Integer> SIZES = List.of(100, 500, 1000, 2000);
    static final int POINTS = 25;
    /** The frontier runs from the minimum-variance return up by this much. */
    static final double SPAN = 0.05;
    static final long SEED = 20_260_101L;

    @Override
    public String name() {
        return "closed-form";
    }

    @Override
    public String description() {
        return "global minimum variance + " + POINTS + "-point frontier, closed form (factor once; weights, "
                + "multipliers and certificate per point), dense " + FactorModels.SIGNED_FACTORS + "-factor problems";
    }

    @Override
    public void run(Options options, PrintStream out) throws Exception {
        SolverSettings settings = SolverSettings.defaults().withThreads(options.threads());
        NumpyReference numpy = options.reference() ? NumpyReference.find(out) : null;
        out.printf(Locale.ROOT, "java %s, %d thread(s), Cholesky block %d; medians after %d warm-up run(s)%n",
                System.getProperty("java.version"), settings.threads(), Cholesky.BLOCK, options.warmup());
        if (numpy != null) {
            out.println("reference: " + NumpyReference.overridesNote());
        }
        String header = String.format(Locale.ROOT, "%6s %11s %9s %9s %11s %9s %7s %10s", "n", "java ms",
                "chol ms", "spec ms", "numpy ms", "chol ms", "ratio", "peak MB");
        String referenceDescription = null;
        StringBuilder rows = new StringBuilder();
        for (int n : options.sizesOr(SIZES)) {
            AssetUniverse u = FactorModels.signedUniverse(n, SEED + n);
            Mandate mandate = Mandate.fullyInvested(n);
            AllocationRequest req = new AllocationRequest(u, mandate, Objective.minimumVariance(),
                    Method.CLOSED_FORM, settings);
            int reps = options.repsOr(n >= 1000 ? 7 : 15);
            verify(u, settings, mandate, req, out);
            double[][] sigma = u.covariance();
            Timing.Result chol = Timing.measure(options.warmup(), reps,
                    () -> Cholesky.factor(sigma, settings.threads()).minPivot());
            Cholesky factor = Cholesky.factor(sigma, settings.threads());
            Timing.Result spec = Timing.measure(options.warmup(), reps,
                    () -> Spectrum.of(sigma, factor).conditionNumber());
            Timing.Result job = Timing.measure(options.warmup(), reps, () -> job(u, settings, mandate, req));
            String ref = String.format(Locale.ROOT, "%11s %9s %7s", "-", "-", "-");
            if (numpy != null) {
                NumpyReference.Timing t = numpy.run(sigma, u.expectedReturns(), Math.min(2, options.warmup()),
                        reps, POINTS, SPAN);
                referenceDescription = t.description();
                ref = String.format(Locale.ROOT, "%11.1f %9.1f %6.2fx", 1e3 * t.totalSeconds(),
                        1e3 * t.choleskySeconds(), job.medianSeconds() / t.totalSeconds());
            }
            String row = String.format(Locale.ROOT, "%6d %11.1f %9.1f %9.1f %s %10.0f", n, 1e3 * job.medianSeconds(),
                    1e3 * chol.medianSeconds(), 1e3 * spec.medianSeconds(), ref, job.peakHeapBytes() / 1048576.0);
            rows.append(row).append('\n');
        }
        if (referenceDescription != null) {
            out.println("reference: " + referenceDescription);
        }
        out.println(header);
        out.print(rows);
        out.println("java ms: the whole job (factor, spectrum, GMV, " + POINTS + " frontier points); chol/spec ms: "
                + "the Cholesky factorisation and the condition-number estimate alone; numpy ms: the same job in "
                + "numpy; ratio: java/numpy; peak MB: heap during the java job (all pools).");
    }

    /** The whole job; returns a sum of its outputs so that nothing is optimised away. */
    static double job(AssetUniverse u, SolverSettings settings, Mandate mandate, AllocationRequest req) {
        Factored f = Factored.of(u, settings);
        Solution gmv = Allocator.closedForm(f, mandate, Objective.minimumVariance(), req);
        double sum = gmv.variance();
        for (int k = 0; k < POINTS; k++) {
            double target = gmv.expectedReturn() + SPAN * k / (POINTS - 1);
            Solution s = Allocator.closedForm(f, mandate, Objective.targetReturn(target), req);
            sum += s.variance() + s.multipliers().get(1).variancePerUnit() + s.weight(0)
                    + s.certificate().stationarity();
        }
        return sum;
    }

    /** Once, untimed: every portfolio of the job must pass its certificate, or the timing means nothing. */
    private static void verify(AssetUniverse u, SolverSettings settings, Mandate mandate, AllocationRequest req,
                               PrintStream out) {
        Factored f = Factored.of(u, settings);
        Solution gmv = Allocator.closedForm(f, mandate, Objective.minimumVariance(), req);
        double worst = gmv.certificate().worst();
        boolean pass = gmv.certificate().passes();
        for (int k = 0; k < POINTS; k++) {
            double target = gmv.expectedReturn() + SPAN * k / (POINTS - 1);
            Solution s = Allocator.closedForm(f, mandate, Objective.targetReturn(target), req);
            worst = Math.max(worst, s.certificate().worst());
            pass &= s.certificate().passes();
        }
        if (!pass) {
            out.printf(Locale.ROOT, "WARNING n=%d: a certificate fails (worst residual %.2e)%n", u.size(), worst);
        }
    }
}

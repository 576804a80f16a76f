package org.isorisk.engine.solve;

import org.isorisk.engine.model.AssetUniverse;
import org.isorisk.engine.model.Mandate;
import org.isorisk.engine.model.SolverSettings;

/**
 * The benchmark's way in to the package-private parametric active-set method ({@link ParametricQp}), which is not
 * wired into the engine's front door yet: this class lives in the bench module under the engine's package name
 * (allowed on the class path; the engine ships nothing of it). Not an API.
 */
public final class ParametricBenchAccess {
    private ParametricBenchAccess() {
    }

    /**
     * What one walk gave.
     *
     * @param corners          number of corners
     * @param targets          the corners' targets, increasing
     * @param weights          the corners' weights
     * @param worstCertificate largest certificate residual over the corners
     * @param events           ratio tests that ended in a change (start and walk)
     * @param largestFree      the largest free set of any piece
     * @param weightsAt        the exact weights at the targets asked for
     */
    public record Walk(int corners, double[] targets, double[][] weights, double worstCertificate, int events,
                       int largestFree, double[][] weightsAt) {
    }

    /**
     * Walks the whole frontier of {@code w'Σw − 2q'w} under the mandate (efficient branch, and the inefficient one
     * when asked).
     *
     * @param linear q, or null for plain variance
     * @param at     targets at which to report the weights too (within the walked range)
     */
    public static Walk walk(AssetUniverse u, Mandate m, double[] linear, boolean inefficient, SolverSettings s,
                            double[] at) {
        ParametricPath path = ParametricQp.walk(ParametricProblem.of(u, m, linear), inefficient, s);
        int k = path.corners().size();
        double[] t = new double[k];
        double[][] w = new double[k][];
        double worst = 0;
        for (int j = 0; j < k; j++) {
            ParametricPath.Corner c = path.corners().get(j);
            t[j] = c.target();
            w[j] = c.weights();
            worst = Math.max(worst, c.certificate().worst());
        }
        int largest = 0;
        for (ParametricPath.Piece p : path.pieces()) {
            int f = 0;
            for (byte b : p.state()) {
                f += b == ParametricQp.FREE ? 1 : 0;
            }
            largest = Math.max(largest, f);
        }
        double[][] wa = new double[at.length][];
        for (int j = 0; j < at.length; j++) {
            wa[j] = path.at(at[j]).weights();
        }
        return new Walk(k, t, w, worst, path.counts().startChanges() + path.counts().walkChanges(), largest, wa);
    }
}

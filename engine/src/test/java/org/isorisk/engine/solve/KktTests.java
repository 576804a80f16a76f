package org.isorisk.engine.solve;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import org.isorisk.engine.Tolerances;
import org.isorisk.engine.model.AllocationRequest;
import org.isorisk.engine.model.AssetUniverse;
import org.isorisk.engine.model.Certificate;
import org.isorisk.engine.model.LinearConstraint;
import org.isorisk.engine.model.Mandate;
import org.isorisk.engine.model.Objective;
import org.isorisk.engine.model.Relation;
import org.isorisk.engine.model.Solution;
import org.junit.jupiter.api.Test;

/** The one certificate: it passes a true optimum and catches each kind of wrong candidate. */
class KktTests {

    private final AssetUniverse u = Problems.universe(6, 21);
    private final List<LinearConstraint> rows = List.of(
            new LinearConstraint("budget", new double[] {1, 1, 1, 1, 1, 1}, Relation.EQUAL, 1.0),
            new LinearConstraint("target_return", u.expectedReturns(), Relation.EQUAL, 0.05));
    private final Solution optimum = Allocator.solve(AllocationRequest.of(u, Mandate.fullyInvested(6),
            Objective.targetReturn(0.05)));

    private double[] prices() {
        return new double[] {ClosedFormTests.price(optimum, "budget"), ClosedFormTests.price(optimum, "target_return")};
    }

    @Test
    void theClosedFormOptimumPasses() {
        Certificate c = Kkt.certify(u.covariance(), optimum.weights(), rows, prices(), null, null, null, null, 1, 1e-10,
                true);
        assertTrue(c.passes(), c.toString());
        assertTrue(c.stationarity() <= Tolerances.CLOSED_FORM);
    }

    @Test
    void movedWeightsFailStationarityOrFeasibility() {
        double[] w = optimum.weights();
        w[0] += 1e-4;
        w[1] -= 1e-4; // still fully invested, no longer optimal
        Certificate c = Kkt.certify(u.covariance(), w, rows, prices(), null, null, null, null, 1, 1e-10, true);
        assertFalse(c.passes());
        assertTrue(c.stationarity() > 1e-6, c.toString());
        double[] off = optimum.weights();
        off[2] += 1e-3; // budget broken
        assertTrue(Kkt.certify(u.covariance(), off, rows, prices(), null, null, null, null, 1, 1e-10, true).primal()
                >= 1e-3 * (1 - Tolerances.TIGHT));
    }

    @Test
    void aWrongMultiplierFailsStationarity() {
        double[] p = prices();
        p[1] *= 1.01;
        Certificate c = Kkt.certify(u.covariance(), optimum.weights(), rows, p, null, null, null, null, 1, 1e-10, true);
        assertFalse(c.passes());
        assertTrue(c.stationarity() > 1e-4, c.toString());
    }

    @Test
    void aWrongSignedInequalityPriceIsADualViolation() {
        // At the optimum the return row holds with equality; read as "return ≥ 5 %" its price must be ≥ 0 and
        // read as "return ≤ 5 %" it must be ≤ 0 (DESIGN.md's convention ∂V*/∂limit).
        double price = ClosedFormTests.price(optimum, "target_return");
        Relation wrong = price > 0 ? Relation.AT_MOST : Relation.AT_LEAST;
        List<LinearConstraint> asInequality = List.of(rows.get(0),
                new LinearConstraint("target_return", u.expectedReturns(), wrong, 0.05));
        Certificate c = Kkt.certify(u.covariance(), optimum.weights(), asInequality, prices(), null, null, null, null,
                1, 1e-10, true);
        assertFalse(c.passes());
        assertTrue(c.dual() > 0);
        Relation right = price > 0 ? Relation.AT_LEAST : Relation.AT_MOST;
        List<LinearConstraint> correct = List.of(rows.get(0),
                new LinearConstraint("target_return", u.expectedReturns(), right, 0.05));
        Certificate ok = Kkt.certify(u.covariance(), optimum.weights(), correct, prices(), null, null, null, null, 1,
                1e-10, true);
        assertEquals(0.0, ok.dual());
        assertTrue(ok.passes(), ok.toString());
    }

    @Test
    void aNonConvexProblemNeverPasses() {
        Certificate c = Kkt.certify(u.covariance(), optimum.weights(), rows, prices(), null, null, null, null, 1, 1e-10,
                false);
        assertFalse(c.passes());
    }

    @Test
    void aLinearTermInTheObjectiveEntersStationarity() {
        // min w'Σw − 2q'w subject to the budget and a target, solved independently from its full KKT system
        // [2Σ −A'; A 0][w; s] = [2q; b] by Commons Math's LU decomposition: the certificate given q passes, the same
        // numbers certified as if there were no linear term do not.
        int n = u.size();
        double[] q = new double[n];
        for (int i = 0; i < n; i++) {
            q[i] = 0.01 * (i % 3) - 0.004;
        }
        double[][] sigma = u.covariance();
        double[][] k = new double[n + 2][n + 2];
        double[] rhs = new double[n + 2];
        for (int i = 0; i < n; i++) {
            for (int j = 0; j < n; j++) {
                k[i][j] = 2 * sigma[i][j];
            }
            for (int r = 0; r < 2; r++) {
                k[i][n + r] = -rows.get(r).coefficient(i);
                k[n + r][i] = rows.get(r).coefficient(i);
            }
            rhs[i] = 2 * q[i];
        }
        rhs[n] = 1.0;
        rhs[n + 1] = 0.05;
        double[] z = new org.apache.commons.math3.linear.LUDecomposition(
                new org.apache.commons.math3.linear.Array2DRowRealMatrix(k)).getSolver()
                .solve(new org.apache.commons.math3.linear.ArrayRealVector(rhs)).toArray();
        double[] w = java.util.Arrays.copyOf(z, n);
        double[] p = {z[n], z[n + 1]};
        double[] sw = Kkt.multiply(sigma, w);
        Certificate with = Kkt.certifyProduct(sw, q, w, rows, null, p, null, null, null, null, 1, 1e-10, true);
        assertTrue(with.passes() && with.stationarity() <= Tolerances.CLOSED_FORM, with.toString());
        Certificate without = Kkt.certifyProduct(sw, w, rows, p, null, null, null, null, 1, 1e-10, true);
        assertFalse(without.passes(), without.toString());
    }
}

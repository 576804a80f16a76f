package org.isorisk.engine.rebalance;

import java.math.BigDecimal;
import java.util.List;
import org.isorisk.engine.error.NoSolutionException;
import org.isorisk.engine.model.LinearConstraint;
import org.ojalgo.optimisation.Expression;
import org.ojalgo.optimisation.ExpressionsBasedModel;
import org.ojalgo.optimisation.Optimisation;
import org.ojalgo.optimisation.Variable;

/**
 * Linear programmes over linear rows and bounds, through ojAlgo's simplex: the highest expected return a
 * mandate allows, the least turnover that brings today's holdings within the policy. Only the optimal value
 * and point are used (no duals), so ojAlgo's dual scaling does not matter here.
 */
public final class Lp {
    private Lp() {
    }

    /**
     * The optimum of {@code max c'x} (or min) subject to the rows and {@code lo ≤ x ≤ hi}.
     *
     * @param value the optimal objective value
     * @param x     an optimal point
     */
    public record Result(double value, double[] x) {
    }

    /**
     * Solves {@code max c'x} ({@code maximise = true}) or {@code min c'x}.
     *
     * @return the optimum; value ±∞ (and a zero point) when the objective is unbounded
     * @throws NoSolutionException (INFEASIBLE) when no point satisfies the rows and bounds
     */
    public static Result optimise(double[] c, List<LinearConstraint> rows, double[] lo, double[] hi, boolean maximise) {
        int p = c.length;
        ExpressionsBasedModel model = new ExpressionsBasedModel();
        Variable[] v = new Variable[p];
        for (int j = 0; j < p; j++) {
            v[j] = model.addVariable("x" + j);
            if (Double.isFinite(lo[j])) {
                v[j].lower(lo[j]);
            }
            if (Double.isFinite(hi[j])) {
                v[j].upper(hi[j]);
            }
            v[j].weight(c[j]);
        }
        int k = 0;
        for (LinearConstraint row : rows) {
            Expression e = model.addExpression("r" + k++);
            for (int j = 0; j < p; j++) {
                double a = row.coefficient(j);
                if (a != 0) {
                    e.set(v[j], a);
                }
            }
            switch (row.relation()) {
                case EQUAL -> e.level(row.limit());
                case AT_MOST -> e.upper(row.limit());
                case AT_LEAST -> e.lower(row.limit());
                default -> throw new IllegalStateException();
            }
        }
        Optimisation.Result r = maximise ? model.maximise() : model.minimise();
        if (r.getState() == Optimisation.State.UNBOUNDED) {
            return new Result(maximise ? Double.POSITIVE_INFINITY : Double.NEGATIVE_INFINITY, new double[p]);
        }
        if (!r.getState().isOptimal()) {
            throw new NoSolutionException(NoSolutionException.Reason.INFEASIBLE,
                    "the linear programme has no optimum (" + r.getState() + ")",
                    rows.stream().map(LinearConstraint::name).toList());
        }
        double[] x = new double[p];
        double val = 0;
        for (int j = 0; j < p; j++) {
            BigDecimal b = v[j].getValue();
            x[j] = b == null ? r.doubleValue(j) : b.doubleValue();
            val += c[j] * x[j];
        }
        return new Result(val, x);
    }
}

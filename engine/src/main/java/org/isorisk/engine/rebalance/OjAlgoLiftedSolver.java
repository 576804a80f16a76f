package org.isorisk.engine.rebalance;

import java.util.ArrayList;
import java.util.List;
import org.isorisk.engine.error.NoSolutionException;
import org.isorisk.engine.model.LinearConstraint;
import org.isorisk.engine.model.Relation;
import org.ojalgo.matrix.store.R064Store;
import org.ojalgo.optimisation.Optimisation;
import org.ojalgo.optimisation.convex.ConvexSolver;
import org.ojalgo.structure.Access1D;

/**
 * Lifted problems through ojAlgo's convex solver builder ({@code ½x'Qx} with {@code Q = 2H}; bounds as rows).
 * The builder does no scaling and lays its duals out as [equalities; inequalities] in the order given, with
 * {@code Qx + AE'yE + AI'yI = 0}; they are mapped to ∂V*∂limit here and checked by the KKT certificate.
 */
final class OjAlgoLiftedSolver implements LiftedSolver {

    @Override
    public QpPoint solve(Lifted p, QpPoint warm) {
        int dim = p.size();
        double[][] h = p.hessian();
        double eps = p.regularisation();
        for (int i = 0; i < dim; i++) {
            h[i][i] += eps;
        }
        R064Store q = R064Store.FACTORY.make(dim, dim);
        for (int i = 0; i < dim; i++) {
            for (int j = 0; j < dim; j++) {
                q.set(i, j, 2 * h[i][j]);
            }
        }
        List<double[]> eq = new ArrayList<>();
        List<Double> eqB = new ArrayList<>();
        List<Integer> eqRow = new ArrayList<>();
        List<double[]> in = new ArrayList<>();
        List<Double> inB = new ArrayList<>();
        List<int[]> inOrigin = new ArrayList<>(); // {kind, index, sign}: kind 0 row, 1 lower, 2 upper
        for (int k = 0; k < p.rows.size(); k++) {
            LinearConstraint c = p.rows.get(k);
            double[] a = c.coefficients();
            if (c.relation() == Relation.EQUAL) {
                eq.add(a);
                eqB.add(c.limit());
                eqRow.add(k);
            } else if (c.relation() == Relation.AT_MOST) {
                in.add(a);
                inB.add(c.limit());
                inOrigin.add(new int[] {0, k, 1});
            } else {
                double[] na = new double[dim];
                for (int j = 0; j < dim; j++) {
                    na[j] = -a[j];
                }
                in.add(na);
                inB.add(-c.limit());
                inOrigin.add(new int[] {0, k, -1});
            }
        }
        for (int j = 0; j < dim; j++) {
            if (Double.isFinite(p.upper[j])) {
                double[] a = new double[dim];
                a[j] = 1;
                in.add(a);
                inB.add(p.upper[j]);
                inOrigin.add(new int[] {2, j, 1});
            }
            if (Double.isFinite(p.lower[j])) {
                double[] a = new double[dim];
                a[j] = -1;
                in.add(a);
                inB.add(-p.lower[j]);
                inOrigin.add(new int[] {1, j, -1});
            }
        }
        ConvexSolver.Builder b = ConvexSolver.newBuilder().objective(q, R064Store.FACTORY.make(dim, 1));
        b.equalities(matrix(eq, dim), column(eqB));
        b.inequalities(matrix(in, dim), column(inB));
        Optimisation.Options opt = new Optimisation.Options();
        opt.convex().algorithm(ConvexSolver.Algorithm.ACTIVE_SET);
        Optimisation.Result r = b.build(opt).solve();
        if (!r.getState().isOptimal()) {
            throw new NoSolutionException(r.getState() == Optimisation.State.INFEASIBLE
                    ? NoSolutionException.Reason.INFEASIBLE : NoSolutionException.Reason.NOT_CONVERGED,
                    "the rebalance problem has no solution (" + r.getState() + ")", List.of());
        }
        double[] x = new double[dim];
        for (int j = 0; j < dim; j++) {
            x[j] = r.doubleValue(j);
        }
        @SuppressWarnings("deprecation")
        Access1D<?> y = r.getMultipliers().orElseThrow();
        double[] rowPrices = new double[p.rows.size()];
        double[] lo = new double[dim];
        double[] hi = new double[dim];
        for (int e = 0; e < eq.size(); e++) {
            rowPrices[eqRow.get(e)] = -y.doubleValue(e);
        }
        for (int t = 0; t < in.size(); t++) {
            double yi = y.doubleValue(eq.size() + t);
            int[] o = inOrigin.get(t);
            double price = -o[2] * yi;
            switch (o[0]) {
                case 0 -> rowPrices[o[1]] = price;
                case 1 -> lo[o[1]] = price;
                default -> hi[o[1]] = price;
            }
        }
        return new QpPoint(x, rowPrices, lo, hi);
    }

    private static R064Store matrix(List<double[]> rows, int dim) {
        R064Store m = R064Store.FACTORY.make(Math.max(rows.size(), 0), dim);
        for (int i = 0; i < rows.size(); i++) {
            for (int j = 0; j < dim; j++) {
                m.set(i, j, rows.get(i)[j]);
            }
        }
        return m;
    }

    private static R064Store column(List<Double> v) {
        R064Store m = R064Store.FACTORY.make(v.size(), 1);
        for (int i = 0; i < v.size(); i++) {
            m.set(i, 0, v.get(i));
        }
        return m;
    }
}

package org.isorisk.engine.io;

import com.fasterxml.jackson.databind.node.ObjectNode;
import org.isorisk.engine.estimate.Estimate;
import org.isorisk.engine.estimate.RepairResult;

/** The files {@code estimate} and the repair write, by name, staged into an {@link AtomicOutput}. */
public final class AssumptionFiles {
    private AssumptionFiles() {
    }

    /** {@code asset,expected_return}: the layout {@code solve} reads. */
    public static final String EXPECTED_RETURNS = "expected_returns.csv";
    /** Square covariance matrix, first column {@code asset}: the layout {@code solve} reads. */
    public static final String COVARIANCE = "covariance.csv";
    /** {@code asset,volatility}. */
    public static final String VOLATILITIES = "volatilities.csv";
    /** Square correlation matrix, same layout as the covariance. */
    public static final String CORRELATION = "correlation.csv";
    public static final String QUALITY_TEXT = "data_quality.txt";
    public static final String QUALITY_JSON = "data_quality.json";
    public static final String REPAIR_TEXT = "repair_report.txt";
    public static final String REPAIR_JSON = "repair_report.json";

    /** Stages the tables and the data-quality report of an estimate. */
    public static AtomicOutput estimate(AtomicOutput out, Estimate e) {
        ObjectNode json = EstimateReport.json(e);
        return out.add(EXPECTED_RETURNS, w -> TableWriter.writeColumn(w, "expected_return", e.assets(),
                        e.expectedReturns()))
                .add(COVARIANCE, w -> TableWriter.writeMatrix(w, e.assets(), e.covariance()))
                .add(VOLATILITIES, w -> TableWriter.writeColumn(w, "volatility", e.assets(), e.volatilities()))
                .add(CORRELATION, w -> TableWriter.writeMatrix(w, e.assets(), e.correlation()))
                .add(QUALITY_TEXT, w -> EstimateReport.text(w, e, Integer.MAX_VALUE))
                .add(QUALITY_JSON, w -> EstimateReport.writeJson(w, json));
    }

    /** Stages the repaired matrix (and, for a covariance, its correlation matrix) and the repair report. */
    public static AtomicOutput repair(AtomicOutput out, RepairResult r, String source) {
        double[][] m = r.repaired();
        if (r.covarianceInput()) {
            int n = m.length;
            double[][] c = new double[n][n];
            for (int i = 0; i < n; i++) {
                for (int j = 0; j < n; j++) {
                    c[i][j] = i == j ? 1.0 : m[i][j] / Math.sqrt(m[i][i] * m[j][j]);
                }
            }
            out.add(COVARIANCE, w -> TableWriter.writeMatrix(w, r.assets(), m))
                    .add(CORRELATION, w -> TableWriter.writeMatrix(w, r.assets(), c));
        } else {
            out.add(CORRELATION, w -> TableWriter.writeMatrix(w, r.assets(), m));
        }
        ObjectNode json = RepairReport.json(r, source);
        return out.add(REPAIR_TEXT, w -> RepairReport.text(w, r, source))
                .add(REPAIR_JSON, w -> EstimateReport.writeJson(w, json));
    }
}

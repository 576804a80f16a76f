package org.isorisk.cli.files;

import com.fasterxml.jackson.databind.node.ObjectNode;
import java.io.IOException;
import java.io.Writer;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import org.isorisk.cli.json.ResultJson;
import org.isorisk.cli.render.EstimateReport;
import org.isorisk.cli.render.RepairReport;
import org.isorisk.engine.estimate.Estimate;
import org.isorisk.engine.estimate.RepairResult;
import org.isorisk.notebooks.report.CsvWriter;

/**
 * The files {@code estimate} and the repair write, in the layouts {@code solve} reads (a per-asset column
 * {@code asset,<column>}; a square matrix with {@code asset} top left), into a folder that
 * {@link AtomicWrite#folder} moves into place as a whole.
 */
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

    /** Writes the tables and the data-quality report of an estimate into {@code dir}; returns the file names. */
    public static List<String> estimate(Path dir, Estimate e) throws IOException {
        List<String> names = new ArrayList<>();
        write(dir, EXPECTED_RETURNS, names, w -> writeColumn(w, "expected_return", e.assets(), e.expectedReturns()));
        write(dir, COVARIANCE, names, w -> writeMatrix(w, e.assets(), e.covariance()));
        write(dir, VOLATILITIES, names, w -> writeColumn(w, "volatility", e.assets(), e.volatilities()));
        write(dir, CORRELATION, names, w -> writeMatrix(w, e.assets(), e.correlation()));
        write(dir, QUALITY_TEXT, names, w -> EstimateReport.text(w, e, Integer.MAX_VALUE));
        ObjectNode json = ResultJson.finish(EstimateReport.json(e), Double.NaN);
        json.remove("timing_ms");
        write(dir, QUALITY_JSON, names, w -> ResultJson.write(json, w));
        return names;
    }

    /** Writes the repaired matrix (and, for a covariance, its correlation matrix) and the repair report. */
    public static List<String> repair(Path dir, RepairResult r, String source) throws IOException {
        List<String> names = new ArrayList<>();
        double[][] m = r.repaired();
        if (r.covarianceInput()) {
            int n = m.length;
            double[][] c = new double[n][n];
            for (int i = 0; i < n; i++) {
                for (int j = 0; j < n; j++) {
                    c[i][j] = i == j ? 1.0 : m[i][j] / Math.sqrt(m[i][i] * m[j][j]);
                }
            }
            write(dir, COVARIANCE, names, w -> writeMatrix(w, r.assets(), m));
            write(dir, CORRELATION, names, w -> writeMatrix(w, r.assets(), c));
        } else {
            write(dir, CORRELATION, names, w -> writeMatrix(w, r.assets(), m));
        }
        write(dir, REPAIR_TEXT, names, w -> RepairReport.text(w, r, source));
        ObjectNode json = ResultJson.finish(RepairReport.json(r, source), Double.NaN);
        json.remove("timing_ms");
        write(dir, REPAIR_JSON, names, w -> ResultJson.write(json, w));
        return names;
    }

    /** Writes {@code asset,<column>} and one row per asset. The writer is not closed. */
    public static void writeColumn(Writer w, String column, List<String> assets, double[] values) throws IOException {
        CsvWriter c = new CsvWriter(w);
        c.row("asset", column);
        for (int i = 0; i < assets.size(); i++) {
            c.row(assets.get(i), values[i]);
        }
    }

    /**
     * Writes a square matrix with a header row and a first column of asset names (the names guarded against
     * spreadsheet formulas, as every text cell the CSV writer writes). The writer is not closed.
     */
    public static void writeMatrix(Writer w, List<String> assets, double[][] m) throws IOException {
        CsvWriter c = new CsvWriter(w);
        List<Object> header = new ArrayList<>(assets.size() + 1);
        header.add("asset");
        header.addAll(assets);
        c.row(header);
        for (int i = 0; i < assets.size(); i++) {
            c.nameRow(assets.get(i), m[i]);
        }
    }

    private static void write(Path dir, String name, List<String> names, AtomicWrite.TextBody body)
            throws IOException {
        try (Writer w = Files.newBufferedWriter(dir.resolve(name), StandardCharsets.UTF_8)) {
            body.write(w);
        }
        names.add(name);
    }
}

package org.isorisk.engine.io;

import java.nio.file.Path;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/**
 * The per-asset tables {@code estimate} takes (expected returns, reference weights) and the square matrices the
 * repair takes, read with the project's CSV reader and its layouts. The matrix reader does not judge positive
 * definiteness: the repair has to read broken matrices.
 */
public final class AssumptionTables {
    private AssumptionTables() {
    }

    /**
     * A square table with its asset names.
     *
     * @param source the file as given, for messages
     * @param assets names in row order
     * @param matrix entries, rows and columns in the order of {@code assets}
     */
    public record Matrix(String source, List<String> assets, double[][] matrix) {
    }

    /** Reads {@code asset,<valueColumn>} (more columns allowed): asset → value, in file order. */
    public static Map<String, Double> readColumn(Path file, String role, String valueColumn) {
        NamedValues v = NamedValues.read(Csv.read(file, role), valueColumn, "asset," + valueColumn
                + " (one row per asset; more columns allowed)");
        Map<String, Double> out = new LinkedHashMap<>();
        for (int i = 0; i < v.names().size(); i++) {
            out.put(v.names().get(i), v.values()[i]);
        }
        return out;
    }

    /** Reads a square matrix in the covariance layout, rows and columns matched by name. */
    public static Matrix readMatrix(Path file, String role) {
        NamedMatrix m = NamedMatrix.read(Csv.read(file, role), UniverseLoader.COVARIANCE_LAYOUT);
        return new Matrix(file.toString(), m.names(), m.values());
    }
}

package org.isorisk.engine.io;

import java.io.IOException;
import java.io.Reader;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.isorisk.engine.error.InputException;

/**
 * Readers for the small assumption tables that {@code estimate} and the repair take: a per-asset column
 * ({@code asset,expected_return} or {@code asset,weight}; more columns allowed) and a square matrix (first column
 * {@code asset}, header row of the same names, rows in any order, matched by name). The matrix reader does not
 * judge positive definiteness: the repair needs to read broken matrices.
 */
public final class AssumptionTables {
    private AssumptionTables() {
    }

    /**
     * A square table with its asset names.
     *
     * @param assets names in header order
     * @param matrix entries, rows and columns in the order of {@code assets}
     */
    public record NamedMatrix(List<String> assets, double[][] matrix) {
    }

    /** Reads a per-asset column: asset name → value of the column named {@code valueColumn}. */
    public static Map<String, Double> readColumn(Path file, String valueColumn) {
        return withReader(file, r -> readColumn(r, name(file), valueColumn));
    }

    /** Reads a per-asset column from {@code reader}. */
    public static Map<String, Double> readColumn(Reader reader, String source, String valueColumn) {
        CsvRecords csv = new CsvRecords(reader, source);
        CsvRecords.Record header = csv.next();
        if (header == null) {
            throw InputException.of("the file is empty").file(source)
                    .fix("give a header row with the columns asset," + valueColumn).build();
        }
        int assetCol = indexOf(header.fields(), "asset");
        int valueCol = indexOf(header.fields(), valueColumn);
        if (assetCol < 0 || valueCol < 0) {
            throw InputException.of("the header needs the columns 'asset' and '" + valueColumn + "'").file(source)
                    .row(header.row()).value(String.join(",", header.fields()))
                    .fix("name the columns asset," + valueColumn).build();
        }
        Map<String, Double> out = new LinkedHashMap<>();
        Map<String, Integer> rowOf = new HashMap<>();
        for (CsvRecords.Record rec = csv.next(); rec != null; rec = csv.next()) {
            List<String> f = rec.fields();
            if (f.size() != header.fields().size()) {
                throw InputException.of("the row has " + f.size() + " fields but the header has "
                        + header.fields().size()).file(source).row(rec.row()).fix("give one value per column").build();
            }
            String asset = f.get(assetCol);
            if (asset.isEmpty()) {
                throw InputException.of("the asset name is empty").file(source).row(rec.row()).column("asset")
                        .fix("name the asset").build();
            }
            Integer before = rowOf.put(asset, rec.row());
            if (before != null) {
                throw InputException.of("asset listed twice (rows " + before + " and " + rec.row() + ")").file(source)
                        .row(rec.row()).asset(asset).fix("give each asset one row").build();
            }
            out.put(asset, CsvRecords.number(f.get(valueCol), false, source, rec.row(), valueColumn));
        }
        if (out.isEmpty()) {
            throw InputException.of("the table has no rows").file(source).fix("give one row per asset").build();
        }
        return out;
    }

    /** Reads a square matrix; rows and columns are matched by name and returned in header order. */
    public static NamedMatrix readMatrix(Path file) {
        return withReader(file, r -> readMatrix(r, name(file)));
    }

    /** Reads a square matrix from {@code reader}. */
    public static NamedMatrix readMatrix(Reader reader, String source) {
        CsvRecords csv = new CsvRecords(reader, source);
        CsvRecords.Record header = csv.next();
        if (header == null) {
            throw InputException.of("the file is empty").file(source)
                    .fix("give a header row: asset, then the asset names").build();
        }
        List<String> h = header.fields();
        if (!h.get(0).equalsIgnoreCase("asset") || h.size() < 2) {
            throw InputException.of("the first header cell must be 'asset', followed by the asset names").file(source)
                    .row(header.row()).value(h.get(0)).fix("write the header as asset,<name>,<name>,...").build();
        }
        List<String> names = new ArrayList<>(h.subList(1, h.size()));
        int n = names.size();
        Map<String, Integer> col = new HashMap<>();
        for (int j = 0; j < n; j++) {
            if (names.get(j).isEmpty()) {
                throw InputException.of("header column " + (j + 2) + " has no name").file(source).row(header.row())
                        .fix("name every column").build();
            }
            if (col.put(names.get(j), j) != null) {
                throw InputException.of("asset named twice in the header").file(source).row(header.row())
                        .asset(names.get(j)).fix("give each asset one column").build();
            }
        }
        double[][] m = new double[n][];
        int[] rowOf = new int[n];
        for (CsvRecords.Record rec = csv.next(); rec != null; rec = csv.next()) {
            List<String> f = rec.fields();
            if (f.size() != n + 1) {
                throw InputException.of("the row has " + f.size() + " fields but the header has " + (n + 1))
                        .file(source).row(rec.row()).fix("give one value per column").build();
            }
            String asset = f.get(0);
            Integer i = col.get(asset);
            if (i == null) {
                throw InputException.of("the row's asset is not in the header").file(source).row(rec.row())
                        .asset(asset).fix("add it to the header or remove the row").build();
            }
            if (m[i] != null) {
                throw InputException.of("asset has two rows (rows " + rowOf[i] + " and " + rec.row() + ")")
                        .file(source).row(rec.row()).asset(asset).fix("give each asset one row").build();
            }
            double[] v = new double[n];
            for (int j = 0; j < n; j++) {
                v[j] = CsvRecords.number(f.get(j + 1), false, source, rec.row(), names.get(j));
            }
            m[i] = v;
            rowOf[i] = rec.row();
        }
        for (int i = 0; i < n; i++) {
            if (m[i] == null) {
                throw InputException.of("asset of the header has no row").file(source).asset(names.get(i))
                        .fix("add a row for it").build();
            }
        }
        return new NamedMatrix(names, m);
    }

    private static int indexOf(List<String> header, String name) {
        for (int i = 0; i < header.size(); i++) {
            if (header.get(i).equalsIgnoreCase(name)) {
                return i;
            }
        }
        return -1;
    }

    static String name(Path file) {
        return file.getFileName() == null ? file.toString() : file.getFileName().toString();
    }

    private interface Body<T> {
        T read(Reader r);
    }

    private static <T> T withReader(Path file, Body<T> body) {
        try (Reader r = Files.newBufferedReader(file, StandardCharsets.UTF_8)) {
            return body.read(r);
        } catch (NoSuchFileException e) {
            throw InputException.of("file not found").file(file.toString()).fix("check the path").build();
        } catch (IOException e) {
            throw InputException.of("cannot read the file: " + e.getMessage()).file(file.toString()).build();
        }
    }
}

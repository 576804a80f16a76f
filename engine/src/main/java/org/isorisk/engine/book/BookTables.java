package org.isorisk.engine.book;

import java.util.ArrayList;
import java.util.List;
import org.isorisk.engine.book.CsvCells;

/**
 * The tables a book run writes, with their columns and types, and the text of their CSV rows, so that every engine
 * writes the same bytes: {@link #RESULTS} (one row per book row), {@link #WEIGHTS} (long: one row per portfolio and
 * asset), {@link #TRADES} (the rebalance job's trade list) and {@link #STRESS} (the stress job's scenarios). Text
 * cells carry the spreadsheet formula guard ({@link CsvCells#text}); numbers are written exactly
 * ({@link CsvCells#number}); a missing value is an empty cell.
 */
public final class BookTables {
    private BookTables() {
    }

    /** The type of a column's values. */
    public enum Kind {
        /** {@link String}. */
        TEXT,
        /** {@link Double}, decimals; NaN for a missing value. */
        NUMBER,
        /** {@link Long}. */
        INTEGER,
        /** {@link Boolean}. */
        BOOLEAN
    }

    /** One column. */
    public record Column(String name, Kind kind) {
    }

    /** A table: its file name and columns. */
    public record Table(String file, List<Column> columns) {
        public Table {
            columns = List.copyOf(columns);
        }

        /** The header line, with its line end. */
        public String header() {
            List<String> names = new ArrayList<>();
            for (Column c : columns) {
                names.add(CsvCells.text(c.name()));
            }
            return String.join(",", names) + "\n";
        }

        /** The names of the columns. */
        public List<String> names() {
            return columns.stream().map(Column::name).toList();
        }

        /** Zero-based position of the column {@code name}. */
        public int index(String name) {
            for (int i = 0; i < columns.size(); i++) {
                if (columns.get(i).name().equals(name)) {
                    return i;
                }
            }
            throw new IllegalArgumentException("no column " + name + " in " + file);
        }

        /**
         * One row as CSV text with its line end.
         *
         * @param values one per column, of the column's type (or null for an empty cell)
         */
        public String line(Object[] values) {
            if (values.length != columns.size()) {
                throw new IllegalArgumentException(file + " has " + columns.size() + " columns, got " + values.length);
            }
            StringBuilder b = new StringBuilder(16 * values.length);
            for (int i = 0; i < values.length; i++) {
                if (i > 0) {
                    b.append(',');
                }
                b.append(cell(columns.get(i).kind(), values[i]));
            }
            return b.append('\n').toString();
        }
    }

    /** The text of one cell. */
    static String cell(Kind kind, Object v) {
        if (v == null) {
            return "";
        }
        return switch (kind) {
            case TEXT -> CsvCells.text((String) v);
            case NUMBER -> CsvCells.number((Double) v);
            case INTEGER -> Long.toString((Long) v);
            case BOOLEAN -> ((Boolean) v) ? "true" : "false";
        };
    }

    private static Column text(String n) {
        return new Column(n, Kind.TEXT);
    }

    private static Column number(String n) {
        return new Column(n, Kind.NUMBER);
    }

    /**
     * One row per book row: where it is, what happened (status as in the JSON contract, and the single command's
     * one-line message when it failed), the result's figures, the binding constraints with their shadow prices
     * ({@code name=∂V* per unit of the limit}, separated by {@code "; "}), and the certificate's residuals.
     */
    public static final Table RESULTS = new Table("results.csv", List.of(
            new Column("row", Kind.INTEGER), text("id"), text("status"), text("message"), text("assumptions"),
            text("policy"), text("method"), text("objective"), number("target_return"), number("expected_return"),
            number("net_return"), number("volatility"), number("variance"), number("turnover"),
            new Column("trades", Kind.INTEGER), number("cost"), number("tracking_error"),
            number("target_variance_per_unit"), number("target_volatility_per_unit"),
            number("turnover_variance_per_unit"), text("binding"), number("stationarity"), number("primal"),
            number("dual"), number("complementarity"), number("condition_number"),
            new Column("certified", Kind.BOOLEAN), text("warnings")));

    /** One row per portfolio with a solution and asset: {@code id,asset,weight}. */
    public static final Table WEIGHTS = new Table("weights.csv", List.of(text("id"), text("asset"), number("weight")));

    /** The rebalance job's trades, one row per asset traded. */
    public static final Table TRADES = new Table("trades.csv", List.of(text("id"), text("asset"), number("current"),
            number("target"), number("trade"), number("amount"), number("cost"), text("side")));

    /**
     * The stress job's scenarios, one row per portfolio and scenario: the minimum volatility at the portfolio's
     * target under the scenario, its change from the base, the volatility and return of keeping the base proposal,
     * the turnover to re-optimise, the target's marginal risk (∂σ* per unit of target) and the binding constraints.
     */
    public static final Table STRESS = new Table("stress.csv", List.of(text("id"), text("scenario"), text("status"),
            number("target_return"), number("volatility"), number("volatility_change"), number("base_volatility"),
            number("base_return"), number("turnover"), number("target_volatility_per_unit"), text("binding"),
            text("message")));

    /** The tables a job writes besides {@link #RESULTS} and {@link #WEIGHTS}. */
    public static List<Table> extra(Job job) {
        return switch (job) {
            case SOLVE -> List.of();
            case REBALANCE -> List.of(TRADES);
            case STRESS -> List.of(STRESS);
        };
    }
}

package org.isorisk.cli.render;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import org.isorisk.engine.explain.Caution;
import org.isorisk.engine.explain.Explain;
import org.isorisk.engine.io.NumberText;

/** Locale-independent number formats and plain-text layout for tables. */
public final class Text {
    private Text() {
    }

    /** Width that long lines (notes, caution) wrap at. */
    public static final int WIDTH = 100;

    /** A decimal as a percent with two decimals: 0.0123 → "1.23 %". */
    public static String pct(double v) {
        if (!Double.isFinite(v)) {
            return "n/a";
        }
        String s = Explain.percent(v);
        return s.equals("-0.00 %") ? "0.00 %" : s; // a round-off below half a basis point shows no sign
    }

    /** A number with six significant digits. */
    public static String num(double v) {
        return Double.isFinite(v) ? NumberText.show(v) : "n/a";
    }

    /** A number with four decimals (marginal contributions): 0.0222. */
    public static String fixed4(double v) {
        return Double.isFinite(v) ? String.format(Locale.ROOT, "%.4f", v) : "n/a";
    }

    /** A residual or small quantity in scientific notation: 3.1e-17. */
    public static String sci(double v) {
        return Double.isFinite(v) ? String.format(Locale.ROOT, "%.1e", v) : "n/a";
    }

    /** A market value with thousands separators: 2,417,050,000. */
    public static String money(double v) {
        return String.format(Locale.ROOT, "%,.0f", v);
    }

    /**
     * {@code text} wrapped at {@link #WIDTH}, each line starting with {@code first} then {@code rest}. A percent
     * sign stays on the line of the number before it ("0.01 %" is never split).
     */
    public static String wrap(String text, String first, String rest) {
        StringBuilder out = new StringBuilder();
        StringBuilder line = new StringBuilder();
        String prefix = first;
        List<String> words = new ArrayList<>();
        for (String word : text.strip().split("\\s+")) {
            if (word.startsWith("%") && !words.isEmpty()) {
                words.set(words.size() - 1, words.get(words.size() - 1) + " " + word);
            } else {
                words.add(word);
            }
        }
        for (String word : words) {
            if (line.length() > 0 && prefix.length() + line.length() + 1 + word.length() > WIDTH) {
                out.append(prefix).append(line).append('\n');
                prefix = rest;
                line.setLength(0);
            }
            if (line.length() > 0) {
                line.append(' ');
            }
            line.append(word);
        }
        return out.append(prefix).append(line).append('\n').toString();
    }

    /** The caution as the last paragraph of a human-readable result. */
    public static String caution() {
        return wrap(Caution.TEXT, "Caution: ", "         ");
    }

    /** A plain-text table: first column left-aligned, the others right-aligned. */
    public static final class Table {
        private final List<String[]> rows = new ArrayList<>();
        private final int columns;

        public Table(String... header) {
            this.columns = header.length;
            rows.add(header);
        }

        /** Adds a row; missing cells are blank. */
        public Table row(String... cells) {
            String[] r = new String[columns];
            for (int i = 0; i < columns; i++) {
                r[i] = i < cells.length && cells[i] != null ? cells[i] : "";
            }
            rows.add(r);
            return this;
        }

        /** The table, each line indented by {@code indent}, with a rule under the header. */
        public String render(String indent) {
            int[] w = new int[columns];
            for (String[] r : rows) {
                for (int i = 0; i < columns; i++) {
                    w[i] = Math.max(w[i], r[i].length());
                }
            }
            StringBuilder b = new StringBuilder();
            for (int k = 0; k < rows.size(); k++) {
                String[] r = rows.get(k);
                StringBuilder line = new StringBuilder(indent);
                for (int i = 0; i < columns; i++) {
                    if (i > 0) {
                        line.append("  ");
                    }
                    String pad = " ".repeat(w[i] - r[i].length());
                    line.append(i == 0 ? r[i] + pad : pad + r[i]);
                }
                b.append(line.toString().stripTrailing()).append('\n');
                if (k == 0) {
                    int total = 0;
                    for (int x : w) {
                        total += x;
                    }
                    b.append(indent).append("-".repeat(total + 2 * (columns - 1))).append('\n');
                }
            }
            return b.toString();
        }
    }
}

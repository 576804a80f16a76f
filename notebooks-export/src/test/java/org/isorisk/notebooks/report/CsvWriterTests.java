package org.isorisk.notebooks.report;

import static org.junit.jupiter.api.Assertions.assertEquals;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.IOException;
import java.io.StringWriter;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import org.isorisk.engine.io.Csv;
import org.isorisk.engine.io.CsvTable;
import org.isorisk.notebooks.ExternalTools;
import org.isorisk.notebooks.Fixtures;
import org.isorisk.notebooks.PackLayout;
import org.isorisk.notebooks.TableSchema;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class CsvWriterTests {

    private static Table table(List<String> names, double... values) {
        Table.Builder b = Table.builder("t", "T").column(Table.Column.text("asset", "Asset"))
                .column(Table.Column.percent("weight", "Weight"));
        for (int i = 0; i < names.size(); i++) {
            b.row(names.get(i), values[i]);
        }
        return b.build();
    }

    private static final String HEAD = "# caution: " + org.isorisk.engine.explain.Caution.TEXT + "\n# table: T\n";

    /** The CSV text after the two comment lines (checked separately). */
    private static String csv(Table t) {
        StringWriter w = new StringWriter();
        CsvWriter.write(t, w);
        String s = w.toString();
        assertEquals(HEAD, s.substring(0, HEAD.length()), "every table carries the caution");
        return s.substring(HEAD.length());
    }

    @Test
    void textCellsThatASpreadsheetWouldRunAsAFormulaGetOneLeadingApostrophe() {
        // The six triggers are OWASP's list ("CSV Injection"): = + - @ tab carriage-return.
        assertEquals("'=SUM(A1:A2)", CsvWriter.neutralise("=SUM(A1:A2)"));
        assertEquals("'+1", CsvWriter.neutralise("+1"));
        assertEquals("'-1+1", CsvWriter.neutralise("-1+1"));
        assertEquals("'@cmd", CsvWriter.neutralise("@cmd"));
        assertEquals("'\tx", CsvWriter.neutralise("\tx"));
        assertEquals("'\rx", CsvWriter.neutralise("\rx"));
        assertEquals("Cash", CsvWriter.neutralise("Cash"));
        assertEquals("Cash=1", CsvWriter.neutralise("Cash=1"), "only the first character matters");
    }

    @Test
    void apostrophesBeforeATriggerAreGuardedTooSoTheRuleIsReversible() {
        assertEquals("''=x", CsvWriter.neutralise("'=x"));
        assertEquals("'plain", CsvWriter.neutralise("'plain"), "an apostrophe before ordinary text is left alone");
        for (String s : List.of("=x", "'=x", "''@y", "'plain", "'", "", "-", "Cash", "\r\n")) {
            assertEquals(s, CsvWriter.restore(CsvWriter.neutralise(s)), s);
        }
    }

    @Test
    void negativeNumbersStayNumbersWhileTextStartingWithAMinusIsGuarded() {
        String out = csv(table(List.of("-10 Minus", "Bonds"), -0.05, 0.25));
        assertEquals("asset,weight\n'-10 Minus,-0.05\nBonds,0.25\n", out);
    }

    @Test
    void fieldsWithCommasQuotesOrLineBreaksAreQuotedAsInRfc4180() {
        String out = csv(table(List.of("Comma, Inc", "Say \"hi\"", "two\nlines"), 0.1, 0.2, Double.NaN));
        assertEquals("asset,weight\n\"Comma, Inc\",0.1\n\"Say \"\"hi\"\"\",0.2\n\"two\nlines\",\n", out);
    }

    @Test
    void textWithAHashIsQuotedSoCommentAwareReadersKeepIt() {
        assertEquals("asset,weight\n\"# Heading\",0.1\n\"a#b\",0.2\n", csv(table(List.of("# Heading", "a#b"), 0.1, 0.2)));
    }

    @Test
    void numbersAreWrittenAtFullPrecision() {
        String out = csv(table(List.of("A"), 0.1 + 0.2));
        assertEquals("asset,weight\nA,0.30000000000000004\n", out);
    }

    @Test
    void theNotebooksLoaderReadsGuardedTablesBackAsTheyWereGiven(@TempDir Path dir) throws IOException {
        // Outside reference: pandas (Debian python3-pandas) reading the CSV through the notebook's own helper code.
        ExternalTools.assumeModules("python3-pandas", "pandas");
        List<String> names = new java.util.ArrayList<>(Fixtures.HOSTILE);
        names.add("# not a comment");
        names.add("a#b");
        Table t = table(names, -0.05, 0.0, 1e-17, 0.1 + 0.2, Double.NaN, 1.0, 2.0);
        Files.createDirectories(dir.resolve(PackLayout.TABLES));
        try (var w = Files.newBufferedWriter(dir.resolve(PackLayout.table("t")), StandardCharsets.UTF_8)) {
            CsvWriter.write(t, w);
        }
        try (var out = Files.newOutputStream(dir.resolve(PackLayout.SCHEMA))) {
            TableSchema.write(List.of(t), out);
        }
        try (var out = Files.newOutputStream(dir.resolve(PackLayout.HELPER))) {
            TableSchema.writeHelper(out);
        }
        String script = "import json, math\nfrom pack_tables import load\nframe = load('t')\n"
                + "print(json.dumps([[k, None if math.isnan(v) else v] for k, v in frame['weight'].items()]))\n";
        ExternalTools.Run r = ExternalTools.run(dir, 120, ExternalTools.PYTHON, "-c", script);
        assertEquals(0, r.exit(), r.err());
        JsonNode back = new ObjectMapper().readTree(r.out());
        double[] expected = {-0.05, 0.0, 1e-17, 0.1 + 0.2, Double.NaN, 1.0, 2.0};
        for (int i = 0; i < names.size(); i++) {
            assertEquals(names.get(i), back.get(i).get(0).asText());
            if (Double.isNaN(expected[i])) {
                assertEquals(true, back.get(i).get(1).isNull());
            } else {
                assertEquals(expected[i], back.get(i).get(1).asDouble(), 0.0, "exact round trip");
            }
        }
    }

    @Test
    void writtenCsvReadsBackCellForCell() throws IOException {
        StringWriter s = new StringWriter();
        new CsvWriter(s).comment("caution", "line one\nline two").row("asset", "weight", "note")
                .row("Bonds, long", 0.1 + 0.2, "say \"hi\"").row("#hash", 1e-9, null);
        CsvTable t = Csv.parse("o.csv", "weights", s.toString());
        assertEquals("line one line two", t.meta("caution").orElseThrow().value());
        assertEquals("Bonds, long", t.rows().get(0).cell(0));
        assertEquals(0.1 + 0.2, t.number(t.rows().get(0), 1, null), "full precision survives");
        assertEquals("say \"hi\"", t.rows().get(0).cell(2));
        assertEquals("#hash", t.rows().get(1).cell(0));
        assertEquals(1e-9, t.number(t.rows().get(1), 1, null));
        assertEquals("", t.rows().get(1).cell(2));
    }

    /** Names a spreadsheet would run as formulas (OWASP, "CSV Injection") and other hostile names. */
    private static final List<String> FORMULAS = List.of("=SUM(A1:A9)", "+Plus", "-Minus", "@At", "\tTab", "'=quoted",
            "''@twice", "=cmd|' /C calc'!A0", "-10 Minus, Start", "'plain", "Cash");

    @Test
    void everyRowGuardsItsTextCellsAndNeverItsNumbers() {
        String csv = CsvWriter.text(w -> w.row("=x", -0.05, 3, -2L, true, null, "-0.05"));
        assertEquals("'=x,-0.05,3,-2,true,,'-0.05\n", csv, "a number given as text is text, and guarded");
        assertEquals("'@A,-1.5,0.25\n", CsvWriter.text(w -> w.nameRow("@A", new double[]{-1.5, 0.25})));
        assertEquals("'=x,\"'-a, b\"\n", CsvWriter.text(w -> w.row(List.of("=x", "-a, b"))));
    }

    @Test
    void commentLinesAreGuardedWhereASpreadsheetWouldStartACell() {
        String csv = CsvWriter.text(w -> w.comment("note", "A, =B,\"@C\", -0.05 %, plain, 'D"));
        assertEquals("# note: A, '=B,\"'@C\", '-0.05 %, plain, 'D\n", csv);
    }

    @Test
    void hostileNamesReadBackThroughTheEnginesReaderAsTheyWereGiven() {
        // The writer's guard and the engine's reader (engine.io.Csv) are two halves of one rule: every text cell
        // and header, and the text of a comment line, comes back unchanged; every number stays a number.
        String csv = CsvWriter.text(w -> {
            w.comment("scenario", String.join(", ", FORMULAS));
            List<Object> header = new java.util.ArrayList<>(List.of("asset"));
            header.addAll(FORMULAS);
            w.row(header);
            for (int i = 0; i < FORMULAS.size(); i++) {
                double[] row = new double[FORMULAS.size()];
                row[i] = -0.05 * (i + 1);
                w.nameRow(FORMULAS.get(i), row);
            }
        });
        CsvTable t = Csv.parse("o.csv", "covariance", csv);
        assertEquals(String.join(", ", FORMULAS), t.meta("scenario").orElseThrow().value());
        assertEquals(FORMULAS, t.header().subList(1, t.header().size()));
        for (int i = 0; i < FORMULAS.size(); i++) {
            assertEquals(FORMULAS.get(i), t.rows().get(i).cell(0));
            assertEquals(-0.05 * (i + 1), t.number(t.rows().get(i), i + 1, null));
        }
    }
}

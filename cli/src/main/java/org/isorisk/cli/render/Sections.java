package org.isorisk.cli.render;

import java.io.IOException;
import java.util.List;
import org.isorisk.engine.explain.Caution;
import org.isorisk.engine.io.Provenance;
import org.isorisk.notebooks.report.CsvWriter;

/** Pieces that several views print the same way: inputs, warnings, notes. */
final class Sections {
    private Sections() {
    }

    static String inputs(Provenance p) {
        StringBuilder b = new StringBuilder();
        if (p.scenario() != null) {
            b.append(Text.wrap(p.scenario(), "Scenario: ", "          "));
        }
        return b.append(Text.wrap(p.describe(), "Inputs: ", "        ")).toString();
    }

    static String bullets(String title, List<String> items) {
        if (items.isEmpty()) {
            return "";
        }
        StringBuilder b = new StringBuilder("\n").append(title).append('\n');
        for (String s : items) {
            b.append(Text.wrap(s, "  - ", "    "));
        }
        return b.toString();
    }

    /** The comment lines every CSV result starts with. */
    static void csvHeader(CsvWriter w, String command, Provenance p, List<String> warnings) throws IOException {
        w.comment("generated_by", "isorisk " + command);
        w.comment("caution", Caution.TEXT);
        if (p.asOf() != null) {
            w.comment("as_of", p.asOf().toString());
        }
        w.comment("inputs", p.describe());
        for (String s : warnings) {
            w.comment("warning", s);
        }
    }
}

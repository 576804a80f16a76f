package org.isorisk.cli.render;

import com.fasterxml.jackson.databind.node.ObjectNode;
import java.io.StringWriter;
import java.nio.file.Path;
import java.util.List;
import org.isorisk.cli.json.ResultJson;
import org.isorisk.engine.estimate.RepairResult;
import org.isorisk.engine.explain.Caution;
import org.isorisk.notebooks.report.CsvWriter;

/**
 * The result of {@code isorisk check --repair}: what the repair changed, and the files written (none when the
 * matrix was already positive definite).
 *
 * @param result the repair
 * @param source the input file as given
 * @param outDir the output folder
 * @param files  names of the files written
 */
public record RepairView(RepairResult result, String source, Path outDir, List<String> files) implements Rendered {

    public RepairView {
        files = List.copyOf(files);
    }

    @Override
    public ObjectNode json() {
        ObjectNode o = RepairReport.json(result, source);
        o.remove("caution");
        o.put("out_dir", outDir.toString());
        o.set("files", ResultJson.strings(files));
        return o;
    }

    @Override
    public String table() {
        StringWriter w = new StringWriter();
        if (files.isEmpty()) {
            w.write("Nothing written: the matrix needs no repair.\n\n");
        } else {
            w.write("Wrote " + outDir + ": " + String.join(", ", files) + "\n\n");
        }
        RepairReport.text(w, result, source);
        return w.toString();
    }

    @Override
    public String csv() {
        return CsvWriter.text(c -> {
            c.comment("command", "check --repair");
            c.comment("source", source);
            c.comment("changed", Boolean.toString(result.changed()));
            c.comment("frobenius_distance", CsvWriter.number(result.frobeniusDistance()));
            c.comment("caution", Caution.TEXT);
            c.row("first", "second", "correlation_before", "correlation_after", "value_before", "value_after");
            for (RepairResult.Change ch : result.largestChanges()) {
                c.row(ch.first(), ch.second(), ch.correlationBefore(), ch.correlationAfter(), ch.valueBefore(),
                        ch.valueAfter());
            }
        });
    }

    @Override
    public List<String> warnings() {
        return result.changed() ? List.of("the matrix was repaired: check the largest changes before using it")
                : List.of();
    }
}

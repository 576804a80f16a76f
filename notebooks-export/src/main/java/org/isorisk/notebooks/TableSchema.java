package org.isorisk.notebooks;

import com.fasterxml.jackson.core.JsonGenerator;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.SerializationFeature;
import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.JsonNodeFactory;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.io.IOException;
import java.io.InputStream;
import java.io.OutputStream;
import java.io.UncheckedIOException;
import java.util.List;
import java.util.Locale;
import org.isorisk.notebooks.report.Table;

/**
 * The description of a pack's tables that its Python helper reads ({@link PackLayout#SCHEMA}): for each table
 * its title and its columns (key, heading, format), so that {@code load()} knows the text columns and
 * {@code show()} formats numbers as the notebook does. Also supplies the helper module itself.
 */
public final class TableSchema {
    private TableSchema() {
    }

    /** Writes the schema of {@code tables} as JSON; does not close the stream. */
    public static void write(List<Table> tables, OutputStream out) {
        ObjectNode root = JsonNodeFactory.instance.objectNode();
        for (Table t : tables) {
            ObjectNode o = root.putObject(t.name());
            o.put("title", t.title());
            o.put("file", PackLayout.table(t.name()));
            ArrayNode cols = o.putArray("columns");
            for (Table.Column c : t.columns()) {
                ObjectNode col = cols.addObject();
                col.put("key", c.key());
                col.put("label", c.label());
                col.put("format", c.format().name().toLowerCase(Locale.ROOT));
            }
        }
        try {
            new ObjectMapper().enable(SerializationFeature.INDENT_OUTPUT)
                    .disable(JsonGenerator.Feature.AUTO_CLOSE_TARGET).writeValue(out, root);
            out.write('\n');
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    /** Copies the helper module {@link PackLayout#HELPER} (a resource of this library) to {@code out}. */
    public static void writeHelper(OutputStream out) {
        try (InputStream in = TableSchema.class.getResourceAsStream(PackLayout.HELPER)) {
            if (in == null) {
                throw new IllegalStateException(PackLayout.HELPER + " is missing from the notebooks-export jar");
            }
            in.transferTo(out);
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }
}

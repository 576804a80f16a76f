package org.isorisk.notebooks.folder;

import java.io.OutputStreamWriter;
import java.io.Writer;
import java.nio.charset.StandardCharsets;
import org.isorisk.notebooks.NotebookWriter;
import org.isorisk.notebooks.PackContent;
import org.isorisk.notebooks.PackLayout;
import org.isorisk.notebooks.TableSchema;
import org.isorisk.notebooks.report.CsvWriter;
import org.isorisk.notebooks.report.Table;

/** Adds the files of a {@link PackContent} to a {@link PackFolder}: the notebook, every table, every chart. */
public final class PackFiles {
    private PackFiles() {
    }

    /**
     * Adds the notebook, its Python helper and table schema, the CSV tables and the chart files (PNG, SVG and,
     * when made, PDF).
     */
    public static PackFolder addTo(PackFolder folder, PackContent content) {
        folder.add(PackLayout.NOTEBOOK, out -> NotebookWriter.write(content, out));
        folder.add(PackLayout.HELPER, TableSchema::writeHelper);
        folder.add(PackLayout.SCHEMA, out -> TableSchema.write(content.tables(), out));
        for (Table t : content.tables()) {
            folder.add(PackLayout.table(t.name()), out -> {
                Writer w = new OutputStreamWriter(out, StandardCharsets.UTF_8);
                CsvWriter.write(t, w);
                w.flush();
            });
        }
        for (PackContent.Chart c : content.charts()) {
            folder.add(PackLayout.chart(c.name(), "png"), out -> out.write(c.png()));
            folder.add(PackLayout.chart(c.name(), "svg"), out -> out.write(c.svg().getBytes(StandardCharsets.UTF_8)));
            byte[] pdf = c.pdf();
            if (pdf.length > 0) {
                folder.add(PackLayout.chart(c.name(), "pdf"), out -> out.write(pdf));
            }
        }
        return folder;
    }
}

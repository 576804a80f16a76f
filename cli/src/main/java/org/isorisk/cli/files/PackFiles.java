package org.isorisk.cli.files;

import org.isorisk.notebooks.PackContent;
import org.isorisk.notebooks.PackLayout;

/**
 * Adds the files of a {@link PackContent} to a {@link PackFolder}: what {@link PackLayout#files} renders (the
 * notebook, its Python helper and table schema, every table, every chart), under the names it gives.
 */
public final class PackFiles {
    private PackFiles() {
    }

    /**
     * Adds the notebook, its Python helper and table schema, the CSV tables and the chart files (PNG, SVG and,
     * when made, PDF).
     */
    public static PackFolder addTo(PackFolder folder, PackContent content) {
        for (PackLayout.Entry f : PackLayout.files(content)) {
            folder.add(f.path(), out -> f.body().writeTo(out));
        }
        return folder;
    }
}

package org.isorisk.cli.render;

import com.fasterxml.jackson.databind.node.ObjectNode;
import java.util.List;

/** One result in its three renderings; a command prints only the one asked for. */
public interface Rendered {

    /** The JSON object, without {@code timing_ms.total} and {@code caution} (added when printed). */
    ObjectNode json();

    /** Human-readable text ending with the caution. */
    String table();

    /** CSV with {@code # key: value} lines above the header, the caution among them. */
    String csv();

    /** Warnings found while reading the inputs. */
    List<String> warnings();
}

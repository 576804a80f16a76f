package org.isorisk.notebooks.pack;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.util.List;
import org.junit.jupiter.api.Test;

/** The composer's own rules; its layout of engine results is checked by the command line's pack tests. */
class PackComposerTests {

    @Test
    void columnKeysAreUniquePythonIdentifiers() {
        assertEquals(List.of("government_bonds", "government_bonds_2", "asset_3_10y", "cafe", "asset_5"),
                PackComposer.columnKeys(List.of("Government Bonds", "Government-Bonds", "10y", "Café", "€")));
    }
}

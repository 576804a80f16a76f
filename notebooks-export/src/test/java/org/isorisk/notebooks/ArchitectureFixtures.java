package org.isorisk.notebooks;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import org.isorisk.engine.io.Provenance;
import org.isorisk.engine.io.UniverseFiles;
import org.isorisk.engine.io.UniverseLoader;
import org.isorisk.engine.linalg.Cholesky;
import org.isorisk.engine.model.AllocationRequest;
import org.isorisk.engine.model.AssetUniverse;
import org.isorisk.engine.model.Solution;
import org.isorisk.engine.risk.Correlations;
import org.isorisk.engine.solve.Allocator;

/** Classes that break notebooks-export's dependency rules on purpose, to show that the rules catch them. Never run. */
final class ArchitectureFixtures {
    private ArchitectureFixtures() {
    }

    /** Runs an analysis: solves. */
    static final class Solves {
        Solution solve(AllocationRequest r) {
            return Allocator.solve(r);
        }
    }

    /** Computes the correlations itself instead of taking them from the results. */
    static final class MeasuresCorrelations {
        double average(AssetUniverse u) {
            return Correlations.of(u).average();
        }
    }

    /** Uses the engine's linear algebra. */
    static final class Factors {
        Object factor(double[][] a) {
            return Cholesky.class.getName() + a.length;
        }
    }

    /** Reads the assumption files. */
    static final class ReadsAssumptions {
        Object read(Path mu, Path cov) {
            return UniverseLoader.load(UniverseFiles.of(mu, cov));
        }
    }

    /** Opens a file. */
    static final class OpensAFile {
        String read(Path p) throws IOException {
            return Files.readString(p);
        }
    }

    /** Shows where the inputs came from: allowed. */
    static final class ShowsProvenance {
        String show(Provenance p) {
            return p.describe();
        }
    }
}

package org.isorisk.notebooks;

import static com.tngtech.archunit.base.DescribedPredicate.not;
import static com.tngtech.archunit.core.domain.JavaClass.Predicates.belongToAnyOf;
import static com.tngtech.archunit.core.domain.JavaClass.Predicates.resideInAPackage;
import static com.tngtech.archunit.lang.syntax.ArchRuleDefinition.noClasses;
import static com.tngtech.archunit.library.dependencies.SlicesRuleDefinition.slices;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.tngtech.archunit.core.domain.JavaClasses;
import com.tngtech.archunit.core.importer.ClassFileImporter;
import com.tngtech.archunit.junit.AnalyzeClasses;
import com.tngtech.archunit.junit.ArchTest;
import com.tngtech.archunit.lang.ArchRule;
import java.util.List;
import java.util.Set;
import org.isorisk.engine.Architecture;
import org.isorisk.engine.estimate.Estimator;
import org.isorisk.engine.estimate.Repair;
import org.isorisk.engine.frontier.Frontiers;
import org.isorisk.engine.io.Provenance;
import org.isorisk.engine.io.SourceFile;
import org.isorisk.engine.model.AssetUniverse;
import org.isorisk.engine.rebalance.Rebalancer;
import org.isorisk.engine.rebalance.TradingLimits;
import org.isorisk.engine.risk.AssumptionSummary;
import org.isorisk.engine.risk.Correlations;
import org.isorisk.engine.risk.RiskAnalysis;
import org.isorisk.engine.solve.Allocator;
import org.isorisk.engine.stress.CorrelationRepair;
import org.isorisk.engine.stress.Shocks;
import org.isorisk.engine.stress.Stress;

/**
 * notebooks-export's place among the modules (DESIGN.md, "Modules and the way data flows"), as ArchUnit rules
 * over its main classes: it renders values it is given into writers and streams it is given. It runs no analysis
 * (the command line's use cases do), reads and opens no file, knows nothing of the command line, and its packages
 * depend on each other without cycles.
 */
@AnalyzeClasses(packages = "org.isorisk.notebooks", importOptions = Architecture.MainClassesOnly.class)
class DependencyRulesTests {

    /**
     * The engine's front doors to its analyses: solving, frontiers, rebalancing, stress, risk, estimation and
     * repair (with the stress run's shocks and correlation repair).
     */
    static final List<Class<?>> ANALYSES = List.of(Allocator.class, Frontiers.class, Rebalancer.class, Stress.class,
            Shocks.class, CorrelationRepair.class, RiskAnalysis.class, Estimator.class, Repair.class);

    @ArchTest
    static final ArchRule notebooksKnowNothingOfTheCommandLine = noClasses()
            .that().resideInAPackage("org.isorisk.notebooks..")
            .should().dependOnClassesThat().resideInAnyPackage("org.isorisk.cli..", "org.isorisk.bench..")
            .because("dependencies point one way: cli -> notebooks-export -> engine (STYLE.md, rule 1)");

    @ArchTest
    static final ArchRule notebooksRunNoAnalysis = noClasses()
            .that().resideInAPackage("org.isorisk.notebooks..")
            .should().dependOnClassesThat().belongToAnyOf(ANALYSES.toArray(Class<?>[]::new))
            .orShould().dependOnClassesThat().resideInAnyPackage("org.isorisk.engine.solve..",
                    "org.isorisk.engine.linalg..", "org.isorisk.engine.synthetic..")
            .orShould().callMethod(Correlations.class, "of", AssetUniverse.class)
            .orShould().callMethod(AssumptionSummary.class, "of", AssetUniverse.class,
                    org.isorisk.engine.linalg.Spectrum.class)
            .orShould().callMethod(TradingLimits.class, "turnover", double[].class, double[].class)
            .orShould().callMethod(TradingLimits.class, "cost", double[].class, double[].class)
            .because("which analyses a committee sees, and running them, is the command line's use case "
                    + "(cli.usecase); notebooks-export lays out the results it is given");

    @ArchTest
    static final ArchRule notebooksReadAndOpenNoFiles = noClasses()
            .that().resideInAPackage("org.isorisk.notebooks..")
            .should().dependOnClassesThat(resideInAPackage("org.isorisk.engine.io..")
                    .and(not(belongToAnyOf(Provenance.class, SourceFile.class))))
            .orShould().dependOnClassesThat().belongToAnyOf(java.nio.file.Files.class, java.io.FileInputStream.class,
                    java.io.FileOutputStream.class, java.io.FileReader.class, java.io.FileWriter.class,
                    java.io.RandomAccessFile.class)
            .because("inputs are read by the engine's readers and files are published by the command line "
                    + "(cli.files); of engine.io only the values Provenance and SourceFile are shown");

    @ArchTest
    static final ArchRule notebooksPackagesHaveNoCycles = slices()
            .assignedFrom(Architecture.packagesOf("org.isorisk.notebooks"))
            .should().beFreeOfCycles();

    @ArchTest
    static void theCycleRuleSeesEveryPackageOfNotebooks(JavaClasses classes) {
        Set<String> found = Architecture.packageSlices(classes, "org.isorisk.notebooks");
        for (String p : List.of("org.isorisk.notebooks", "org.isorisk.notebooks.chart", "org.isorisk.notebooks.report",
                "org.isorisk.notebooks.pack")) {
            assertTrue(found.contains(p), p + " among " + found);
        }
    }

    @ArchTest
    static void theRulesCatchWhatTheyForbid(JavaClasses ignored) {
        ClassFileImporter importer = new ClassFileImporter();
        for (Class<?> c : List.of(ArchitectureFixtures.Solves.class, ArchitectureFixtures.MeasuresCorrelations.class,
                ArchitectureFixtures.Factors.class)) {
            assertTrue(notebooksRunNoAnalysis.evaluate(importer.importClasses(c)).hasViolation(), c.getName());
        }
        for (Class<?> c : List.of(ArchitectureFixtures.ReadsAssumptions.class, ArchitectureFixtures.OpensAFile.class)) {
            assertTrue(notebooksReadAndOpenNoFiles.evaluate(importer.importClasses(c)).hasViolation(), c.getName());
        }
        assertTrue(!notebooksReadAndOpenNoFiles.evaluate(importer.importClasses(
                ArchitectureFixtures.ShowsProvenance.class)).hasViolation(), "Provenance is a value to show");
    }
}

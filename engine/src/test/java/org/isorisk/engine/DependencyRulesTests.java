package org.isorisk.engine;

import static com.tngtech.archunit.lang.syntax.ArchRuleDefinition.noClasses;
import static com.tngtech.archunit.library.dependencies.SlicesRuleDefinition.slices;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.tngtech.archunit.base.DescribedPredicate;
import com.tngtech.archunit.core.domain.JavaClasses;
import com.tngtech.archunit.core.domain.JavaMethodCall;
import com.tngtech.archunit.core.importer.ClassFileImporter;
import com.tngtech.archunit.junit.AnalyzeClasses;
import com.tngtech.archunit.junit.ArchTest;
import com.tngtech.archunit.lang.ArchRule;
import java.nio.file.Files;
import java.util.List;
import java.util.Set;
import java.util.regex.Pattern;

/**
 * The engine's place among the modules (DESIGN.md, "Modules and the way data flows"), as ArchUnit rules over its
 * main classes: it reads inputs and computes; it renders nothing, writes no files and knows nothing of the modules
 * that show and publish its results; its packages depend on each other without cycles. The grep-based
 * {@link ArchitectureTests} keeps the numerical packages free of I/O.
 */
@AnalyzeClasses(packages = "org.isorisk.engine", importOptions = Architecture.MainClassesOnly.class)
class DependencyRulesTests {

    /** Methods of {@link Files} that create, change, move or delete files. */
    static final Pattern WRITING = Pattern.compile("write.*|newOutputStream|newBufferedWriter|move|copy|delete.*"
            + "|create.*|set.*");

    /** A call to a method of {@link Files} that writes. */
    static final DescribedPredicate<JavaMethodCall> WRITES_A_FILE = DescribedPredicate.describe(
            "a method of java.nio.file.Files that creates, changes, moves or deletes a file",
            call -> call.getTargetOwner().isEquivalentTo(Files.class) && WRITING.matcher(call.getName()).matches());

    @ArchTest
    static final ArchRule theEngineKnowsNothingOfTheModulesThatShowItsResults = noClasses()
            .that().resideInAPackage("org.isorisk.engine..")
            .should().dependOnClassesThat().resideInAnyPackage("org.isorisk.notebooks..", "org.isorisk.cli..",
                    "org.isorisk.bench..")
            .because("dependencies point one way: cli -> notebooks-export -> engine (STYLE.md, rule 1)");

    @ArchTest
    static final ArchRule theEngineDrawsNothing = noClasses()
            .that().resideInAPackage("org.isorisk.engine..")
            .should().dependOnClassesThat().resideInAnyPackage("org.knowm.xchart..", "de.erichseifert..",
                    "de.rototor..", "java.awt..", "javax.imageio..", "javax.swing..")
            .because("charts are drawn in notebooks-export; the engine's POM has no chart library");

    @ArchTest
    static final ArchRule theEngineWritesNoFilesAndPrintsNothing = noClasses()
            .that().resideInAPackage("org.isorisk.engine..")
            .should().callMethodWhere(WRITES_A_FILE)
            .orShould().dependOnClassesThat().belongToAnyOf(java.io.FileOutputStream.class, java.io.FileWriter.class,
                    java.io.RandomAccessFile.class, java.nio.channels.FileChannel.class)
            .orShould().accessField(System.class, "out")
            .orShould().accessField(System.class, "err")
            .because("results are published by the command line (cli.files) and shown by it or notebooks-export");

    @ArchTest
    static final ArchRule theEnginesPackagesHaveNoCycles = slices()
            .assignedFrom(Architecture.packagesOf("org.isorisk.engine"))
            .should().beFreeOfCycles();

    @ArchTest
    static void theCycleRuleSeesEveryPackageOfTheEngine(JavaClasses classes) {
        Set<String> found = Architecture.packageSlices(classes, "org.isorisk.engine");
        for (String p : List.of("model", "error", "linalg", "solve", "estimate", "rebalance", "stress", "frontier",
                "risk", "explain", "io", "synthetic")) {
            assertTrue(found.contains("org.isorisk.engine." + p), p + " among " + found);
        }
    }

    @ArchTest
    static void theRulesCatchWhatTheyForbid(JavaClasses ignored) {
        JavaClasses bad = new ClassFileImporter().importClasses(ArchitectureFixtures.DrawsWithAwt.class,
                ArchitectureFixtures.WritesAFile.class, ArchitectureFixtures.Prints.class);
        assertTrue(theEngineDrawsNothing.evaluate(bad).hasViolation(), "java.awt in an engine class");
        assertTrue(theEngineWritesNoFilesAndPrintsNothing.evaluate(new ClassFileImporter()
                .importClasses(ArchitectureFixtures.WritesAFile.class)).hasViolation(), "Files.writeString");
        assertTrue(theEngineWritesNoFilesAndPrintsNothing.evaluate(new ClassFileImporter()
                .importClasses(ArchitectureFixtures.Prints.class)).hasViolation(), "System.out");
    }
}

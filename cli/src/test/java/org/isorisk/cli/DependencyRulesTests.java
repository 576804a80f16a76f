package org.isorisk.cli;

import static com.tngtech.archunit.core.domain.JavaCall.Predicates.target;
import static com.tngtech.archunit.core.domain.JavaClass.Predicates.assignableTo;
import static com.tngtech.archunit.core.domain.properties.HasName.Predicates.nameMatching;
import static com.tngtech.archunit.core.domain.properties.HasOwner.Predicates.With.owner;
import static com.tngtech.archunit.lang.syntax.ArchRuleDefinition.noClasses;
import static com.tngtech.archunit.library.dependencies.SlicesRuleDefinition.slices;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.tngtech.archunit.core.domain.JavaClasses;
import com.tngtech.archunit.junit.AnalyzeClasses;
import com.tngtech.archunit.junit.ArchTest;
import com.tngtech.archunit.lang.ArchRule;
import com.tngtech.archunit.library.dependencies.Slice;
import com.tngtech.archunit.library.dependencies.Slices;
import java.util.List;
import java.util.Set;
import java.util.TreeSet;
import org.isorisk.engine.Architecture;

/**
 * The command line's place among the modules, as ArchUnit rules over the main classes on its class path (engine,
 * notebooks-export and cli): the modules depend on each other without cycles, and so do the command line's own
 * packages, its root included (the root command registers the commands; no command refers back to it); and only
 * {@code cli.files} writes files, so every result goes through the check that no output replaces an input. The engine's
 * and notebooks-export's own rules are in their modules' {@code DependencyRulesTests}.
 */
@AnalyzeClasses(packages = "org.isorisk", importOptions = Architecture.MainClassesOnly.class)
class DependencyRulesTests {

    @ArchTest
    static final ArchRule theModulesHaveNoCycles = slices().matching("org.isorisk.(*)..").should().beFreeOfCycles();

    @ArchTest
    static final ArchRule theCommandLinesPackagesHaveNoCycles = slices()
            .assignedFrom(Architecture.packagesOf("org.isorisk.cli"))
            .should().beFreeOfCycles();

    /**
     * Results reach the disk only through {@code cli.files} ({@code RunFiles} → {@code AtomicWrite}): no other class
     * of the command line writes, moves or creates a file or folder itself. ({@code Main} opens the standard streams.)
     */
    @ArchTest
    static final ArchRule onlyTheFilesPackageWritesFiles = noClasses().that().resideInAPackage("org.isorisk.cli..")
            .and().resideOutsideOfPackage("org.isorisk.cli.files..")
            .and().doNotHaveFullyQualifiedName("org.isorisk.cli.Main")
            .should().callMethodWhere(target(owner(assignableTo(java.nio.file.Files.class)))
                    .and(target(nameMatching("write|writeString|newBufferedWriter|newOutputStream|newByteChannel|move"
                            + "|createFile|createDirectory|createDirectories|createLink|createSymbolicLink"))))
            .orShould().callConstructorWhere(target(owner(assignableTo(java.io.FileOutputStream.class))
                    .or(owner(assignableTo(java.io.FileWriter.class)))
                    .or(owner(assignableTo(java.io.RandomAccessFile.class)))))
            .because("an output never replaces an input of the same run: cli.files.RunFiles checks every target");

    @ArchTest
    static void theModuleRuleSeesTheThreeModules(JavaClasses classes) {
        Set<String> modules = new TreeSet<>();
        for (Slice s : Slices.matching("org.isorisk.(*)..").transform(classes)) {
            modules.add(s.getNamePart(1));
        }
        assertEquals(Set.of("cli", "engine", "notebooks"), modules);
    }

    @ArchTest
    static void theCycleRuleSeesEveryPackageOfTheCommandLine(JavaClasses classes) {
        Set<String> found = Architecture.packageSlices(classes, "org.isorisk.cli");
        for (String p : List.of("", ".commands", ".options", ".usecase", ".render", ".json", ".files")) {
            assertTrue(found.contains("org.isorisk.cli" + p), "org.isorisk.cli" + p + " among " + found);
        }
    }
}

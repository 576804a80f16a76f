package org.isorisk.cli;

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
 * packages, its root included (the root command registers the commands; no command refers back to it). The engine's
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

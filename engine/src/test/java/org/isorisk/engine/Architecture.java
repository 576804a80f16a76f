package org.isorisk.engine;

import com.tngtech.archunit.core.domain.JavaClass;
import com.tngtech.archunit.core.domain.JavaClasses;
import com.tngtech.archunit.core.importer.ImportOption;
import com.tngtech.archunit.core.importer.Location;
import com.tngtech.archunit.library.dependencies.Slice;
import com.tngtech.archunit.library.dependencies.SliceAssignment;
import com.tngtech.archunit.library.dependencies.SliceIdentifier;
import com.tngtech.archunit.library.dependencies.Slices;
import java.util.Set;
import java.util.TreeSet;
import java.util.regex.Pattern;

/**
 * What the modules' ArchUnit rules share (each module's {@code DependencyRulesTests}): which classes are analysed
 * and how a module is cut into packages for the cycle rule.
 */
public final class Architecture {
    private Architecture() {
    }

    /**
     * Main classes only: no test classes, neither a module's own ({@code target/test-classes}) nor another module's
     * test-support jar ({@code *-tests.jar}), which shares the main packages' names and would add dependencies
     * that no shipped class has.
     */
    public static final class MainClassesOnly implements ImportOption {
        private static final Pattern TEST_JAR = Pattern.compile(".*-tests\\.jar.*");

        @Override
        public boolean includes(Location location) {
            return !location.contains("/test-classes/") && !location.matches(TEST_JAR);
        }
    }

    /**
     * Every package at or below {@code root} (e.g. {@code org.isorisk.cli}) is a slice of its own, the root package
     * included (ArchUnit's {@code matching("org.isorisk.cli.(**)")} would leave the root's classes out); classes
     * elsewhere are ignored.
     */
    public static SliceAssignment packagesOf(String root) {
        return new SliceAssignment() {
            @Override
            public SliceIdentifier getIdentifierOf(JavaClass c) {
                String p = c.getPackageName();
                return p.equals(root) || p.startsWith(root + ".") ? SliceIdentifier.of(p) : SliceIdentifier.ignore();
            }

            @Override
            public String getDescription() {
                return "the packages of " + root + " (each package a slice, " + root + " itself included)";
            }
        };
    }

    /** The names of the slices {@link #packagesOf} cuts {@code classes} into, sorted. */
    public static Set<String> packageSlices(JavaClasses classes, String root) {
        Set<String> names = new TreeSet<>();
        for (Slice s : Slices.assignedFrom(packagesOf(root)).transform(classes)) {
            names.add(s.getNamePart(1));
        }
        return names;
    }
}

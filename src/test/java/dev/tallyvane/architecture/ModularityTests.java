package dev.tallyvane.architecture;

import static org.assertj.core.api.Assertions.assertThat;

import com.tngtech.archunit.core.domain.JavaClass;
import org.junit.jupiter.api.Test;
import org.springframework.modulith.core.ApplicationModules;
import org.springframework.modulith.docs.Documenter;

/**
 * The feature packages are application modules (Spring Modulith): no cycles between them, and no
 * module reaches into another's sub-packages (its internals); each offers what others may use in its
 * top-level package. The plain-Java engine is left out here, being a library every module may use;
 * {@link ArchitectureTests} keeps it pure.
 */
class ModularityTests {

    static final ApplicationModules MODULES = ApplicationModules.of("dev.tallyvane",
            JavaClass.Predicates.resideInAPackage("dev.tallyvane.engine.."));

    @Test
    void theModulesKeepTheirBoundaries() {
        MODULES.verify();
    }

    @Test
    void aModuleReachingIntoAnothersInternalsIsAViolation() {
        // the probe: two modules, one of which uses a class in the other's sub-package
        ApplicationModules probe = ApplicationModules.of("dev.tallyvane.architecture.probe",
                new com.tngtech.archunit.core.importer.ImportOption.OnlyIncludeTests());
        assertThat(probe.detectViolations().hasViolations()).as("the probe's violation is found").isTrue();
        assertThat(probe.detectViolations().getMessages()).anySatisfy(m -> assertThat(m).contains("Hidden"));
    }

    @Test
    void writesTheModuleDiagramIntoDocs() throws java.io.IOException {
        new Documenter(MODULES, Documenter.Options.defaults().withOutputFolder("docs/modules"))
                .writeModulesAsPlantUml().writeIndividualModulesAsPlantUml();
        // the Documenter's order of components and relations varies between runs: sort each run of them, so
        // the committed diagrams change only when the modules do
        try (var files = java.nio.file.Files.list(java.nio.file.Path.of("docs/modules"))) {
            for (java.nio.file.Path f : files.filter(x -> x.toString().endsWith(".puml")).toList()) {
                java.nio.file.Files.write(f, stableOrder(java.nio.file.Files.readAllLines(f)));
            }
        }
    }

    /** The lines with each run of component or relation lines sorted. */
    static java.util.List<String> stableOrder(java.util.List<String> lines) {
        java.util.List<String> out = new java.util.ArrayList<>();
        java.util.List<String> run = new java.util.ArrayList<>();
        for (String line : lines) {
            boolean sortable = line.strip().startsWith("Rel(") || line.strip().startsWith("Component(");
            if (!sortable || (!run.isEmpty() && !kind(run.get(0)).equals(kind(line)))) {
                java.util.Collections.sort(run);
                out.addAll(run);
                run.clear();
            }
            (sortable ? run : out).add(line);
        }
        java.util.Collections.sort(run);
        out.addAll(run);
        return out;
    }

    private static String kind(String line) {
        return line.strip().substring(0, line.strip().indexOf('('));
    }
}

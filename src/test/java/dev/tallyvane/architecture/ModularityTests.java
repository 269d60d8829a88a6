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
    void writesTheModuleDiagramIntoDocs() {
        new Documenter(MODULES, Documenter.Options.defaults().withOutputFolder("docs/modules"))
                .writeModulesAsPlantUml().writeIndividualModulesAsPlantUml();
    }
}

package dev.tallyvane.architecture;

import static com.tngtech.archunit.lang.syntax.ArchRuleDefinition.classes;
import static com.tngtech.archunit.lang.syntax.ArchRuleDefinition.noClasses;

import com.tngtech.archunit.core.domain.JavaClasses;
import com.tngtech.archunit.core.importer.ClassFileImporter;
import com.tngtech.archunit.core.importer.ImportOption;
import org.junit.jupiter.api.Test;

/** The boundaries the style guide promises, checked on the compiled classes. */
class ArchitectureTests {

    private static final JavaClasses MAIN = new ClassFileImporter()
            .withImportOption(ImportOption.Predefined.DO_NOT_INCLUDE_TESTS)
            .importPackages("dev.tallyvane");

    @Test
    void theEngineUsesOnlyTheJdkAndCommonsMath() {
        classes().that().resideInAPackage("dev.tallyvane.engine..")
                .should().onlyDependOnClassesThat().resideInAnyPackage("java..", "org.apache.commons.math3..",
                        "dev.tallyvane.engine..")
                .check(MAIN);
    }

    @Test
    void nothingInTheEngineDependsOnTheService() {
        noClasses().that().resideInAPackage("dev.tallyvane.engine..")
                .should().dependOnClassesThat().resideInAnyPackage("org.springframework..", "jakarta..",
                        "dev.tallyvane.location..", "dev.tallyvane.intake..", "dev.tallyvane.account..",
                        "dev.tallyvane.system..")
                .check(MAIN);
    }

    @Test
    void theOneShotCommandNeedsNoFramework() {
        noClasses().that().resideInAPackage("dev.tallyvane.cli..")
                .should().dependOnClassesThat().resideInAnyPackage("org.springframework..", "jakarta..")
                .check(MAIN);
    }
}

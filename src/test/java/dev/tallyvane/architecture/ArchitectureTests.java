package dev.tallyvane.architecture;

import static com.tngtech.archunit.core.domain.JavaClass.Predicates.resideInAnyPackage;
import static com.tngtech.archunit.core.domain.JavaClass.Predicates.type;
import static com.tngtech.archunit.lang.syntax.ArchRuleDefinition.classes;
import static com.tngtech.archunit.lang.syntax.ArchRuleDefinition.noClasses;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import com.tngtech.archunit.base.DescribedPredicate;
import com.tngtech.archunit.core.domain.JavaClass;
import com.tngtech.archunit.core.domain.JavaClasses;
import com.tngtech.archunit.core.importer.ClassFileImporter;
import com.tngtech.archunit.core.importer.ImportOption;
import com.tngtech.archunit.lang.ArchRule;
import org.junit.jupiter.api.Test;

/**
 * The boundaries the style guide promises that the module check ({@link ModularityTests}) does not
 * cover, checked on the compiled classes: the engine's allow-list, the one-shot command without a
 * framework, and no feature calling another's internals around the module APIs.
 */
class ArchitectureTests {

    private static final JavaClasses MAIN = new ClassFileImporter()
            .withImportOption(ImportOption.Predefined.DO_NOT_INCLUDE_TESTS)
            .importPackages("dev.tallyvane");

    /**
     * What the engine may use, and nothing else: java.lang (but threads, processes and the runtime),
     * java.util (but its concurrency), java.time, java.math, Commons Math and itself. So "the engine
     * knows no storage, web, jobs or threads" is checked, not hoped: java.sql, java.net, java.io,
     * executors and Spring are all outside the list.
     */
    static final DescribedPredicate<JavaClass> ENGINE_MAY_USE = resideInAnyPackage("java.lang", "java.lang.annotation",
            "java.util..", "java.time..", "java.math..", "org.apache.commons.math3..", "dev.tallyvane.engine..")
            .and(DescribedPredicate.not(resideInAnyPackage("java.util.concurrent..")))
            .and(DescribedPredicate.not(type(Thread.class).or(type(ThreadLocal.class)).or(type(Runtime.class))
                    .or(type(ProcessBuilder.class))))
            .as("java.lang (no threads, processes or runtime), java.util (no concurrency), java.time, java.math, "
                    + "Commons Math, the engine");

    static ArchRule engineAllowList(String enginePackage) {
        return classes().that().resideInAPackage(enginePackage + "..").should().onlyDependOnClassesThat(ENGINE_MAY_USE);
    }

    static ArchRule engineRunsOnTheCallersThread(String enginePackage) {
        return noClasses().that().resideInAPackage(enginePackage + "..").should()
                .callMethod(java.util.Collection.class, "parallelStream")
                .orShould().callMethodWhere(com.tngtech.archunit.core.domain.JavaCall.Predicates.target(
                        com.tngtech.archunit.core.domain.properties.HasName.Predicates.name("parallel")))
                .as("the engine starts no parallel streams");
    }

    @Test
    void theEngineUsesOnlyItsAllowList() {
        engineAllowList("dev.tallyvane.engine").check(MAIN);
        engineRunsOnTheCallersThread("dev.tallyvane.engine").check(MAIN);
    }

    @Test
    void aProbeEngineUsingJdbcOrExecutorsFailsTheAllowList() {
        // the probe: a class in a test package that uses java.sql, an executor and a parallel stream
        JavaClasses probe = new ClassFileImporter().importPackages("dev.tallyvane.architecture.probe.engine");
        assertThatThrownBy(() -> engineAllowList("dev.tallyvane.architecture.probe.engine").check(probe))
                .isInstanceOf(AssertionError.class).hasMessageContaining("java.sql.Connection")
                .hasMessageContaining("java.util.concurrent.ExecutorService");
        assertThatThrownBy(() -> engineRunsOnTheCallersThread("dev.tallyvane.architecture.probe.engine").check(probe))
                .isInstanceOf(AssertionError.class).hasMessageContaining("parallel");
    }

    @Test
    void theOneShotCommandNeedsNoFramework() {
        noClasses().that().resideInAPackage("dev.tallyvane.cli..")
                .should().dependOnClassesThat().resideInAnyPackage("org.springframework..", "jakarta..")
                .check(MAIN);
    }

    @Test
    void theIntakeNeverRunsAFit() {
        // figures arrive fast; fitting happens in the forecasting module's jobs, reached only through events
        noClasses().that().resideInAPackage("dev.tallyvane.intake..").should().dependOnClassesThat()
                .resideInAnyPackage("dev.tallyvane.forecasting..", "dev.tallyvane.engine", "dev.tallyvane.engine.model..",
                        "dev.tallyvane.engine.evaluation..")
                .check(MAIN);
    }
}

package dev.tallyvane.intake;

import dev.tallyvane.support.PostgresDatabase;
import org.springframework.test.context.DynamicPropertyRegistry;
import org.springframework.test.context.DynamicPropertySource;

/** {@link IntakeApiContract} on PostgreSQL over a real connection. */
class IntakeApiPostgresIntegrationTests extends IntakeApiContract {

    @DynamicPropertySource
    static void postgres(DynamicPropertyRegistry registry) {
        PostgresDatabase.register(registry);
    }
}

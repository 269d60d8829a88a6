package dev.tallyvane.summary;

import dev.tallyvane.support.PostgresDatabase;
import org.springframework.test.context.DynamicPropertyRegistry;
import org.springframework.test.context.DynamicPropertySource;

/** {@link QuarterlyBooksContract} on PostgreSQL over a real connection. */
class QuarterlyBooksPostgresIntegrationTests extends QuarterlyBooksContract {

    @DynamicPropertySource
    static void postgres(DynamicPropertyRegistry registry) {
        PostgresDatabase.register(registry);
    }
}

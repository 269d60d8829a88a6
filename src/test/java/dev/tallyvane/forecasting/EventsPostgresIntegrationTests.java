package dev.tallyvane.forecasting;

import dev.tallyvane.support.PostgresDatabase;
import org.springframework.test.context.DynamicPropertyRegistry;
import org.springframework.test.context.DynamicPropertySource;

/** {@link EventsContract} on PostgreSQL over a real connection. */
class EventsPostgresIntegrationTests extends EventsContract {

    @DynamicPropertySource
    static void postgres(DynamicPropertyRegistry registry) {
        PostgresDatabase.register(registry);
    }
}

package dev.tallyvane.forecasting;

import dev.tallyvane.support.PostgresDatabase;
import org.springframework.test.context.DynamicPropertyRegistry;
import org.springframework.test.context.DynamicPropertySource;

/** {@link RealChangeContract} on PostgreSQL over a real connection. */
class RealChangePostgresIntegrationTests extends RealChangeContract {

    @DynamicPropertySource
    static void postgres(DynamicPropertyRegistry registry) {
        PostgresDatabase.register(registry);
    }
}

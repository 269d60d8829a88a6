package dev.tallyvane.accuracy;

import dev.tallyvane.support.PostgresDatabase;
import org.springframework.test.context.DynamicPropertyRegistry;
import org.springframework.test.context.DynamicPropertySource;

/** {@link FlagEpisodesContract} on PostgreSQL over a real connection. */
class FlagEpisodesPostgresIntegrationTests extends FlagEpisodesContract {

    @DynamicPropertySource
    static void postgres(DynamicPropertyRegistry registry) {
        PostgresDatabase.register(registry);
    }
}

package dev.tallyvane.summary;

import dev.tallyvane.support.PostgresDatabase;
import org.springframework.test.context.DynamicPropertyRegistry;
import org.springframework.test.context.DynamicPropertySource;

/** {@link ChainTotalEverywhereContract} on PostgreSQL over a real connection. */
class ChainTotalEverywherePostgresIntegrationTests extends ChainTotalEverywhereContract {

    @DynamicPropertySource
    static void postgres(DynamicPropertyRegistry registry) {
        PostgresDatabase.register(registry);
    }
}

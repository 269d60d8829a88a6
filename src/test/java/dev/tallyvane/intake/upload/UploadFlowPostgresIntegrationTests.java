package dev.tallyvane.intake.upload;

import dev.tallyvane.support.PostgresDatabase;
import org.springframework.test.context.DynamicPropertyRegistry;
import org.springframework.test.context.DynamicPropertySource;

/** {@link UploadFlowContract} on PostgreSQL over a real connection. */
class UploadFlowPostgresIntegrationTests extends UploadFlowContract {

    @DynamicPropertySource
    static void postgres(DynamicPropertyRegistry registry) {
        PostgresDatabase.register(registry);
    }
}

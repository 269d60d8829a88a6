package dev.tallyvane.forecasting;

import org.springframework.test.context.TestPropertySource;

/** {@link EventsContract} on the embedded database (a context of its own: it moves the test clock). */
@TestPropertySource(properties = "tallyvane.test.context=events")
class EventsIntegrationTests extends EventsContract {
}

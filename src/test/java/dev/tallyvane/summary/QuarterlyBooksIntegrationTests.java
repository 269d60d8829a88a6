package dev.tallyvane.summary;

import org.springframework.test.context.TestPropertySource;

/** {@link QuarterlyBooksContract} on the embedded database (a context of its own). */
@TestPropertySource(properties = "tallyvane.test.context=quarters")
class QuarterlyBooksIntegrationTests extends QuarterlyBooksContract {
}

package dev.tallyvane.summary;

import org.springframework.test.context.TestPropertySource;

/** {@link ChainTotalEverywhereContract} on the embedded database (a context of its own). */
@TestPropertySource(properties = "tallyvane.test.context=chain-total")
class ChainTotalEverywhereIntegrationTests extends ChainTotalEverywhereContract {
}

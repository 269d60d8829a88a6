package dev.tallyvane.accuracy;

import dev.tallyvane.accuracy.internal.FlagStore;
import dev.tallyvane.accuracy.signal.Signal;
import java.time.Instant;
import java.time.LocalDate;
import org.springframework.context.ApplicationContext;

/** Raises a drift flag through the real flag store, for page tests that need one without months of data. */
public final class TestFlags {

    private TestFlags() {
    }

    public static void raise(ApplicationContext context, long locationId, String measure, LocalDate since, String reason) {
        context.getBean(FlagStore.class).raise(locationId, measure, Signal.TRIGG, 0.74, 0.5, since, reason,
                "tracking signal 0.74, limit ±0.51", Instant.now());
    }
}

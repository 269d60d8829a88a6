package dev.tallyvane.system;

import java.util.Optional;
import org.springframework.stereotype.Component;

/**
 * Work the service does after it started listening (loading the demo chain): the sign-in page says
 * it is still under way, so nobody takes a half-loaded demo for the real thing.
 */
@Component
public class StartupWork {

    private volatile String underWay;

    /** Marks work as under way, in words ("the demo chain"). */
    public void begin(String what) {
        underWay = what;
    }

    public void done() {
        underWay = null;
    }

    /** What is still loading, if anything. */
    public Optional<String> underWay() {
        return Optional.ofNullable(underWay);
    }
}

package dev.tallyvane.dashboard;

import org.springframework.stereotype.Component;

/** The pages' access to {@link Glossary} ({@code @terms.key('MASE')}): templates may not name static classes. */
@Component("terms")
public class Terms {

    /** The message key part of the term for a metric or drift-signal name. */
    public String key(String name) {
        return Glossary.keyOf(name);
    }
}

package dev.tallyvane.system;

import org.springframework.context.MessageSource;
import org.springframework.context.i18n.LocaleContextHolder;
import org.springframework.stereotype.Component;

/**
 * The sentences controllers put on a page after an action ("Saved.", "Test e-mail sent to …"),
 * read from the message bundles in the reader's language, like the pages' own words.
 */
@Component
public class Messages {

    private final MessageSource source;

    Messages(MessageSource source) {
        this.source = source;
    }

    /** The message {@code key} of the bundles in the request's locale, with its arguments filled in. */
    public String say(String key, Object... args) {
        return in(LocaleContextHolder.getLocale(), key, args);
    }

    /** The same in a given language (e.g. the weekly e-mail's, which has no request). */
    public String in(java.util.Locale locale, String key, Object... args) {
        return source.getMessage(key, args, locale);
    }
}

package dev.tallyvane.system;

import java.time.Instant;
import java.time.ZoneId;
import java.time.format.DateTimeFormatter;
import java.util.Locale;
import org.springframework.stereotype.Component;

/**
 * Moments as the pages show them ({@code @times.at(instant, zone)}): in a location's time zone, or
 * for chain-wide pages (uploads, tokens, activity log) in the chain's default zone
 * ({@code tallyvane.defaults.time-zone}), always with the zone named, never in the server's own.
 */
@Component("times")
public class Times {

    private static final DateTimeFormatter MINUTES = DateTimeFormatter.ofPattern("HH:mm", Locale.ROOT);
    private static final DateTimeFormatter SECONDS = DateTimeFormatter.ofPattern("HH:mm:ss", Locale.ROOT);

    private final ZoneId chain;

    Times(TallyvaneProperties properties) {
        this.chain = ZoneId.of(properties.defaults().timeZone());
    }

    /**
     * "3 Dec 2026 09:30 Europe/Berlin" (the date as the reader writes dates, see {@link #day}; the time
     * on the 24-hour clock) in the given zone (the chain's when null); empty for no moment.
     */
    public String at(Instant instant, String zone) {
        return format(instant, zone, MINUTES);
    }

    /** The same in the chain's zone. */
    public String at(Instant instant) {
        return format(instant, null, MINUTES);
    }

    /** With seconds, for the activity log. */
    public String exact(Instant instant) {
        return format(instant, null, SECONDS);
    }

    /**
     * A date as its reader writes dates: the medium form of the request's locale ("Dec 7, 2026",
     * "7 Dec 2026", "07.12.2026"); pages put it in {@code <time datetime="2026-12-07">}, so the ISO
     * form stays in the markup for tools and tests. Empty for no date.
     */
    public String day(java.time.LocalDate date) {
        return day(date, org.springframework.context.i18n.LocaleContextHolder.getLocale());
    }

    /** The same in a given language (e.g. the weekly e-mail's, which has no request). */
    public String day(java.time.LocalDate date, Locale locale) {
        return date == null ? "" : java.time.format.DateTimeFormatter.ofLocalizedDate(java.time.format.FormatStyle.MEDIUM)
                .withLocale(locale).format(date);
    }

    /** The day of the week of a date in the reader's language, e.g. "Monday" or "Montag". */
    public String weekday(java.time.LocalDate date) {
        return date.getDayOfWeek().getDisplayName(java.time.format.TextStyle.FULL,
                org.springframework.context.i18n.LocaleContextHolder.getLocale());
    }

    private String format(Instant instant, String zone, DateTimeFormatter f) {
        if (instant == null) {
            return "";
        }
        ZoneId z = zone == null ? chain : ZoneId.of(zone);
        java.time.ZonedDateTime t = instant.atZone(z);
        return day(t.toLocalDate()) + " " + f.format(t) + " " + z.getId();
    }
}

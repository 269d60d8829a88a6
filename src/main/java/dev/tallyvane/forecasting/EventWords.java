package dev.tallyvane.forecasting;

import dev.tallyvane.system.Messages;
import dev.tallyvane.system.Times;
import java.time.temporal.ChronoUnit;
import org.springframework.stereotype.Component;

/**
 * An event as the pages say it, in the reader's language and with days as the reader writes them
 * ("every Thursday from 7 Jan 2027", "jeden Donnerstag ab 07.01.2027"). The API and the activity log
 * keep {@link LocationEvents.Event#when()}, with ISO dates, on purpose.
 */
@Component("eventWords")
public class EventWords {

    private final Messages messages;
    private final Times times;

    EventWords(Messages messages, Times times) {
        this.messages = messages;
        this.times = times;
    }

    /** When it happens: one day, a span of days, or how it repeats, from when and until when. */
    public String when(LocationEvents.Event e) {
        String first = times.day(e.firstDay());
        boolean oneDay = e.lastDay().equals(e.firstDay());
        String span = oneDay ? first : messages.say("event.span", first, times.day(e.lastDay()));
        long days = ChronoUnit.DAYS.between(e.firstDay(), e.lastDay()) + 1;
        String base = switch (e.repeats()) {
            case ONCE -> span;
            case WEEKLY, FORTNIGHTLY -> messages.say("event." + e.repeats().code() + (oneDay ? "" : ".days"),
                    times.weekday(e.firstDay()), first, days);
            case YEARLY -> messages.say("event.yearly", span);
        };
        return e.until() == null ? base : base + " " + messages.say("event.until", times.day(e.until()));
    }

    /** The expected effect: "+30% (stated)" or "estimated from history". */
    public String effect(LocationEvents.Event e) {
        return e.effectPct() == null ? messages.say("event.estimated")
                : messages.say("event.stated", (e.effectPct().signum() > 0 ? "+" : "")
                        + e.effectPct().stripTrailingZeros().toPlainString());
    }
}

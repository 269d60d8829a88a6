package dev.tallyvane.dashboard;

import dev.tallyvane.accuracy.AccuracyReports;
import dev.tallyvane.engine.series.Granularity;
import dev.tallyvane.forecasting.IssuedForecasts;
import dev.tallyvane.forecasting.LocationEvents;
import dev.tallyvane.forecasting.SettingsService;
import dev.tallyvane.location.Location;
import java.time.LocalDate;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.stream.Collectors;
import org.springframework.stereotype.Component;
import org.springframework.transaction.annotation.Transactional;

/**
 * A location's events with their value added so far: every forecast point that holidays or events
 * changed is kept beside what it would have been without them, and once its period's actual is in,
 * both are scored. An event (or the holidays) earned its place when the forecasts with it missed by
 * less than the same forecasts without it would have.
 */
@Component
public class EventScores {

    private final IssuedForecasts issued;
    private final AccuracyReports accuracy;
    private final LocationEvents events;
    private final SettingsService settings;

    EventScores(IssuedForecasts issued, AccuracyReports accuracy, LocationEvents events, SettingsService settings) {
        this.issued = issued;
        this.accuracy = accuracy;
        this.events = events;
        this.settings = settings;
    }

    /**
     * Scored forecasts that an effect changed: how many, and their absolute errors added up with and
     * without it.
     */
    public record Score(int forecasts, double errorWith, double errorWithout) {

        static final Score NONE = new Score(0, 0, 0);

        Score plus(double actual, double with, double without) {
            return new Score(forecasts + 1, errorWith + Math.abs(actual - with), errorWithout + Math.abs(actual - without));
        }

        /** How much smaller the error was with the effect, in percent (negative: it made things worse); NaN before any. */
        public double valueAddedPct() {
            return forecasts == 0 || errorWithout == 0 ? Double.NaN : 100 * (1 - errorWith / errorWithout);
        }
    }

    /** An event and its score so far. */
    public record Row(LocationEvents.Event event, Score score) {
    }

    /** The location's events, each with its score, and the holidays' score. */
    public record Report(List<Row> events, Score holidays) {
    }

    @Transactional(readOnly = true)
    public Report of(Location l, String measure) {
        List<LocationEvents.Event> list = events.of(l.getId());
        Set<LocalDate> holidays = settings.calendar(l.getId()).stream().filter(e -> e.kind().equals("HOLIDAY"))
                .map(SettingsService.CalendarEntry::day).collect(Collectors.toSet());
        Map<AccuracyReports.PointRef, AccuracyReports.Scored> scores = accuracy.currentScores(l.getId());
        Score[] byEvent = new Score[list.size()];
        java.util.Arrays.fill(byEvent, Score.NONE);
        Score holidayScore = Score.NONE;
        for (IssuedForecasts.IssuedPoint p : issued.changedByEffects(l.getId(), measure)) {
            AccuracyReports.Scored s = scores.get(new AccuracyReports.PointRef(p.issuedId(), p.step()));
            if (s == null) {
                continue;
            }
            LocalDate end = Granularity.valueOf(p.granularity()).periodEnd(p.period());
            for (int i = 0; i < list.size(); i++) {
                if (overlaps(list.get(i).days(end), p.period(), end)) {
                    byEvent[i] = byEvent[i].plus(s.actual(), p.forecast(), p.usualForecast());
                }
            }
            if (overlaps(holidays, p.period(), end)) {
                holidayScore = holidayScore.plus(s.actual(), p.forecast(), p.usualForecast());
            }
        }
        List<Row> rows = new ArrayList<>();
        for (int i = 0; i < list.size(); i++) {
            rows.add(new Row(list.get(i), byEvent[i]));
        }
        return new Report(rows, holidayScore);
    }

    private static boolean overlaps(Set<LocalDate> days, LocalDate from, LocalDate to) {
        for (LocalDate d = from; !d.isAfter(to); d = d.plusDays(1)) {
            if (days.contains(d)) {
                return true;
            }
        }
        return false;
    }
}

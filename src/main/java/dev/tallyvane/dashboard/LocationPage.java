package dev.tallyvane.dashboard;

import dev.tallyvane.accuracy.ChainTotals;
import dev.tallyvane.accuracy.FlagService;
import dev.tallyvane.accuracy.DriftFlag;
import dev.tallyvane.forecasting.IssuedForecast;
import dev.tallyvane.forecasting.NextDays;
import dev.tallyvane.forecasting.RealChanges;
import dev.tallyvane.forecasting.RefitService;
import dev.tallyvane.intake.FigureFacts;
import dev.tallyvane.intake.FigureRules;
import dev.tallyvane.location.Location;
import dev.tallyvane.location.LocationService;
import java.util.List;
import java.util.Optional;
import org.springframework.stereotype.Service;
import org.springframework.transaction.annotation.Transactional;
import tools.jackson.databind.json.JsonMapper;

/** Everything the location page shows besides its forms, read in one transaction. */
@Service
public class LocationPage {

    private final RefitService refits;
    private final FlagService accuracy;
    private final FigureFacts figures;
    private final LocationCharts charts;
    private final JsonMapper json;
    private final ChainTotals chainTotals;
    private final LocationService locations;
    private final NextDays nextDays;
    private final EventScores eventScores;
    private final RealChanges realChanges;

    LocationPage(RefitService refits, FlagService accuracy, FigureFacts figures, LocationCharts charts,
            JsonMapper json, ChainTotals chainTotals, LocationService locations, NextDays nextDays,
            EventScores eventScores, RealChanges realChanges) {
        this.realChanges = realChanges;
        this.eventScores = eventScores;
        this.nextDays = nextDays;
        this.chainTotals = chainTotals;
        this.locations = locations;
        this.refits = refits;
        this.accuracy = accuracy;
        this.figures = figures;
        this.charts = charts;
        this.json = json;
    }

    /**
     * The page's content.
     *
     * @param forecast    the current forecast, or null
     * @param leaderboard its candidates, or null
     * @param lastOutcome what the last fit did (why there is no forecast yet), or null
     * @param chart       the forecast chart's numbers (also its data table), or null
     * @param accuracy    accuracy over time and by horizon
     * @param chain       the chain's total (its active locations, this currency) for the forecast's first
     *                    period, as the overview and the e-mail show it, or null
     * @param days        the next days by day (the staffing view), or null without a forecast
     * @param events      the location's events with their value added so far
     * @param change      the owner's mark of a real change in sales, or null
     */
    public record Content(IssuedForecast forecast, Leaderboard leaderboard, String lastOutcome,
            LocationCharts.ForecastChart chart, LocationCharts.AccuracyChart accuracy, List<DriftFlag> flags,
            List<FigureFacts.Recent> recent, ChainTotals.Total chain, NextDays.Plan days,
            EventScores.Report events, RealChanges.Mark change) {

        /** This location's first-period forecast as a share of the chain's, in percent, or NaN. */
        public double chainSharePct() {
            return chain == null || chain.forecast() == 0 || forecast.points().isEmpty() ? Double.NaN
                    : 100 * forecast.points().get(0).forecast() / chain.forecast();
        }
    }

    @Transactional(readOnly = true)
    public Content of(Location l) {
        String measure = FigureRules.DEFAULT_MEASURE;
        Optional<IssuedForecast> f = refits.current(l.getId(), measure);
        LocationCharts.Charts drawn = charts.of(l, f);
        return new Content(f.orElse(null), f.map(x -> Leaderboard.of(x, json)).orElse(null),
                refits.lastOutcome(l.getId(), measure).orElse(null), drawn.forecast().orElse(null),
                drawn.accuracy(), accuracy.flags(l.getId(), false), figures.recent(l.getId(), 60),
                f.filter(x -> l.isActive() && !x.points().isEmpty()).flatMap(x -> chainTotals.of(measure,
                        locations.all().stream().filter(Location::isActive).toList(), l.getCurrency(), x.granularity(),
                        x.points().get(0).period())).orElse(null),
                l.isActive() ? nextDays.of(l, measure).orElse(null) : null, eventScores.of(l, measure),
                realChanges.of(l.getId(), measure).orElse(null));
    }
}

package dev.tallyvane.summary;

import dev.tallyvane.accuracy.ChainTotals;
import dev.tallyvane.accuracy.FlagService;
import dev.tallyvane.engine.series.Granularity;
import dev.tallyvane.forecasting.IssuedForecasts;
import dev.tallyvane.intake.FigureFacts;
import dev.tallyvane.intake.FigureRules;
import dev.tallyvane.intake.SeriesReader;
import dev.tallyvane.location.Location;
import dev.tallyvane.location.LocationService;
import dev.tallyvane.system.MoneyRounding;
import java.math.BigDecimal;
import java.time.LocalDate;
import java.time.ZoneId;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.TreeMap;
import org.springframework.stereotype.Component;
import org.springframework.transaction.annotation.Transactional;

/**
 * Computes a week's summary from the database, each location at the granularity it is forecast
 * at. A location forecast by the week: last week's actual (daily figures rolled up to the ISO
 * week), what the newest weekly forecast made from data that ended before the week said for it,
 * and next week's forecast with its 80% interval. A location forecast by the month (monthly
 * figures only): the same for the last month ended by the week's Sunday and the month after.
 * Then open drift flags (not snoozed), missing figures, the chain's totals and the chain's weekly
 * chart data.
 *
 * <p>The chain's next-period totals and the chart's weeks ahead are {@link ChainTotals}' (the
 * ranges the overview and the exports show, allowing for locations moving together); the line
 * says in one sentence how its range was built.
 */
@Component
class SummaryBuilder {

    private static final int CHART_WEEKS_BACK = 12;
    private static final int CHART_WEEKS_AHEAD = 8;

    private final LocationService locations;
    private final SeriesReader reader;
    private final FigureFacts figures;
    private final IssuedForecasts issued;
    private final FlagService flagService;
    private final ChainTotals chainTotals;
    private final java.util.Locale mailLocale;

    SummaryBuilder(LocationService locations, SeriesReader reader, FigureFacts figures, IssuedForecasts issued,
            FlagService flagService, ChainTotals chainTotals, SummaryProperties properties) {
        this.mailLocale = java.util.Locale.forLanguageTag(properties.locale());
        this.locations = locations;
        this.reader = reader;
        this.figures = figures;
        this.issued = issued;
        this.flagService = flagService;
        this.chainTotals = chainTotals;
    }

    @Transactional(readOnly = true)
    WeeklySummary build(LocalDate weekStart, ZoneId zone) {
        String measure = FigureRules.DEFAULT_MEASURE;
        List<WeeklySummary.Line> weekly = new ArrayList<>();
        List<WeeklySummary.Line> monthly = new ArrayList<>();
        List<WeeklySummary.Line> quarterly = new ArrayList<>();
        List<Location> byWeek = new ArrayList<>();
        List<Location> byMonthList = new ArrayList<>();
        List<Location> byQuarterList = new ArrayList<>();
        TreeMap<LocalDate, Double> chartActual = new TreeMap<>();
        String chartCurrency = null;
        boolean anyFigures = false;
        // the last month and quarter that had ended by the end of the week
        LocalDate lastMonth = Granularity.MONTH.periodStart(weekStart.plusDays(7)).minusMonths(1);
        LocalDate lastQuarter = Granularity.QUARTER.periodStart(weekStart.plusDays(7)).minusMonths(3);
        for (Location l : locations.all()) {
            if (!l.isActive()) {
                continue;
            }
            Granularity g = issued.latest(l.getId(), measure).map(f -> Granularity.valueOf(f.granularity()))
                    .filter(f -> f == Granularity.MONTH || f == Granularity.QUARTER).orElse(Granularity.WEEK);
            boolean byMonth = g != Granularity.WEEK;
            LocalDate period = g == Granularity.MONTH ? lastMonth : g == Granularity.QUARTER ? lastQuarter : weekStart;
            List<SeriesReader.Point> points = reader.read(l, measure, g, null,
                    byMonth ? period : weekStart.minusWeeks(CHART_WEEKS_BACK - 1), period).points();
            BigDecimal actual = points.stream().filter(p -> p.period().equals(period)).map(SeriesReader.Point::amount)
                    .findFirst().orElse(null);
            anyFigures |= actual != null;
            WeeklySummary.Line line = line(l, measure, g, period, actual);
            if (g == Granularity.QUARTER) {
                quarterly.add(line);
                byQuarterList.add(l);
                continue;
            }
            if (byMonth) {
                monthly.add(line);
                byMonthList.add(l);
                continue;
            }
            weekly.add(line);
            byWeek.add(l);
            if (chartCurrency == null || chartCurrency.equals(l.getCurrency())) {
                chartCurrency = l.getCurrency();
                for (SeriesReader.Point p : points) {
                    chartActual.merge(p.period(), p.amount().doubleValue(), Double::sum);
                }
            }
        }
        List<WeeklySummary.Line> totals = new ArrayList<>();
        totals.addAll(chain(measure, Granularity.WEEK, weekStart, weekly, byWeek));
        totals.addAll(chain(measure, Granularity.MONTH, lastMonth, monthly, byMonthList));
        totals.addAll(chain(measure, Granularity.QUARTER, lastQuarter, quarterly, byQuarterList));
        String currency = chartCurrency;
        LocalDate nextWeek = weekStart.plusWeeks(1);
        List<ChainTotals.Total> ahead = chainTotals.ahead(measure, byWeek).stream()
                .filter(t -> t.currency().equals(currency) && "week".equals(t.granularity())
                        && !t.period().isBefore(nextWeek))
                .limit(CHART_WEEKS_AHEAD).toList();
        WeeklySummary.Chart chart = new WeeklySummary.Chart(chartCurrency, new ArrayList<>(chartActual.keySet()),
                new ArrayList<>(chartActual.values()), ahead.stream().map(ChainTotals.Total::period).toList(),
                ahead.stream().map(ChainTotals.Total::forecast).toList(),
                ahead.stream().map(ChainTotals.Total::lo80).toList(), ahead.stream().map(ChainTotals.Total::hi80).toList());
        return new WeeklySummary(weekStart, weekly, monthly, quarterly, totals, chart, anyFigures);
    }

    /**
     * The chain's lines of one granularity, one per currency: the period's actuals against what was
     * forecast for them (over the locations with both), and the next period's total and range.
     */
    private List<WeeklySummary.Line> chain(String measure, Granularity g, LocalDate period, List<WeeklySummary.Line> lines,
            List<Location> of) {
        List<WeeklySummary.Line> out = new ArrayList<>();
        LocalDate nextPeriod = g.plus(period, 1);
        for (String currency : lines.stream().map(WeeklySummary.Line::currency).distinct().sorted().toList()) {
            List<WeeklySummary.Line> scored = lines.stream()
                    .filter(l -> l.currency().equals(currency) && l.actual() != null && l.forecast() != null).toList();
            BigDecimal actual = scored.isEmpty() ? null
                    : scored.stream().map(WeeklySummary.Line::actual).reduce(BigDecimal.ZERO, BigDecimal::add);
            BigDecimal forecast = scored.isEmpty() ? null
                    : scored.stream().map(WeeklySummary.Line::forecast).reduce(BigDecimal.ZERO, BigDecimal::add);
            ChainTotals.Total next = chainTotals.of(measure, of, currency, g.name(), nextPeriod).orElse(null);
            if (actual == null && next == null) {
                continue;
            }
            out.add(new WeeklySummary.Line("", "All locations", currency, g.name().toLowerCase(Locale.ROOT), period,
                    actual, forecast, nextPeriod, next == null ? null : MoneyRounding.round(next.forecast(), currency),
                    next == null ? null : MoneyRounding.round(next.lo80(), currency),
                    next == null ? null : MoneyRounding.round(next.hi80(), currency), List.of(), null,
                    next == null ? "" : next.assumption()));
        }
        return out;
    }

    /** A location's line for {@code period} at granularity {@code g}, with the period after it. */
    private WeeklySummary.Line line(Location l, String measure, Granularity g, LocalDate period, BigDecimal actual) {
        String cur = l.getCurrency();
        BigDecimal forecast = issued.madeAhead(l.getId(), measure, g.name(), period)
                .map(p -> MoneyRounding.round(p.forecast(), cur))
                .orElse(null);
        LocalDate nextPeriod = g.plus(period, 1);
        IssuedForecasts.IssuedPoint next = issued.newestFrom(l.getId(), measure, g.name(), nextPeriod).stream()
                .filter(p -> p.period().equals(nextPeriod)).findFirst().orElse(null);
        List<String> flags = flagService.attention(l.getId(), measure, mailLocale);
        LocalDate lastFigure = actual != null ? null : figures.latestPeriod(l.getId(), measure).orElse(null);
        return new WeeklySummary.Line(l.getCode(), l.getName(), l.getCurrency(), g.name().toLowerCase(Locale.ROOT),
                period, actual, forecast, nextPeriod, next == null ? null : MoneyRounding.round(next.forecast(), cur),
                next == null ? null : MoneyRounding.round(next.lo80(), cur),
                next == null ? null : MoneyRounding.round(next.hi80(), cur), flags, lastFigure, "");
    }
}

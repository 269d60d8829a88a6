package dev.tallyvane.summary;

import dev.tallyvane.accuracy.FlagService;
import dev.tallyvane.engine.series.Granularity;
import dev.tallyvane.forecasting.IssuedForecasts;
import dev.tallyvane.intake.FigureFacts;
import dev.tallyvane.intake.FigureRules;
import dev.tallyvane.intake.SeriesReader;
import dev.tallyvane.location.Location;
import dev.tallyvane.location.LocationService;
import java.math.BigDecimal;
import java.math.RoundingMode;
import java.time.LocalDate;
import java.time.ZoneId;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.TreeMap;
import org.springframework.stereotype.Component;
import org.springframework.transaction.annotation.Transactional;

/**
 * Computes a week's summary from the database: per location last week's actual (net sales, daily
 * figures rolled up to the ISO week), what the newest weekly forecast made from data that ended
 * before the week said for it, next week's forecast with its 80% interval, open drift flags (not snoozed) and
 * missing figures; the chain's totals; and the chain's weekly chart data.
 *
 * <p>Chain intervals add the locations' variances, σ² = Σσᵢ² with σᵢ = (hi80 − lo80)/(2·1.2816),
 * which assumes the locations' forecast errors are independent (stated in the e-mail's footnote).
 */
@Component
class SummaryBuilder {

    private static final double Z80 = 1.2815515655446004;
    private static final int CHART_WEEKS_BACK = 12;
    private static final int CHART_WEEKS_AHEAD = 8;

    private final LocationService locations;
    private final SeriesReader reader;
    private final FigureFacts figures;
    private final IssuedForecasts issued;
    private final FlagService flagService;

    SummaryBuilder(LocationService locations, SeriesReader reader, FigureFacts figures, IssuedForecasts issued,
            FlagService flagService) {
        this.locations = locations;
        this.reader = reader;
        this.figures = figures;
        this.issued = issued;
        this.flagService = flagService;
    }

    @Transactional(readOnly = true)
    WeeklySummary build(LocalDate weekStart, ZoneId zone) {
        String measure = FigureRules.DEFAULT_MEASURE;
        List<WeeklySummary.Line> lines = new ArrayList<>();
        Map<String, double[]> chain = new LinkedHashMap<>();
        TreeMap<LocalDate, Double> chartActual = new TreeMap<>();
        TreeMap<LocalDate, double[]> chartAhead = new TreeMap<>();
        String chartCurrency = null;
        boolean anyFigures = false;
        LocalDate nextWeek = weekStart.plusWeeks(1);
        for (Location l : locations.all()) {
            if (!l.isActive()) {
                continue;
            }
            List<SeriesReader.Point> weeks = reader.read(l, measure, Granularity.WEEK, null,
                    weekStart.minusWeeks(CHART_WEEKS_BACK - 1), weekStart).points();
            BigDecimal actual = weeks.stream().filter(p -> p.period().equals(weekStart)).map(SeriesReader.Point::amount)
                    .findFirst().orElse(null);
            anyFigures |= actual != null;
            BigDecimal forecast = issued.madeAhead(l.getId(), measure, Granularity.WEEK.name(), weekStart)
                    .map(p -> money(p.forecast())).orElse(null);
            List<double[]> ahead = issued.newestFrom(l.getId(), measure, Granularity.WEEK.name(), nextWeek).stream()
                    .map(p -> new double[] {p.period().toEpochDay(), p.forecast(), p.lo80(), p.hi80()}).toList();
            double[] next = ahead.stream().filter(a -> (long) a[0] == nextWeek.toEpochDay()).findFirst().orElse(null);
            List<String> flags = flagService.attention(l.getId(), measure);
            LocalDate lastFigure = actual != null ? null : figures.latestPeriod(l.getId(), measure).orElse(null);
            lines.add(new WeeklySummary.Line(l.getCode(), l.getName(), l.getCurrency(), actual, forecast,
                    next == null ? null : money(next[1]), next == null ? null : money(next[2]),
                    next == null ? null : money(next[3]), flags, lastFigure));
            double[] c = chain.computeIfAbsent(l.getCurrency(), k -> new double[6]);
            if (actual != null && forecast != null) {
                c[0] += actual.doubleValue();
                c[1] += forecast.doubleValue();
                c[5] = 1;
            }
            if (next != null) {
                c[2] += next[1];
                c[3] += sigma(next);
                c[4] = 1;
            }
            if (chartCurrency == null || chartCurrency.equals(l.getCurrency())) {
                chartCurrency = l.getCurrency();
                for (SeriesReader.Point p : weeks) {
                    chartActual.merge(p.period(), p.amount().doubleValue(), Double::sum);
                }
                for (double[] a : ahead) {
                    LocalDate w = LocalDate.ofEpochDay((long) a[0]);
                    if (chartAhead.size() < CHART_WEEKS_AHEAD || chartAhead.containsKey(w)) {
                        double[] sum = chartAhead.computeIfAbsent(w, k -> new double[2]);
                        sum[0] += a[1];
                        sum[1] += sigma(a);
                    }
                }
            }
        }
        List<WeeklySummary.Line> totals = new ArrayList<>();
        chain.forEach((currency, c) -> {
            double sd = Math.sqrt(c[3]);
            totals.add(new WeeklySummary.Line("", "All locations", currency, c[5] > 0 ? money(c[0]) : null,
                    c[5] > 0 ? money(c[1]) : null, c[4] > 0 ? money(c[2]) : null, c[4] > 0 ? money(c[2] - Z80 * sd) : null,
                    c[4] > 0 ? money(c[2] + Z80 * sd) : null, List.of(), null));
        });
        List<LocalDate> aheadWeeks = new ArrayList<>(chartAhead.keySet());
        WeeklySummary.Chart chart = new WeeklySummary.Chart(chartCurrency, new ArrayList<>(chartActual.keySet()),
                new ArrayList<>(chartActual.values()), aheadWeeks,
                aheadWeeks.stream().map(w -> chartAhead.get(w)[0]).toList(),
                aheadWeeks.stream().map(w -> chartAhead.get(w)[0] - Z80 * Math.sqrt(chartAhead.get(w)[1])).toList(),
                aheadWeeks.stream().map(w -> chartAhead.get(w)[0] + Z80 * Math.sqrt(chartAhead.get(w)[1])).toList());
        return new WeeklySummary(weekStart, lines, totals, chart, anyFigures);
    }

    /** σ² of one forecast point [period, forecast, lo80, hi80]. */
    private static double sigma(double[] point) {
        double s = (point[3] - point[2]) / (2 * Z80);
        return s * s;
    }

    private static BigDecimal money(double v) {
        return BigDecimal.valueOf(v).setScale(2, RoundingMode.HALF_UP);
    }
}

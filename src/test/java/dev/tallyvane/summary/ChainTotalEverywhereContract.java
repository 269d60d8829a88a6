package dev.tallyvane.summary;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;
import static org.awaitility.Awaitility.await;
import static org.springframework.security.test.web.servlet.request.SecurityMockMvcRequestPostProcessors.user;
import static org.springframework.test.web.servlet.request.MockMvcRequestBuilders.get;
import static org.springframework.test.web.servlet.result.MockMvcResultMatchers.status;

import dev.tallyvane.accuracy.AccuracyReports;
import dev.tallyvane.accuracy.ChainTotals;
import dev.tallyvane.app.TallyvaneApplication;
import dev.tallyvane.dashboard.Amounts;
import dev.tallyvane.engine.evaluation.ChainTotal;
import dev.tallyvane.engine.series.Granularity;
import dev.tallyvane.forecasting.IssuedForecast;
import dev.tallyvane.forecasting.RefitService;
import dev.tallyvane.intake.FigureInput;
import dev.tallyvane.intake.FigureRules;
import dev.tallyvane.intake.IntakeService;
import dev.tallyvane.intake.Submitter;
import dev.tallyvane.location.Location;
import dev.tallyvane.location.LocationDetails;
import dev.tallyvane.location.LocationService;
import dev.tallyvane.support.MutableClock;
import dev.tallyvane.support.TestClockConfiguration;
import java.io.StringReader;
import java.math.BigDecimal;
import java.math.RoundingMode;
import java.time.Duration;
import java.time.Instant;
import java.time.LocalDate;
import java.time.YearMonth;
import java.time.ZoneId;
import java.time.ZoneOffset;
import java.util.ArrayList;
import java.util.List;
import java.util.Random;
import java.util.UUID;
import org.apache.commons.csv.CSVFormat;
import org.apache.commons.csv.CSVRecord;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.TestInstance;
import org.springframework.beans.factory.annotation.Autowired;
import org.springframework.boot.test.context.SpringBootTest;
import org.springframework.boot.webmvc.test.autoconfigure.AutoConfigureMockMvc;
import org.springframework.context.annotation.Import;
import org.springframework.test.web.servlet.MockMvc;
import org.springframework.test.web.servlet.request.RequestPostProcessor;

/**
 * One chain total everywhere: three shops sending daily figures that move together (a shared
 * weekly swing) and ten weeks of forecasts scored against what happened, plus a shop that reports
 * only by the month. The overview, the location page, the weekly e-mail and the chain export show
 * the same total and range for the same period, and the range is built from the shops' past
 * errors (not their added bounds). The monthly shop is in the e-mail with its last month and the
 * next, and a bookkeeper's correction of that month changes both. The chain has a currency of its
 * own (DKK), so it stays apart from other tests' locations in a shared database. Run on H2
 * ({@link ChainTotalEverywhereIntegrationTests}) and PostgreSQL ({@link ChainTotalEverywherePostgresIntegrationTests}).
 */
@SpringBootTest(classes = TallyvaneApplication.class)
@AutoConfigureMockMvc
@Import(TestClockConfiguration.class)
@TestInstance(TestInstance.Lifecycle.PER_CLASS)
abstract class ChainTotalEverywhereContract {

    static final String CURRENCY = "DKK";
    static final String MEASURE = FigureRules.DEFAULT_MEASURE;
    static final int SCORED_WEEKS = 10;
    static final LocalDate LAST_WEEK = LocalDate.of(2026, 11, 23);

    @Autowired
    MockMvc mvc;
    @Autowired
    LocationService locations;
    @Autowired
    IntakeService intake;
    @Autowired
    RefitService refits;
    @Autowired
    AccuracyReports accuracy;
    @Autowired
    ChainTotals chainTotals;
    @Autowired
    SummaryBuilder summaries;
    @Autowired
    Amounts amounts;
    @Autowired
    MutableClock clock;

    final RequestPostProcessor owner = user("olive").roles("OWNER");
    final String prefix = "C" + UUID.randomUUID().toString().substring(0, 5).toUpperCase(java.util.Locale.ROOT);
    final List<String> shops = List.of(prefix + "A", prefix + "B", prefix + "C");
    final String monthly = prefix + "M";

    @Autowired
    dev.tallyvane.account.UserService users;

    @BeforeAll
    void chain() {
        dev.tallyvane.support.Users.ensure(users, "olive", dev.tallyvane.account.Role.OWNER);
        for (String code : shops) {
            locations.create(new LocationDetails(code, "Shop " + code, "Europe/Copenhagen", CURRENCY, null, null));
        }
        locations.create(new LocationDetails(monthly, "Books by the month", "Europe/Copenhagen", CURRENCY, null, null));
        Random random = new Random(5);
        Instant start = TestClockConfiguration.START; // Tuesday 2026-12-01
        LocalDate first = LocalDate.of(2025, 3, 3);
        LocalDate recordedTo = first.minusDays(1);
        for (int w = SCORED_WEEKS; w >= 0; w--) {
            clock.set(start.minus(Duration.ofDays(7L * w)));
            LocalDate sunday = LocalDate.ofInstant(clock.instant(), ZoneOffset.UTC).minusDays(2);
            List<FigureInput> figures = new ArrayList<>();
            for (LocalDate week = recordedTo.plusDays(1); week.isBefore(sunday); week = week.plusWeeks(1)) {
                double shared = random.nextGaussian();
                for (int s = 0; s < shops.size(); s++) {
                    double swing = 1 + 0.08 * shared + 0.03 * random.nextGaussian();
                    for (int d = 0; d < 7; d++) {
                        double weekday = new double[] {0.9, 0.95, 1.0, 1.0, 1.2, 1.4, 0.7}[d];
                        figures.add(new FigureInput(figures.size(), shops.get(s), MEASURE, Granularity.DAY,
                                week.plusDays(d), BigDecimal.valueOf(Math.round((1000 + 400 * s) * weekday * swing))));
                    }
                }
            }
            recordedTo = sunday;
            intake.record(figures, Submitter.api("token:till", null), "item");
            LocalDate lastWeek = sunday.minusDays(6);
            for (String code : shops) {
                awaitForecastThrough(code, lastWeek);
                if (w < SCORED_WEEKS) {
                    awaitScored(code, lastWeek);
                }
            }
        }
        // the monthly shop: months to September, forecast in early October; then October, forecast in November
        clock.set(Instant.parse("2026-10-06T09:00:00Z"));
        record(monthly, YearMonth.of(2023, 10), YearMonth.of(2026, 9), 30_000, Submitter.api("token:books", null));
        awaitForecastThrough(monthly, LocalDate.of(2026, 9, 1));
        clock.set(Instant.parse("2026-11-03T09:00:00Z"));
        record(monthly, YearMonth.of(2026, 10), YearMonth.of(2026, 10), 30_000, Submitter.api("token:books", null));
        awaitForecastThrough(monthly, LocalDate.of(2026, 10, 1));
        awaitScored(monthly, LocalDate.of(2026, 10, 1));
        clock.set(start);
    }

    private void record(String code, YearMonth from, YearMonth to, double level, Submitter who) {
        List<FigureInput> figures = new ArrayList<>();
        for (YearMonth m = from; !m.isAfter(to); m = m.plusMonths(1)) {
            double season = 1 + 0.1 * Math.sin(2 * Math.PI * m.getMonthValue() / 12.0);
            double noise = 0.04 * new Random(m.getYear() * 100L + m.getMonthValue()).nextGaussian();
            figures.add(new FigureInput(figures.size(), code, MEASURE, Granularity.MONTH, m.atDay(1),
                    BigDecimal.valueOf(Math.round(level * season * (1 + noise)))));
        }
        intake.record(figures, who, "item");
    }

    private IssuedForecast awaitForecastThrough(String code, LocalDate lastPeriod) {
        long id = locations.byCode(code).getId();
        return await().atMost(Duration.ofSeconds(60)).pollInterval(Duration.ofMillis(100))
                .until(() -> refits.current(id, MEASURE).filter(f -> f.lastPeriod().equals(lastPeriod)).orElse(null),
                        java.util.Objects::nonNull);
    }

    /** The forecast issued with the new figures is scored by a listener after it: wait for the period's score. */
    private void awaitScored(String code, LocalDate period) {
        long id = locations.byCode(code).getId();
        await().atMost(Duration.ofSeconds(60)).pollInterval(Duration.ofMillis(100)).until(() -> accuracy
                .stepOneErrors(id, MEASURE).stream().anyMatch(e -> e.period().equals(period)));
    }

    private List<Location> ours() {
        return locations.all().stream().filter(l -> l.getCode().startsWith(prefix)).toList();
    }

    private ChainTotals.Total nextWeek() {
        return chainTotals.next(MEASURE, ours()).stream().filter(t -> t.granularity().equals("week")).findFirst()
                .orElseThrow();
    }

    @Test
    void theWeeklyRangeIsBuiltFromThePastErrorsOfShopsThatMoveTogether() {
        ChainTotals.Total t = nextWeek();
        assertThat(t.period()).isEqualTo(LAST_WEEK.plusWeeks(1));
        assertThat(t.locations()).isEqualTo(3);
        assertThat(t.basis()).isEqualTo(ChainTotal.Basis.PAST_ERRORS);
        assertThat(t.periods()).isGreaterThanOrEqualTo(ChainTotal.MIN_PERIODS);
        assertThat(t.correlation()).isGreaterThan(0.3);
        assertThat(t.assumption()).contains("moving together").contains("weeks");
        // narrower than the added bounds, wider than adding variances as if independent
        List<IssuedForecast.Point> firsts = shops.stream().map(c -> refits.current(locations.byCode(c).getId(), MEASURE)
                .orElseThrow().points().get(0)).toList();
        double added = firsts.stream().mapToDouble(p -> p.hi80() - p.lo80()).sum();
        double independent = Math.sqrt(firsts.stream().mapToDouble(p -> Math.pow(p.hi80() - p.lo80(), 2)).sum());
        assertThat(t.hi80() - t.lo80()).isLessThanOrEqualTo(added + 1e-6).isGreaterThan(independent);
        assertThat(t.forecast()).isCloseTo(firsts.stream().mapToDouble(IssuedForecast.Point::forecast).sum(),
                within(1e-6));
    }

    @Test
    void theOverviewTheLocationPageTheEmailAndTheExportShowTheSameTotalAndRange() throws Exception {
        ChainTotals.Total t = nextWeek();
        String money = amounts.money(t.forecast(), CURRENCY);
        String range = amounts.range(t.lo80(), t.hi80(), CURRENCY);

        String overview = mvc.perform(get("/").param("q", prefix).with(owner)).andExpect(status().isOk()).andReturn()
                .getResponse().getContentAsString();
        String footer = overview.substring(overview.indexOf("<tfoot"));
        assertThat(footer).contains("Chain total (3 locations, DKK)").contains(money).contains(range)
                .contains("moving together");

        String page = mvc.perform(get("/locations/" + shops.get(0)).with(owner)).andExpect(status().isOk()).andReturn()
                .getResponse().getContentAsString();
        String chain = page.substring(page.indexOf("id=\"chain-total\""));
        assertThat(chain.substring(0, chain.indexOf("</p>"))).contains(money).contains(range);

        WeeklySummary mail = summaries.build(LAST_WEEK, ZoneId.of("Europe/Copenhagen"));
        WeeklySummary.Line line = mail.chain().stream().filter(c -> c.currency().equals(CURRENCY) && !c.monthly())
                .findFirst().orElseThrow();
        assertThat(line.nextPeriod()).isEqualTo(t.period());
        assertThat(line.nextForecast()).isEqualByComparingTo(money2(t.forecast()));
        assertThat(line.nextLo80()).isEqualByComparingTo(money2(t.lo80()));
        assertThat(line.nextHi80()).isEqualByComparingTo(money2(t.hi80()));
        assertThat(line.note()).isEqualTo(t.assumption());

        var started = mvc.perform(get("/exports/chain").param("format", "csv").with(owner)).andReturn();
        String csv = mvc.perform(org.springframework.test.web.servlet.request.MockMvcRequestBuilders.asyncDispatch(started))
                .andExpect(status().isOk()).andReturn().getResponse()
                .getContentAsString(java.nio.charset.StandardCharsets.UTF_8);
        CSVRecord row = CSVFormat.DEFAULT.builder().setHeader().setSkipHeaderRecord(true).get()
                .parse(new StringReader(csv)).getRecords().stream()
                .filter(r -> r.get("currency").equals(CURRENCY) && r.get("granularity").equals("week")
                        && r.get("period").equals(t.period().toString()))
                .findFirst().orElseThrow(() -> new AssertionError("no week " + t.period() + " in\n" + csv));
        assertThat(row.get("forecast")).as("the currency's decimals, not a 15-digit float").matches("-?\\d+\\.\\d{2}");
        assertThat(new BigDecimal(row.get("forecast"))).isEqualByComparingTo(money2(t.forecast()));
        assertThat(new BigDecimal(row.get("lo80"))).isEqualByComparingTo(money2(t.lo80()));
        assertThat(new BigDecimal(row.get("hi80"))).isEqualByComparingTo(money2(t.hi80()));
        assertThat(row.get("range_basis")).isEqualTo("past-errors");
        assertThat(row.get("locations")).isEqualTo("3");
    }

    @Test
    void aShopReportingByTheMonthIsInTheEmailAndABookkeepersCorrectionChangesIt() {
        WeeklySummary before = summaries.build(LAST_WEEK, ZoneId.of("Europe/Copenhagen"));
        assertThat(before.locations()).extracting(WeeklySummary.Line::code).doesNotContain(monthly);
        WeeklySummary.Line m = before.monthly().stream().filter(l -> l.code().equals(monthly)).findFirst().orElseThrow();
        assertThat(m.granularity()).isEqualTo("month");
        assertThat(m.period()).isEqualTo(LocalDate.of(2026, 10, 1));
        assertThat(m.actual()).isNotNull();
        assertThat(m.forecast()).as("October as forecast from the figures to September").isNotNull();
        assertThat(m.nextPeriod()).isEqualTo(LocalDate.of(2026, 11, 1));
        assertThat(m.nextForecast()).isNotNull();
        assertThat(m.nextLo80()).isLessThan(m.nextForecast());
        assertThat(m.nextHi80()).isGreaterThan(m.nextForecast());
        assertThat(m.lastFigureOn()).isNull();

        long id = locations.byCode(monthly).getId();
        long forecastBefore = refits.current(id, MEASURE).orElseThrow().id();
        BigDecimal corrected = m.actual().multiply(BigDecimal.valueOf(1.3)).setScale(0, RoundingMode.HALF_UP);
        intake.record(List.of(new FigureInput(0, monthly, MEASURE, Granularity.MONTH, LocalDate.of(2026, 10, 1),
                corrected)), Submitter.correction("bea", "October was entered without the catering invoices"), "item");
        await().atMost(Duration.ofSeconds(60)).pollInterval(Duration.ofMillis(100))
                .until(() -> refits.current(id, MEASURE).orElseThrow().id() != forecastBefore);

        WeeklySummary after = summaries.build(LAST_WEEK, ZoneId.of("Europe/Copenhagen"));
        WeeklySummary.Line n = after.monthly().stream().filter(l -> l.code().equals(monthly)).findFirst().orElseThrow();
        assertThat(n.actual()).isEqualByComparingTo(corrected);
        assertThat(n.forecast()).isEqualByComparingTo(m.forecast()); // what was said ahead of October stays
        // the re-fit used the corrected month: the new forecast differs where October carries weight
        // (a year ahead at least, for a seasonal model; at once for a trend or level model)
        List<IssuedForecast.Point> was = refits.history(id, MEASURE, Instant.EPOCH, clock.instant().plusSeconds(1), true).stream()
                .filter(f -> f.id() == forecastBefore).findFirst().orElseThrow().points();
        List<IssuedForecast.Point> now = refits.current(id, MEASURE).orElseThrow().points();
        assertThat(now).hasSameSizeAs(was);
        assertThat(java.util.stream.IntStream.range(0, now.size())
                .anyMatch(i -> Math.abs(now.get(i).forecast() - was.get(i).forecast()) > 1)).isTrue();
        assertThat(n.nextForecast()).isEqualByComparingTo(money2(now.get(0).forecast()));
        assertThat(after.chain()).anySatisfy(c -> {
            assertThat(c.monthly()).isTrue();
            assertThat(c.currency()).isEqualTo(CURRENCY);
            assertThat(c.nextForecast()).isEqualByComparingTo(n.nextForecast()); // one monthly shop: its own
        });
    }

    /** DKK has two decimals (ISO 4217; common practice), rounded half away from zero like the service. */
    private static BigDecimal money2(double v) {
        return BigDecimal.valueOf(v).setScale(2, RoundingMode.HALF_UP);
    }
}

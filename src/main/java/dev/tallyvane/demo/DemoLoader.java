package dev.tallyvane.demo;

import dev.tallyvane.account.Role;
import dev.tallyvane.account.UserService;
import dev.tallyvane.engine.series.Granularity;
import dev.tallyvane.forecasting.LocationEvents;
import dev.tallyvane.forecasting.RefitService;
import dev.tallyvane.forecasting.SettingsService;
import dev.tallyvane.intake.FigureInput;
import dev.tallyvane.intake.IntakeService;
import dev.tallyvane.intake.Submitter;
import dev.tallyvane.location.Location;
import dev.tallyvane.location.LocationDetails;
import dev.tallyvane.location.LocationService;
import java.math.BigDecimal;
import java.time.Clock;
import java.time.LocalDate;
import java.time.ZoneId;
import java.time.temporal.TemporalAdjusters;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.stream.Collectors;
import org.slf4j.Logger;
import org.slf4j.LoggerFactory;
import org.springframework.beans.factory.annotation.Value;
import org.springframework.boot.ApplicationArguments;
import org.springframework.boot.ApplicationRunner;
import org.springframework.stereotype.Component;

/**
 * Loads the demo chain ({@link DemoScenario}) into an empty service at start, when
 * {@code tallyvane.demo.enabled} is true (the default for the embedded database; off with the
 * {@code postgres} profile): demo users with fresh passwords printed on the console, eight locations,
 * three years of daily figures, closed days, and a forecast history built week by week over the last
 * twelve weeks, so accuracy and the drift flag are there from the first visit.
 */
@Component
class DemoLoader implements ApplicationRunner {

    private static final Logger log = LoggerFactory.getLogger(DemoLoader.class);
    private static final ZoneId ZONE = ZoneId.of("Europe/Berlin");
    private static final int HISTORY_WEEKS = 12;

    private final boolean enabled;
    private final String url;
    private final org.springframework.core.env.Environment environment;
    private final UserService users;
    private final LocationService locations;
    private final IntakeService intake;
    private final dev.tallyvane.intake.Measures measures;
    private final RefitService refits;
    private final SettingsService settings;
    private final Clock clock;
    private final dev.tallyvane.system.StartupWork startup;
    private final LocationEvents events;

    DemoLoader(@Value("${tallyvane.demo.enabled:false}") boolean enabled,
            @Value("${tallyvane.summary.dashboard-url:http://localhost:8080}") String url, UserService users,
            LocationService locations, IntakeService intake, dev.tallyvane.intake.Measures measures, RefitService refits,
            SettingsService settings, Clock clock, org.springframework.core.env.Environment environment,
            dev.tallyvane.system.StartupWork startup, LocationEvents events) {
        this.startup = startup;
        this.events = events;
        this.measures = measures;
        this.enabled = enabled;
        this.url = url;
        this.environment = environment;
        this.users = users;
        this.locations = locations;
        this.intake = intake;
        this.refits = refits;
        this.settings = settings;
        this.clock = clock;
    }

    /**
     * Where to open the service: the configured public address, or, when none is configured, this
     * machine with the port the server really listens on (it may not be 8080).
     */
    private String address() {
        String port = environment.getProperty("local.server.port");
        boolean configured = environment.containsProperty("TALLYVANE_PUBLIC_URL")
                || !url.equals("http://localhost:8080");
        return configured || port == null ? url : "http://localhost:" + port;
    }

    @Override
    public void run(ApplicationArguments args) {
        if (!enabled || !users.needsSetup() || !locations.all().isEmpty()) {
            return;
        }
        startup.begin("the demo chain");
        try {
            load();
        } finally {
            startup.done();
        }
    }

    private void load() {
        long t0 = System.nanoTime();
        Map<Role, String> passwords = new java.util.EnumMap<>(Role.class);
        createUser("owner", "Olive Owner", "owner@brindle-oak.example", Role.OWNER, passwords);
        createUser("bookkeeper", "Bram Bookkeeper", "books@brindle-oak.example", Role.BOOKKEEPER, passwords);
        createUser("viewer", "Vera Viewer", null, Role.VIEWER, passwords);
        // the sign-ins first: the sign-in page is already served and says the demo is still loading
        log.info("""

                ==============================================================
                 Tallyvane demo: loading "Brindle & Oak Bakehouse" (an invented chain)
                 Sign in at {} as
                   owner      / {}
                   bookkeeper / {}
                   viewer     / {}
                 The figures and forecasts take a minute or two; the sign-in
                 page says when they are ready.
                ==============================================================""", address(), passwords.get(Role.OWNER),
                passwords.get(Role.BOOKKEEPER), passwords.get(Role.VIEWER));
        LocalDate yesterday = LocalDate.now(clock.withZone(ZONE)).minusDays(1);
        List<DemoScenario.Day> days = DemoScenario.days(yesterday);
        for (DemoScenario.Shop shop : DemoScenario.shops()) {
            Location l = locations.create(new LocationDetails(shop.code(), shop.name(), ZONE.getId(), "EUR",
                    yesterday.minusDays(shop.historyDays() - 1L), null));
            settings.saveCalendar(l.getId(), days.stream().filter(d -> d.closed() && d.code().equals(shop.code())
                    && d.measure().equals("net_sales")).map(DemoScenario.Day::day).toList(), List.of());
            if (shop.code().equals(DemoScenario.MARKET_SHOP)) {
                LocalDate first = yesterday.minusDays(shop.historyDays() - 1L);
                while (!DemoScenario.marketDay(first)) {
                    first = first.plusDays(1);
                }
                events.add(l.getId(), l.getCode(), new LocationEvents.EventInput("Quay market", first.toString(), null,
                        "fortnightly", null, null), "owner");
            }
        }
        // history up to twelve weeks ago, then week by week with a re-fit after each, as if time passed
        LocalDate thisWeek = yesterday.plusDays(1).with(TemporalAdjusters.previousOrSame(java.time.DayOfWeek.MONDAY));
        LocalDate cut = thisWeek.minusWeeks(HISTORY_WEEKS);
        record(days.stream().filter(d -> d.day().isBefore(cut)).toList());
        for (int w = HISTORY_WEEKS; w >= 0; w--) {
            LocalDate from = thisWeek.minusWeeks(w);
            LocalDate to = from.plusWeeks(1);
            refitAll();
            record(days.stream().filter(d -> !d.day().isBefore(from) && d.day().isBefore(to)).toList());
        }
        log.info("""

                ==============================================================
                 Tallyvane demo: "Brindle & Oak Bakehouse" (an invented chain)
                 Open {} and sign in as
                   owner      / {}
                   bookkeeper / {}
                   viewer     / {}
                 Loaded in {} s; the latest forecasts follow within a minute.
                ==============================================================""", address(), passwords.get(Role.OWNER),
                passwords.get(Role.BOOKKEEPER), passwords.get(Role.VIEWER), (System.nanoTime() - t0) / 1_000_000_000);
    }

    private void createUser(String name, String display, String email, Role role, Map<Role, String> passwords) {
        String password = dev.tallyvane.account.PasswordResets.randomPassword();
        users.create(new UserService.NewUser(name, display, email, password, password, role), "demo");
        passwords.put(role, password);
    }


    /** The demo's measures besides net sales: cake orders at the harbour, and the till's transactions. */
    private void declare(List<String> used) {
        java.util.Set<String> wanted = new java.util.TreeSet<>(used);
        wanted.add("transactions"); // posted by demo/post-from-pos.sh
        java.util.Map<String, String> words = java.util.Map.of("cake_orders", "whole cakes ordered ahead",
                "transactions", "number of sales at the till");
        for (String m : wanted) {
            if (!measures.names().contains(m)) {
                measures.declare(m, words.getOrDefault(m, m.replace('_', ' ')), "demo");
            }
        }
    }

    private void record(List<DemoScenario.Day> days) {
        if (days.isEmpty()) {
            return;
        }
        List<FigureInput> figures = new ArrayList<>(days.size());
        declare(days.stream().map(DemoScenario.Day::measure).distinct().toList());
        for (DemoScenario.Day d : days) {
            figures.add(new FigureInput(figures.size(), d.code(), d.measure(), Granularity.DAY, d.day(),
                    BigDecimal.valueOf(d.amount())));
        }
        intake.record(figures, Submitter.demo(), "item");
    }

    private void refitAll() {
        for (Location l : locations.all()) {
            for (String measure : l.getCode().equals("HARBOUR") ? List.of("net_sales", "cake_orders") : List.of("net_sales")) {
                refits.refit(l.getId(), measure, "demo");
            }
        }
    }

    /** For tests: the codes of the demo locations. */
    static List<String> codes() {
        return DemoScenario.shops().stream().map(DemoScenario.Shop::code).collect(Collectors.toList());
    }
}

package dev.tallyvane.demo;

import java.time.DayOfWeek;
import java.time.LocalDate;
import java.time.MonthDay;
import java.util.ArrayList;
import java.util.List;
import java.util.Random;
import java.util.Set;

/**
 * The demo chain, an invented one: "Brindle &amp; Oak Bakehouse", eight bakery-cafés with three years
 * of daily net sales ending yesterday, generated from a fixed seed (the same every run for the same
 * end date). Structure: a weekly rhythm (busy Saturdays, quiet Mondays), a yearly season (December
 * high, January low), a slow trend, noise, and closures on 25/26 December and 1 January. Fern Hill
 * opened ten weeks ago; Canalside's sales dropped by a third eight weeks ago (roadworks closed the
 * canal path), which the drift signals flag; Harbour Street also records special-order cakes, a
 * measure that is zero on most days. Quayside sells about a quarter more on the Saturdays of the
 * fortnightly quay market (recorded as an event whose effect the forecast measures).
 */
final class DemoScenario {

    static final long SEED = 20_261_130L;
    /** The quay market: every other Saturday, these sell about a quarter more at Quayside. */
    static final String MARKET_SHOP = "QUAYSIDE";
    static final double MARKET_LIFT = 1.25;

    /** True on a quay-market Saturday (every other Saturday, counted from the epoch). */
    static boolean marketDay(LocalDate d) {
        return d.getDayOfWeek() == DayOfWeek.SATURDAY && (d.toEpochDay() / 7) % 2 == 0;
    }

    static final Set<MonthDay> CLOSED = Set.of(MonthDay.of(12, 25), MonthDay.of(12, 26), MonthDay.of(1, 1));

    private DemoScenario() {
    }

    /** A demo location. */
    record Shop(String code, String name, double level, double trendPerYear, int historyDays, Integer shiftDaysAgo,
            double shift) {
    }

    static List<Shop> shops() {
        return List.of(
                new Shop("HARBOUR", "Harbour Street", 2_100, 0.06, 3 * 365, null, 0),
                new Shop("MILLRACE", "Millrace Lane", 1_450, 0.04, 3 * 365, null, 0),
                new Shop("STATION", "Station Kiosk", 900, 0.02, 3 * 365, null, 0),
                new Shop("ORCHARD", "Orchard Row", 1_250, 0.08, 3 * 365, null, 0),
                new Shop("QUAYSIDE", "Quayside", 1_700, 0.03, 3 * 365, null, 0),
                new Shop("BELLTOWER", "Bell Tower Square", 1_950, 0.05, 3 * 365, null, 0),
                new Shop("CANALSIDE", "Canalside", 1_600, 0.04, 3 * 365, 56, -0.34),
                new Shop("FERNHILL", "Fern Hill", 1_100, 0.0, 70, null, 0));
    }

    /** One day's figure. */
    record Day(String code, String measure, LocalDate day, double amount, boolean closed) {
    }

    /** Every daily figure up to and including {@code lastDay}. */
    static List<Day> days(LocalDate lastDay) {
        Random random = new Random(SEED);
        double[] week = {0.78, 0.9, 0.95, 1.0, 1.12, 1.42, 1.05};
        List<Day> out = new ArrayList<>();
        for (Shop shop : shops()) {
            LocalDate first = lastDay.minusDays(shop.historyDays() - 1L);
            for (LocalDate d = first; !d.isAfter(lastDay); d = d.plusDays(1)) {
                double years = (d.toEpochDay() - lastDay.toEpochDay()) / 365.25;
                double season = 1 + 0.14 * Math.cos(2 * Math.PI * (d.getDayOfYear() - 350) / 365.25);
                double level = shop.level() * (1 + shop.trendPerYear() * years) * season;
                if (shop.shiftDaysAgo() != null && !d.isBefore(lastDay.minusDays(shop.shiftDaysAgo()))) {
                    level *= 1 + shop.shift();
                }
                double noise = 1 + 0.07 * random.nextGaussian();
                boolean closed = CLOSED.contains(MonthDay.from(d));
                double market = shop.code().equals(MARKET_SHOP) && marketDay(d) ? MARKET_LIFT : 1;
                double amount = closed ? 0 : Math.max(0, level * week[d.getDayOfWeek().getValue() - 1] * noise * market);
                out.add(new Day(shop.code(), "net_sales", d, Math.round(amount * 100) / 100.0, closed));
                if (shop.code().equals("HARBOUR")) {
                    int cakes = closed || random.nextDouble() > (d.getDayOfWeek() == DayOfWeek.SATURDAY ? 0.45 : 0.12) ? 0
                            : 1 + random.nextInt(3);
                    out.add(new Day(shop.code(), "cake_orders", d, cakes, closed));
                }
            }
        }
        return out;
    }
}

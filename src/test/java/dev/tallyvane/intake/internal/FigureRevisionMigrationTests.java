package dev.tallyvane.intake.internal;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import dev.tallyvane.engine.series.Granularity;
import dev.tallyvane.intake.FigureKey;
import dev.tallyvane.intake.Submitter;
import dev.tallyvane.support.PostgresDatabase;
import java.math.BigDecimal;
import java.sql.Timestamp;
import java.time.Instant;
import java.time.LocalDate;
import java.util.EnumSet;
import java.util.List;
import java.util.Map;
import java.util.Set;
import javax.sql.DataSource;
import org.flywaydb.core.Flyway;
import org.junit.jupiter.api.Test;
import org.springframework.dao.DataIntegrityViolationException;
import org.springframework.jdbc.core.JdbcTemplate;
import org.springframework.jdbc.datasource.DataSourceTransactionManager;
import org.springframework.jdbc.datasource.DriverManagerDataSource;
import org.springframework.transaction.support.TransactionTemplate;

/**
 * The move to append-only revisions (V17): figures written while a correction still marked the old
 * row ({@code superseded_at}) come out numbered in the order they were recorded, read back with the
 * same current and "as of" values, and the database refuses a second row with the same revision
 * number. On the embedded H2 and on PostgreSQL (each with its own vendor migration).
 */
class FigureRevisionMigrationTests {

    static final Instant T1 = Instant.parse("2026-11-02T08:00:00Z");
    static final Instant T2 = Instant.parse("2026-11-09T08:00:00Z");
    static final Instant T3 = Instant.parse("2026-11-16T08:00:00Z");
    static final LocalDate DAY = LocalDate.of(2026, 11, 1);

    @Test
    void h2() {
        check(new DriverManagerDataSource("jdbc:h2:mem:migration" + System.nanoTime()
                + ";DB_CLOSE_DELAY=-1;MODE=PostgreSQL;DATABASE_TO_LOWER=TRUE;DEFAULT_NULL_ORDERING=HIGH", "sa", ""), "h2");
    }

    @Test
    void postgresql() {
        String[] db = PostgresDatabase.fresh();
        check(new DriverManagerDataSource(db[0], db[1], db[2]), "postgresql");
    }

    private static void check(DataSource ds, String vendor) {
        Flyway.configure().dataSource(ds).locations("classpath:db/migration", "classpath:db/vendor/" + vendor)
                .target("16").load().migrate();
        JdbcTemplate jdbc = new JdbcTemplate(ds);
        jdbc.update("insert into location (code, name, time_zone, currency, status, created_at) values "
                + "('M1', 'M1', 'Europe/Berlin', 'EUR', 'ACTIVE', ?)", Timestamp.from(T1));
        long location = jdbc.queryForObject("select id from location where code = 'M1'", Long.class);
        // the day: recorded at T1, corrected at T2 and again at T3; the next day: recorded once at T1;
        // the month: recorded at T2 (a later id than the day's first correction)
        row(jdbc, location, "DAY", DAY, "100", T1, T2);
        row(jdbc, location, "DAY", DAY.plusDays(1), "150", T1, null);
        row(jdbc, location, "DAY", DAY, "110", T2, T3);
        row(jdbc, location, "MONTH", DAY, "3000", T2, null);
        row(jdbc, location, "DAY", DAY, "120", T3, null);

        Flyway.configure().dataSource(ds).locations("classpath:db/migration", "classpath:db/vendor/" + vendor).load()
                .migrate();

        assertThat(jdbc.queryForList("select amount, revision_no from figure_revision where granularity = 'DAY' and "
                + "period_start = ? order by recorded_at", DAY).stream()
                .map(r -> ((BigDecimal) r.get("amount")).stripTrailingZeros().toPlainString() + "#" + r.get("revision_no")))
                .containsExactly("100#1", "110#2", "120#3");
        assertThat(jdbc.queryForList("select revision_no from figure_revision where period_start <> ? or granularity = "
                + "'MONTH'", Integer.class, DAY)).containsOnly(1);
        assertThat(jdbc.queryForObject("select count(*) from information_schema.columns where lower(table_name) = "
                + "'figure_revision' and lower(column_name) = 'superseded_at'", Integer.class))
                .as("the marking column is gone").isZero();

        FigureStore store = new FigureStore(jdbc);
        TransactionTemplate tx = new TransactionTemplate(new DataSourceTransactionManager(ds));
        Map<FigureKey, FigureStore.Current> current = store.current(Set.of(location), "net_sales", Granularity.DAY,
                DAY, DAY.plusDays(1));
        assertThat(current.get(new FigureKey(location, "net_sales", Granularity.DAY, DAY)))
                .isEqualTo(new FigureStore.Current(3, new BigDecimal("120.0000")));
        assertThat(current.get(new FigureKey(location, "net_sales", Granularity.DAY, DAY.plusDays(1))).revisionNo())
                .isEqualTo(1);
        assertThat(amounts(store, location, null)).containsExactly("120", "150");
        assertThat(amounts(store, location, T2.minusSeconds(1))).as("as known just before the first correction")
                .containsExactly("100", "150");
        assertThat(amounts(store, location, T2)).as("as known at the first correction").containsExactly("110", "150");

        // a correction appends the next revision and updates nothing
        tx.executeWithoutResult(s -> store.insert(List.of(FigureStore.NewRevision.next(
                new FigureKey(location, "net_sales", Granularity.DAY, DAY), new BigDecimal("125"),
                current.get(new FigureKey(location, "net_sales", Granularity.DAY, DAY)))),
                Instant.parse("2026-11-23T08:00:00Z"), Submitter.api("till", null)));
        assertThat(amounts(store, location, null)).containsExactly("125", "150");
        assertThat(amounts(store, location, T3)).as("earlier knowledge is unchanged").containsExactly("120", "150");

        // two writers that both read revision 3 cannot both write revision 4
        assertThatThrownBy(() -> tx.executeWithoutResult(s -> store.insert(List.of(FigureStore.NewRevision.next(
                new FigureKey(location, "net_sales", Granularity.DAY, DAY), new BigDecimal("130"),
                current.get(new FigureKey(location, "net_sales", Granularity.DAY, DAY)))),
                Instant.parse("2026-11-23T09:00:00Z"), Submitter.api("till", null))))
                .isInstanceOf(DataIntegrityViolationException.class);
        assertThat(amounts(store, location, null)).containsExactly("125", "150");
    }

    private static void row(JdbcTemplate jdbc, long location, String granularity, LocalDate period, String amount,
            Instant recorded, Instant superseded) {
        jdbc.update("insert into figure_revision (location_id, measure, granularity, period_start, amount, recorded_at, "
                + "superseded_at, source, actor) values (?, 'net_sales', ?, ?, ?, ?, ?, 'API', 'till')", location,
                granularity, period, new BigDecimal(amount), Timestamp.from(recorded),
                superseded == null ? null : Timestamp.from(superseded));
    }

    private static List<String> amounts(FigureStore store, long location, Instant asOf) {
        return store.read(location, "net_sales", EnumSet.of(Granularity.DAY), asOf, null, null).stream()
                .map(s -> s.amount().stripTrailingZeros().toPlainString()).toList();
    }
}

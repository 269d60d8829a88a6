package dev.tallyvane.support;

import java.sql.Connection;
import java.sql.DriverManager;
import java.sql.SQLException;
import java.sql.Statement;
import java.util.UUID;
import org.junit.jupiter.api.Assumptions;
import org.springframework.test.context.DynamicPropertyRegistry;
import org.testcontainers.DockerClientFactory;
import org.testcontainers.postgresql.PostgreSQLContainer;

/**
 * The PostgreSQL the integration tests talk to, over a real connection:
 * <ol>
 * <li>a Testcontainers PostgreSQL when a Docker engine is available;</li>
 * <li>otherwise the server named by {@code TALLYVANE_TEST_PG_URL} (with {@code TALLYVANE_TEST_PG_USER},
 * {@code TALLYVANE_TEST_PG_PASSWORD}), in which a fresh database is created for this test run;</li>
 * <li>otherwise the tests are skipped, except under {@code CI=true}, where they fail: CI must
 * prove the PostgreSQL path.</li>
 * </ol>
 * One database per JVM, shared by all PostgreSQL test classes (so Spring can cache the context);
 * tests use their own location codes.
 */
public final class PostgresDatabase {

    private static Target target;

    private PostgresDatabase() {
    }

    record Target(String url, String user, String password) {
    }

    /** Registers the datasource properties of the test PostgreSQL. */
    public static void register(DynamicPropertyRegistry registry) {
        Target t = target();
        registry.add("spring.datasource.url", t::url);
        registry.add("spring.datasource.username", t::user);
        registry.add("spring.datasource.password", t::password);
    }

    static synchronized Target target() {
        if (target != null) {
            return target;
        }
        if (dockerAvailable()) {
            PostgreSQLContainer container = new PostgreSQLContainer("postgres:16-alpine");
            container.start();
            target = new Target(container.getJdbcUrl() + "&reWriteBatchedInserts=true", container.getUsername(),
                    container.getPassword());
            return target;
        }
        String url = System.getenv("TALLYVANE_TEST_PG_URL");
        boolean ci = "true".equalsIgnoreCase(System.getenv("CI"));
        if (url == null || url.isBlank()) {
            if (ci) {
                throw new IllegalStateException("CI=true but no PostgreSQL: no Docker engine and TALLYVANE_TEST_PG_URL "
                        + "is not set. The PostgreSQL tests must run in CI.");
            }
            Assumptions.abort("no Docker engine and no TALLYVANE_TEST_PG_URL: PostgreSQL tests skipped");
        }
        String user = envOr("TALLYVANE_TEST_PG_USER", "postgres");
        String password = envOr("TALLYVANE_TEST_PG_PASSWORD", "");
        String database = "tallyvane_it_" + UUID.randomUUID().toString().replace("-", "").substring(0, 12);
        try (Connection c = DriverManager.getConnection(url, user, password); Statement s = c.createStatement()) {
            s.execute("create database " + database);
        } catch (SQLException e) {
            throw new IllegalStateException("cannot create the test database on " + url + ": " + e.getMessage(), e);
        }
        String base = url.substring(0, url.lastIndexOf('/') + 1);
        target = new Target(base + database + "?reWriteBatchedInserts=true", user, password);
        Runtime.getRuntime().addShutdownHook(new Thread(() -> drop(url, user, password, database)));
        return target;
    }

    /** Registers the datasource properties of a further, empty database (for benchmarks that need their own). */
    public static void registerFresh(DynamicPropertyRegistry registry) {
        String[] db = fresh();
        registry.add("spring.datasource.url", () -> db[0]);
        registry.add("spring.datasource.username", () -> db[1]);
        registry.add("spring.datasource.password", () -> db[2]);
    }

    /**
     * A further, empty database on the same test server, for tests that must not share their data
     * (and their job queue) with other test contexts: url, user, password.
     */
    public static String[] fresh() {
        Target t = target();
        String base = t.url().substring(0, t.url().lastIndexOf('/') + 1);
        String admin = t.url().substring(0, t.url().indexOf('?') < 0 ? t.url().length() : t.url().indexOf('?'));
        String database = "tallyvane_it_" + UUID.randomUUID().toString().replace("-", "").substring(0, 12);
        try (Connection c = DriverManager.getConnection(admin, t.user(), t.password()); Statement s = c.createStatement()) {
            s.execute("create database " + database);
        } catch (SQLException e) {
            throw new IllegalStateException("cannot create a test database: " + e.getMessage(), e);
        }
        Runtime.getRuntime().addShutdownHook(new Thread(() -> drop(admin, t.user(), t.password(), database)));
        return new String[] {base + database + "?reWriteBatchedInserts=true", t.user(), t.password()};
    }

    /**
     * The shell command that restarts the test PostgreSQL server (for the crash-safety test):
     * {@code TALLYVANE_TEST_PG_RESTART} when set, else the local Debian cluster's pg_ctlcluster.
     *
     * @throws IllegalStateException when neither is available (a container cannot be restarted in place)
     */
    public static String localClusterRestartCommand() {
        String given = System.getenv("TALLYVANE_TEST_PG_RESTART");
        if (given != null && !given.isBlank()) {
            return given;
        }
        java.io.File clusters = new java.io.File("/etc/postgresql");
        String[] versions = clusters.list();
        if (versions == null || versions.length == 0) {
            throw new IllegalStateException("cannot restart the test PostgreSQL: set TALLYVANE_TEST_PG_RESTART");
        }
        return "pg_ctlcluster --skip-systemctl-redirect " + versions[0] + " main restart";
    }

    private static void drop(String url, String user, String password, String database) {
        try (Connection c = DriverManager.getConnection(url, user, password); Statement s = c.createStatement()) {
            s.execute("drop database if exists " + database + " with (force)");
        } catch (SQLException ignored) {
            // best effort: a leftover test database is harmless
        }
    }

    private static boolean dockerAvailable() {
        try {
            return DockerClientFactory.instance().isDockerAvailable();
        } catch (RuntimeException | LinkageError e) {
            return false;
        }
    }

    private static String envOr(String name, String fallback) {
        String v = System.getenv(name);
        return v == null ? fallback : v;
    }
}

package dev.tallyvane.support;

import dev.tallyvane.app.TallyvaneApplication;
import java.util.ArrayList;
import java.util.List;
import org.springframework.boot.builder.SpringApplicationBuilder;
import org.springframework.context.ConfigurableApplicationContext;

/** Starts a whole service instance (own context, random port) on a given database, as a second node would be. */
public final class ServiceInstances implements org.junit.jupiter.api.extension.AfterEachCallback {

    private final List<ConfigurableApplicationContext> started = new ArrayList<>();

    /** Starts an instance that is closed after the test (use as a {@code @RegisterExtension} field). */
    public ConfigurableApplicationContext startClosedAfterTest(String name, String[] db, String... extra) {
        ConfigurableApplicationContext c = start(name, db, extra);
        started.add(c);
        return c;
    }

    @Override
    public void afterEach(org.junit.jupiter.api.extension.ExtensionContext context) {
        started.forEach(ConfigurableApplicationContext::close);
        started.clear();
    }

    /**
     * @param name  the instance's name in the job table
     * @param db    url, user, password ({@link PostgresDatabase#fresh()})
     * @param extra further command-line settings, e.g. "--tallyvane.refit.coalesce=500ms"
     */
    public static ConfigurableApplicationContext start(String name, String[] db, String... extra) {
        List<String> args = new ArrayList<>(List.of("--spring.datasource.url=" + db[0],
                "--spring.datasource.username=" + db[1], "--spring.datasource.password=" + db[2], "--server.port=0",
                "--tallyvane.jobs.instance-name=" + name, "--tallyvane.jobs.polling-interval=100ms",
                "--spring.main.banner-mode=off"));
        args.addAll(List.of(extra));
        // command-line arguments: they outrank application.yml
        return new SpringApplicationBuilder(TallyvaneApplication.class).run(args.toArray(String[]::new));
    }
}

package dev.tallyvane.app;

import dev.tallyvane.cli.ForecastCommand;
import org.springframework.boot.SpringApplication;
import org.springframework.boot.autoconfigure.SpringBootApplication;
import org.springframework.boot.persistence.autoconfigure.EntityScan;
import org.springframework.data.jpa.repository.config.EnableJpaRepositories;
import org.springframework.scheduling.annotation.EnableScheduling;

/**
 * Entry point. With the first argument {@code forecast} the jar runs the one-shot forecast command
 * (no server, no database), with {@code reset-password USER} the console password recovery
 * ({@link PasswordRecovery}); otherwise it starts the service.
 *
 * <p>The class lives in its own package and names the feature packages it scans, so the plain-Java
 * {@code engine} package is never component-scanned.
 */
@SpringBootApplication(scanBasePackages = {
        "dev.tallyvane.system", "dev.tallyvane.location", "dev.tallyvane.intake",
        "dev.tallyvane.account", "dev.tallyvane.forecasting", "dev.tallyvane.accuracy", "dev.tallyvane.export",
        "dev.tallyvane.summary", "dev.tallyvane.dashboard", "dev.tallyvane.demo" })
@EntityScan(basePackages = "dev.tallyvane")
@EnableJpaRepositories(basePackages = "dev.tallyvane")
@EnableScheduling
public class TallyvaneApplication {

    public static void main(String[] args) {
        if (args.length > 0 && ForecastCommand.NAME.equals(args[0])) {
            System.exit(ForecastCommand.run(args, System.out, System.err));
        }
        if (args.length > 0 && PasswordRecovery.NAME.equals(args[0])) {
            System.exit(PasswordRecovery.run(args, System.out, System.err));
        }
        SpringApplication.run(TallyvaneApplication.class, args);
    }
}

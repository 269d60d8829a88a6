package dev.tallyvane.app;

import dev.tallyvane.account.UserService;
import dev.tallyvane.system.InvalidRequest;
import java.io.PrintStream;
import java.util.Arrays;
import org.springframework.boot.WebApplicationType;
import org.springframework.boot.builder.SpringApplicationBuilder;
import org.springframework.context.ConfigurableApplicationContext;

/**
 * {@code java -jar tallyvane.jar reset-password USER}: the way back in when the owner's password is
 * lost and nobody can e-mail a link. Run on the server, with the same database settings as the
 * service (environment variables or {@code --spring.datasource.url=…}); it gives the user a new
 * random password, enables and unlocks the account, prints the password once and writes the
 * activity log. No web server, no jobs, no demo data. Whoever can run it can read the database
 * anyway, so it asks nothing more. The embedded database file is opened by one process at a time:
 * stop the service first there (PostgreSQL needs no such pause).
 */
public final class PasswordRecovery {

    public static final String NAME = "reset-password";

    private PasswordRecovery() {
    }

    /** Runs the command; returns the exit code (0 done, 2 usage or unknown user). */
    public static int run(String[] args, PrintStream out, PrintStream err) {
        if (args.length < 2 || args[1].startsWith("-")) {
            err.println("usage: java -jar tallyvane.jar " + NAME + " USER [--spring.datasource.url=…]");
            err.println("Gives USER a new random password, printed once; the service may keep running.");
            return 2;
        }
        String user = args[1];
        String[] rest = Arrays.copyOfRange(args, 2, args.length);
        try (ConfigurableApplicationContext context = new SpringApplicationBuilder(TallyvaneApplication.class)
                .web(WebApplicationType.NONE).logStartupInfo(false)
                .properties("tallyvane.demo.enabled=false", "tallyvane.jobs.start=false", "spring.main.banner-mode=off",
                        "spring.modulith.events.republish-outstanding-events-on-restart=false",
                        "logging.level.root=WARN")
                .run(rest)) {
            String password = context.getBean(UserService.class).recoverFromConsole(user);
            out.println("New password for " + user + ": " + password);
            out.println("Sign in with it and change it under \"Your password\".");
            return 0;
        } catch (InvalidRequest e) {
            err.println(e.problems().isEmpty() ? e.getMessage() : e.problems().get(0).reason());
            return 2;
        }
    }
}

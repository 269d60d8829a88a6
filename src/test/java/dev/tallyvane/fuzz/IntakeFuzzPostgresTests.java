package dev.tallyvane.fuzz;

import dev.tallyvane.support.PostgresDatabase;

/**
 * The same generated malformed input on PostgreSQL, which refuses some text that H2 takes (a NUL
 * character): a 500 there must fail the build too.
 */
class IntakeFuzzPostgresTests extends IntakeFuzzTests {

    @Override
    String[] database() {
        String[] db = PostgresDatabase.fresh();
        return new String[] {"--spring.datasource.url=" + db[0], "--spring.datasource.username=" + db[1],
                "--spring.datasource.password=" + db[2]};
    }
}

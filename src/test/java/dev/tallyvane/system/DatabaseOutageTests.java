package dev.tallyvane.system;

import static org.assertj.core.api.Assertions.assertThat;

import java.sql.SQLException;
import org.junit.jupiter.api.Test;
import org.springframework.orm.jpa.JpaSystemException;

/** Which failures count as the database being away (answered 503) rather than a fault (500). */
class DatabaseOutageTests {

    @Test
    void lostConnectionsAreOutagesEvenWhenWrapped() {
        // what a PostgreSQL restart produced in the crash-safety test: a failed rollback over a dropped connection
        var rollback = new JpaSystemException(new RuntimeException("Unable to rollback against JDBC Connection",
                new SQLException("Connection is closed")));
        assertThat(DatabaseOutage.isOutage(rollback)).isTrue();
        // SQLSTATE codes: PostgreSQL Documentation, Appendix A "PostgreSQL Error Codes" (class 08 Connection
        // Exception, 08001 sqlclient_unable_to_establish_sqlconnection; class 57, 57P01 admin_shutdown)
        assertThat(DatabaseOutage.isOutage(new SQLException("terminating connection due to administrator command",
                "57P01"))).isTrue();
        assertThat(DatabaseOutage.isOutage(new RuntimeException(new SQLException("refused", "08001")))).isTrue();
        assertThat(DatabaseOutage.isOutage(new java.net.SocketException("Connection reset"))).isTrue();
    }

    @Test
    void otherFailuresAreNot() {
        // 23505 unique_violation (same appendix): a real conflict, not an outage
        assertThat(DatabaseOutage.isOutage(new SQLException("duplicate key", "23505"))).isFalse();
        assertThat(DatabaseOutage.isOutage(new IllegalStateException("bug"))).isFalse();
        assertThat(DatabaseOutage.isOutage(new JpaSystemException(new RuntimeException("mapping")))).isFalse();
    }
}

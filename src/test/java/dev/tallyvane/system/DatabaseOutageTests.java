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
        assertThat(DatabaseOutage.isOutage(new SQLException("terminating connection due to administrator command",
                "57P01"))).isTrue();
        assertThat(DatabaseOutage.isOutage(new RuntimeException(new SQLException("refused", "08001")))).isTrue();
        assertThat(DatabaseOutage.isOutage(new java.net.SocketException("Connection reset"))).isTrue();
    }

    @Test
    void otherFailuresAreNot() {
        assertThat(DatabaseOutage.isOutage(new SQLException("duplicate key", "23505"))).isFalse();
        assertThat(DatabaseOutage.isOutage(new IllegalStateException("bug"))).isFalse();
        assertThat(DatabaseOutage.isOutage(new JpaSystemException(new RuntimeException("mapping")))).isFalse();
    }
}

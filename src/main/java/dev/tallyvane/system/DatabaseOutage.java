package dev.tallyvane.system;

import java.sql.SQLException;

/**
 * Tells a lost or refused database connection (server restarting, network, pool exhausted) from
 * other failures, so that it is answered with 503 and "try again" instead of a bare 500. A lost
 * connection often surfaces wrapped, e.g. as a failed rollback, so the whole cause chain is read.
 */
public final class DatabaseOutage {

    private DatabaseOutage() {
    }

    public static boolean isOutage(Throwable e) {
        for (Throwable t = e; t != null; t = t.getCause() == t ? null : t.getCause()) {
            if (t instanceof org.springframework.dao.DataAccessResourceFailureException
                    || t instanceof org.springframework.dao.TransientDataAccessException
                    || t instanceof org.springframework.transaction.CannotCreateTransactionException
                    || t instanceof java.sql.SQLTransientConnectionException
                    || t instanceof java.sql.SQLNonTransientConnectionException
                    || t instanceof java.net.SocketException || t instanceof java.io.EOFException) {
                return true;
            }
            // SQLSTATE class 08: connection exception; 57P01–57P03: server shutting down or starting;
            // the pool's own "Connection is closed" (a connection the server dropped) carries no state
            if (t instanceof SQLException s && (s.getSQLState() != null
                    && (s.getSQLState().startsWith("08") || s.getSQLState().startsWith("57P"))
                    || "Connection is closed".equals(s.getMessage()))) {
                return true;
            }
            if (t.getClass().getName().equals("org.hibernate.exception.JDBCConnectionException")) {
                return true;
            }
        }
        return false;
    }
}

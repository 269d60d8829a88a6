package dev.tallyvane.forecasting;

import java.time.LocalDate;
import java.util.HashMap;
import java.util.Map;
import org.springframework.jdbc.core.JdbcTemplate;
import org.springframework.stereotype.Component;
import org.springframework.transaction.annotation.Transactional;

/** The next period of every location's current forecast, in one query (for the locations list). */
@Component
public class NextPeriods {

    private final JdbcTemplate jdbc;

    NextPeriods(JdbcTemplate jdbc) {
        this.jdbc = jdbc;
    }

    /** Next period's forecast with its 80% interval. */
    public record Next(LocalDate period, String granularity, double forecast, double lo80, double hi80, String model) {
    }

    @Transactional(readOnly = true)
    public Map<Long, Next> of(String measure) {
        Map<Long, Next> out = new HashMap<>();
        jdbc.query("select f.location_id, p.period_start, f.granularity, p.forecast, p.lo80, p.hi80, f.chosen_name "
                + "from (select max(id) as id from issued_forecast where measure = ? group by location_id) c "
                + "join issued_forecast f on f.id = c.id "
                + "join issued_forecast_point p on p.issued_id = f.id and p.step = 1", rs -> {
                    out.put(rs.getLong(1), new Next(rs.getObject(2, LocalDate.class), rs.getString(3).toLowerCase(
                            java.util.Locale.ROOT), rs.getDouble(4), rs.getDouble(5), rs.getDouble(6), rs.getString(7)));
                }, measure);
        return out;
    }
}

package dev.tallyvane.intake.upload;

import java.sql.Timestamp;
import java.time.Instant;
import java.util.List;
import java.util.Optional;
import org.springframework.jdbc.core.JdbcTemplate;
import org.springframework.jdbc.core.RowMapper;
import org.springframework.jdbc.support.GeneratedKeyHolder;
import org.springframework.stereotype.Repository;

/** The {@code upload} table: the file as sent (so it can be read again with other options) and its outcome. */
@Repository
class UploadStore {

    private static final String COLUMNS = "id, file_name, uploaded_by, uploaded_at, status, date_order, decimal_style, "
            + "row_count, rejected_count, new_count, changed_count, unchanged_count, committed_at, committed_by";

    private final JdbcTemplate jdbc;

    UploadStore(JdbcTemplate jdbc) {
        this.jdbc = jdbc;
    }

    private static final RowMapper<Upload> MAPPER = (rs, i) -> new Upload(rs.getLong(1), rs.getString(2),
            rs.getString(3), rs.getTimestamp(4).toInstant(), Upload.Status.valueOf(rs.getString(5)),
            new UploadOptions(UploadOptions.DateOrder.valueOf(rs.getString(6)),
                    UploadOptions.NumberStyle.valueOf(rs.getString(7))),
            rs.getInt(8), rs.getInt(9), rs.getInt(10), rs.getInt(11), rs.getInt(12),
            rs.getTimestamp(13) == null ? null : rs.getTimestamp(13).toInstant(), rs.getString(14));

    long insert(String fileName, String contentType, byte[] content, String user, Instant at, UploadOptions options) {
        GeneratedKeyHolder keys = new GeneratedKeyHolder();
        jdbc.update(con -> {
            var ps = con.prepareStatement("insert into upload (file_name, content_type, content, uploaded_by, uploaded_at, "
                    + "status, date_order, decimal_style) values (?, ?, ?, ?, ?, ?, ?, ?)", new String[] {"id"});
            ps.setString(1, fileName);
            ps.setString(2, contentType);
            ps.setBytes(3, content);
            ps.setString(4, user);
            ps.setTimestamp(5, Timestamp.from(at));
            ps.setString(6, Upload.Status.STAGED.name());
            ps.setString(7, options.dateOrder().name());
            ps.setString(8, options.numberStyle().name());
            return ps;
        }, keys);
        return keys.getKey().longValue();
    }

    Optional<Upload> find(long id) {
        return jdbc.query("select " + COLUMNS + " from upload where id = ?", MAPPER, id).stream().findFirst();
    }

    byte[] content(long id) {
        return jdbc.queryForObject("select content from upload where id = ?", byte[].class, id);
    }

    void updateOptions(long id, UploadOptions options) {
        jdbc.update("update upload set date_order = ?, decimal_style = ? where id = ?", options.dateOrder().name(),
                options.numberStyle().name(), id);
    }

    void updateCounts(long id, int rows, int rejected, int created, int changed, int unchanged) {
        jdbc.update("update upload set row_count = ?, rejected_count = ?, new_count = ?, changed_count = ?, "
                + "unchanged_count = ? where id = ?", rows, rejected, created, changed, unchanged, id);
    }

    /** Moves a staged upload to a final status; false when it was no longer staged. */
    boolean finish(long id, Upload.Status status, Instant at, String user) {
        return jdbc.update("update upload set status = ?, committed_at = ?, committed_by = ? where id = ? and status = ?",
                status.name(), Timestamp.from(at), user, id, Upload.Status.STAGED.name()) == 1;
    }

    List<Upload> latest(int limit) {
        return jdbc.query("select " + COLUMNS + " from upload order by uploaded_at desc, id desc fetch first " + limit
                + " rows only", MAPPER);
    }
}

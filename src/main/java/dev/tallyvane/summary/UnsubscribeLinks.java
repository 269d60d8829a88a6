package dev.tallyvane.summary;

import java.nio.charset.StandardCharsets;
import java.security.InvalidKeyException;
import java.security.MessageDigest;
import java.security.NoSuchAlgorithmException;
import java.security.SecureRandom;
import java.util.HexFormat;
import javax.crypto.Mac;
import javax.crypto.spec.SecretKeySpec;
import org.springframework.jdbc.core.JdbcTemplate;
import org.springframework.stereotype.Component;

/**
 * Signed one-click unsubscribe links: HMAC-SHA256 of the user id with a key that every instance
 * shares (made once, kept in {@code app_setting}), so a link cannot be forged for another user.
 */
@Component
class UnsubscribeLinks {

    private static final String KEY = "summary.unsubscribe-key";

    private final JdbcTemplate jdbc;
    private volatile byte[] key;

    UnsubscribeLinks(JdbcTemplate jdbc) {
        this.jdbc = jdbc;
    }

    String token(long userId) {
        try {
            Mac mac = Mac.getInstance("HmacSHA256");
            mac.init(new SecretKeySpec(key(), "HmacSHA256"));
            return HexFormat.of().formatHex(mac.doFinal(("unsubscribe:" + userId).getBytes(StandardCharsets.UTF_8)));
        } catch (NoSuchAlgorithmException | InvalidKeyException e) {
            throw new IllegalStateException(e);
        }
    }

    boolean valid(long userId, String token) {
        return token != null && MessageDigest.isEqual(token(userId).getBytes(StandardCharsets.UTF_8),
                token.getBytes(StandardCharsets.UTF_8));
    }

    private byte[] key() {
        if (key == null) {
            byte[] fresh = new byte[32];
            new SecureRandom().nextBytes(fresh);
            // another instance may have made it first: then this insert does nothing
            jdbc.update("insert into app_setting (name, setting_value) values (?, ?) on conflict do nothing", KEY,
                    HexFormat.of().formatHex(fresh));
            key = HexFormat.of().parseHex(jdbc.queryForObject("select setting_value from app_setting where name = ?", String.class,
                    KEY));
        }
        return key;
    }
}

package dev.tallyvane.system;

import java.math.BigDecimal;
import java.math.RoundingMode;
import java.util.Currency;

/**
 * The one rounding rule for amounts shown or handed out (screens, e-mail, exports): to the
 * currency's number of decimals (ISO 4217: 2 for EUR and DKK, 0 for JPY; 2 for an unknown code),
 * half away from zero, as on a till receipt (common practice). Screens that show whole units round
 * the same way to 0 decimals.
 */
public final class MoneyRounding {

    /** How amounts round everywhere. */
    public static final RoundingMode MODE = RoundingMode.HALF_UP;

    private MoneyRounding() {
    }

    /** The currency's decimals (2 when the code is unknown or has none defined). */
    public static int decimals(String currency) {
        try {
            int d = Currency.getInstance(currency).getDefaultFractionDigits();
            return d < 0 ? 2 : d;
        } catch (IllegalArgumentException | NullPointerException e) {
            return 2;
        }
    }

    /** The amount rounded to the currency's decimals. */
    public static BigDecimal round(double amount, String currency) {
        return BigDecimal.valueOf(amount).setScale(decimals(currency), MODE);
    }

    /** The amount rounded to the currency's decimals. */
    public static BigDecimal round(BigDecimal amount, String currency) {
        return amount.setScale(decimals(currency), MODE);
    }
}

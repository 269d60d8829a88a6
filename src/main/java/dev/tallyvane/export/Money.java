package dev.tallyvane.export;

import dev.tallyvane.system.MoneyRounding;
import java.math.BigDecimal;

/**
 * An amount with its currency: a number cell with that currency's format in XLSX, a plain number
 * in CSV; both rounded to the currency's decimals ({@link MoneyRounding}), never a 15-digit float.
 */
public record Money(Number amount, String currency) {

    /** The amount rounded by the one rule, or null. */
    public BigDecimal rounded() {
        if (amount == null) {
            return null;
        }
        if (amount instanceof BigDecimal b) {
            return MoneyRounding.round(b, currency);
        }
        double d = amount.doubleValue();
        return Double.isFinite(d) ? MoneyRounding.round(d, currency) : null;
    }
}

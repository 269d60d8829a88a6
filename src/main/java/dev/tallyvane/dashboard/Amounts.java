package dev.tallyvane.dashboard;

import java.text.NumberFormat;
import java.util.Currency;
import java.util.Locale;
import org.springframework.context.i18n.LocaleContextHolder;
import org.springframework.stereotype.Component;

/**
 * Formats amounts in a location's currency and the reader's locale (from the browser's language),
 * for templates: {@code ${@amounts.money(value, location.currency)}}.
 */
@Component("amounts")
public class Amounts {

    /** Whole currency units, e.g. "€12,340" or "12.340 €"; a dash for a missing value. */
    public String money(Double value, String currency) {
        if (value == null || !Double.isFinite(value)) {
            return "–";
        }
        NumberFormat f = NumberFormat.getCurrencyInstance(locale());
        try {
            f.setCurrency(Currency.getInstance(currency));
        } catch (IllegalArgumentException | NullPointerException e) {
            f = NumberFormat.getNumberInstance(locale());
        }
        f.setMaximumFractionDigits(0);
        f.setMinimumFractionDigits(0);
        return f.format(value);
    }

    /** A range "lo – hi" in the currency. */
    public String range(Double lo, Double hi, String currency) {
        return money(lo, currency) + " – " + money(hi, currency);
    }

    /** A percentage with one decimal and its sign when asked, e.g. "+4.2%"; a dash for NaN. */
    public String pct(Double value, boolean signed) {
        if (value == null || !Double.isFinite(value)) {
            return "–";
        }
        NumberFormat f = NumberFormat.getNumberInstance(locale());
        f.setMaximumFractionDigits(1);
        f.setMinimumFractionDigits(1);
        return (signed && value > 0 ? "+" : "") + f.format(value) + "%";
    }

    /** A plain number with the given decimals; a dash for NaN. */
    public String number(Double value, int decimals) {
        if (value == null || !Double.isFinite(value)) {
            return "–";
        }
        NumberFormat f = NumberFormat.getNumberInstance(locale());
        f.setMaximumFractionDigits(decimals);
        f.setMinimumFractionDigits(decimals);
        return f.format(value);
    }

    private static Locale locale() {
        return LocaleContextHolder.getLocale();
    }
}

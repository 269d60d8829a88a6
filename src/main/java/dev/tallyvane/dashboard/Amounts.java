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

    /** Formats by locale and currency, built once (building one is slow); each use works on a clone. */
    private final java.util.concurrent.ConcurrentMap<String, NumberFormat> formats =
            new java.util.concurrent.ConcurrentHashMap<>();

    private NumberFormat format(String currency, int decimals) {
        Locale locale = locale();
        String key = locale.toLanguageTag() + "|" + currency + "|" + decimals;
        if (formats.size() > 1000) {
            formats.clear(); // the locale comes from the browser: never let odd headers grow this without bound
        }
        NumberFormat prototype = formats.computeIfAbsent(key, k -> {
            NumberFormat f;
            if (currency == null) {
                f = NumberFormat.getNumberInstance(locale);
            } else {
                f = NumberFormat.getCurrencyInstance(locale);
                try {
                    f.setCurrency(Currency.getInstance(currency));
                } catch (IllegalArgumentException e) {
                    f = NumberFormat.getNumberInstance(locale);
                }
            }
            f.setRoundingMode(dev.tallyvane.system.MoneyRounding.MODE);
            f.setMaximumFractionDigits(decimals);
            f.setMinimumFractionDigits(decimals);
            return f;
        });
        return (NumberFormat) prototype.clone();
    }

    /** Whole currency units, e.g. "€12,340" or "12.340 €"; a dash for a missing value. */
    public String money(Double value, String currency) {
        if (value == null || !Double.isFinite(value)) {
            return "–";
        }
        return format(currency == null ? "" : currency, 0).format(value);
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
        return (signed && value > 0 ? "+" : "") + format(null, 1).format(value) + "%";
    }

    /** A plain number with the given decimals; a dash for NaN. */
    public String number(Double value, int decimals) {
        if (value == null || !Double.isFinite(value)) {
            return "–";
        }
        return format(null, decimals).format(value);
    }

    private static Locale locale() {
        return LocaleContextHolder.getLocale();
    }
}

package dev.tallyvane.intake.upload;

/**
 * How to read dates and numbers written as text.
 *
 * @param dateOrder   order of day and month in dates such as 03/04/2026
 * @param numberStyle which mark separates decimals in amounts such as 1.234,56
 */
public record UploadOptions(DateOrder dateOrder, NumberStyle numberStyle) {

    public static final UploadOptions AUTO = new UploadOptions(DateOrder.AUTO, NumberStyle.AUTO);

    /** Day/month order of slash- or dot-separated dates (ISO yyyy-MM-dd is always understood). */
    public enum DateOrder {
        AUTO, DAY_FIRST, MONTH_FIRST
    }

    /** Decimal mark of amounts written as text. */
    public enum NumberStyle {
        /** Decide from the file: a comma followed by one or two digits at the end means decimal comma. */
        AUTO,
        /** 1,234.56 */
        POINT,
        /** 1.234,56 (also 1 234,56) */
        COMMA
    }
}

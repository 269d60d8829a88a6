package dev.tallyvane.export;

/** An amount with its currency: a number cell with that currency's format in XLSX, a plain number in CSV. */
public record Money(Number amount, String currency) {
}

package dev.tallyvane.intake.upload;

import java.time.LocalDate;

/** A cell as read from a file, before interpretation. */
sealed interface RawValue {

    /** Text (all CSV cells, text cells of a workbook). */
    record Text(String value) implements RawValue {
    }

    /** A numeric workbook cell. */
    record Number(double value) implements RawValue {
    }

    /** A workbook cell holding a date (numeric with a date format). */
    record Date(LocalDate value) implements RawValue {
    }

    /** A workbook cell holding a formula (rejected: the bookkeeper should paste values). */
    record Formula(String expression) implements RawValue {
    }

    /** A workbook cell of another kind (boolean, error). */
    record Other(String description) implements RawValue {
    }
}

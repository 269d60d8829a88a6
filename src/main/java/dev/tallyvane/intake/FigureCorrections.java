package dev.tallyvane.intake;

import dev.tallyvane.account.AuditLog;
import dev.tallyvane.engine.series.Granularity;
import dev.tallyvane.intake.internal.FigureStore;
import dev.tallyvane.location.Location;
import dev.tallyvane.system.InvalidRequest;
import dev.tallyvane.system.InvalidRequest.FieldProblem;
import java.math.BigDecimal;
import java.time.LocalDate;
import java.util.ArrayList;
import java.util.List;
import java.util.Set;
import org.springframework.stereotype.Service;
import org.springframework.transaction.annotation.Transactional;

/**
 * A figure corrected by hand in the browser: one period's amount with the reason for the change. It
 * is recorded like any other correction (a new revision; the old value kept, the re-fit queued by
 * the same event), with the user and the reason beside it, and written to the audit log.
 */
@Service
public class FigureCorrections {

    /** Longest reason kept. */
    public static final int MAX_REASON = 500;

    private final IntakeService intake;
    private final FigureStore store;
    private final AuditLog audit;

    FigureCorrections(IntakeService intake, FigureStore store, AuditLog audit) {
        this.intake = intake;
        this.store = store;
        this.audit = audit;
    }

    /** What the user typed: the figure's measure and period (as shown on the page), the new amount and why. */
    public record Correction(String measure, String period, String amount, String reason) {
    }

    /**
     * Corrects a figure that exists.
     *
     * @return the amount it had before
     * @throws InvalidRequest naming each bad field (nothing is written then)
     */
    @Transactional
    public BigDecimal correct(Location location, Correction c, String user) {
        List<FieldProblem> problems = new ArrayList<>();
        String measure = c.measure() == null ? "" : c.measure().trim();
        if (!FigureRules.MEASURE.matcher(measure).matches()) {
            problems.add(new FieldProblem(null, "measure", "'" + InvalidRequest.echo(measure) + "' is not a measure"));
        }
        Granularity granularity = null;
        LocalDate period = null;
        try {
            granularity = Granularity.ofLabel(c.period() == null ? "" : c.period());
            period = granularity.parse(c.period().trim());
        } catch (IllegalArgumentException e) {
            problems.add(new FieldProblem(null, "period", "'" + InvalidRequest.echo(c.period()) + "' is not a day, week, month or quarter"));
        }
        BigDecimal amount = amount(c.amount(), problems);
        String reason = c.reason() == null ? "" : c.reason().strip();
        String unprintable = FigureRules.unprintable(reason);
        if (reason.isEmpty()) {
            problems.add(new FieldProblem(null, "reason", "say why the figure is corrected (it is kept with the change)"));
        } else if (unprintable != null) {
            problems.add(new FieldProblem(null, "reason", "the reason " + unprintable));
        } else if (reason.length() > MAX_REASON) {
            problems.add(new FieldProblem(null, "reason", "at most " + MAX_REASON + " characters"));
        }
        if (!problems.isEmpty()) {
            throw new InvalidRequest("The figure was not corrected.", problems);
        }
        FigureStore.Current current = store.current(Set.of(location.getId()), measure, granularity, period, period)
                .get(new FigureKey(location.getId(), measure, granularity, period));
        if (current == null) {
            throw new InvalidRequest("period", "there is no " + measure + " figure for " + c.period().trim()
                    + " to correct; upload or post it instead");
        }
        if (current.amount().compareTo(amount) == 0) {
            throw new InvalidRequest("amount", "the figure is already " + current.amount().stripTrailingZeros()
                    .toPlainString() + "; nothing to correct");
        }
        intake.record(List.of(new FigureInput(1, location.getCode(), measure, granularity, period, amount)),
                Submitter.correction(user, reason), "figure");
        audit.record(user, "FIGURE_CORRECTED", location.getCode() + " " + measure + " " + c.period().trim() + ": "
                + current.amount().stripTrailingZeros().toPlainString() + " → " + amount.toPlainString() + " (" + reason
                + ")");
        return current.amount().stripTrailingZeros();
    }

    /** An amount as typed in the browser: digits with a decimal point, an optional sign, spaces and thousands commas ignored. */
    private static BigDecimal amount(String text, List<FieldProblem> problems) {
        String t = text == null ? "" : text.strip().replace(" ", "").replace("\u00A0", "").replace(",", "");
        if (t.isEmpty()) {
            problems.add(new FieldProblem(null, "amount", "give the corrected amount"));
            return null;
        }
        if (!t.matches("[-+]?\\d{1,15}(\\.\\d+)?")) {
            problems.add(new FieldProblem(null, "amount", "'" + InvalidRequest.echo(text) + "' is not an amount; write it like 1234.50"));
            return null;
        }
        return new BigDecimal(t);
    }
}

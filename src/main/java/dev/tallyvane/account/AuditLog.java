package dev.tallyvane.account;

import dev.tallyvane.account.internal.AuditEventRepository;
import java.time.Clock;
import java.util.List;
import org.springframework.data.domain.PageRequest;
import org.springframework.data.domain.Sort;
import org.springframework.stereotype.Service;
import org.springframework.transaction.annotation.Propagation;
import org.springframework.transaction.annotation.Transactional;

/** Writes and reads the activity log. */
@Service
public class AuditLog {

    private final AuditEventRepository events;
    private final Clock clock;

    AuditLog(AuditEventRepository events, Clock clock) {
        this.events = events;
        this.clock = clock;
    }

    /** Records an event (joins the caller's transaction, so a rolled-back action leaves no line). */
    @Transactional
    public void record(String actor, String action, String detail) {
        events.save(new AuditEvent(clock.instant(), actor, action, detail));
    }

    /** A location created or changed: logged in the changing transaction (so with it, or not at all). */
    @org.springframework.context.event.EventListener
    void locationChanged(dev.tallyvane.location.LocationChanged event) {
        record(event.actor(), event.action(), event.detail());
    }

    /** Records an event in its own transaction (sign-in failures, which roll nothing else back). */
    @Transactional(propagation = Propagation.REQUIRES_NEW)
    public void recordAlone(String actor, String action, String detail) {
        record(actor, action, detail);
    }

    @Transactional(readOnly = true)
    public List<AuditEvent> latest(int count) {
        return events.findAll(PageRequest.of(0, count, Sort.by(Sort.Direction.DESC, "at", "id"))).getContent();
    }
}

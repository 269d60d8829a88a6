package dev.tallyvane.forecasting;

import com.github.kagkarlsson.scheduler.task.CompletionHandler;
import com.github.kagkarlsson.scheduler.task.FailureHandler;
import com.github.kagkarlsson.scheduler.task.helper.CustomTask;
import com.github.kagkarlsson.scheduler.task.helper.RecurringTask;
import com.github.kagkarlsson.scheduler.task.helper.Tasks;
import com.github.kagkarlsson.scheduler.task.schedule.Schedules;
import dev.tallyvane.forecasting.internal.IssuedForecastStore;
import dev.tallyvane.forecasting.internal.SeriesStateStore;
import dev.tallyvane.intake.FiguresRecorded;
import dev.tallyvane.system.Jobs;
import java.time.Clock;
import java.time.Duration;
import java.time.Instant;
import java.time.ZoneOffset;
import java.util.List;
import org.slf4j.Logger;
import org.slf4j.LoggerFactory;
import org.springframework.beans.factory.ObjectProvider;
import org.springframework.context.annotation.Bean;
import org.springframework.context.annotation.Configuration;
import org.springframework.modulith.events.ApplicationModuleListener;
import org.springframework.stereotype.Service;
import org.springframework.transaction.event.TransactionPhase;
import org.springframework.transaction.event.TransactionalEventListener;

/**
 * The re-fit queue, on the shared job queue ({@link Jobs}).
 *
 * <ul>
 * <li>Committed figures queue a re-fit of each affected series, due after a short coalescing
 * window: many posts for one series within the window make one re-fit (one queue entry per series).
 * If figures arrive while the series is being re-fitted, the re-fit runs once more.</li>
 * <li>A nightly sweep queues every stale series (figures newer than its last fit, or a fit older
 * than a day).</li>
 * <li>Owners can queue a re-fit of one location or all at once.</li>
 * </ul>
 */
@Service
public class RefitQueue {

    private static final Logger log = LoggerFactory.getLogger(RefitQueue.class);
    static final String REFIT = "refit";

    private final SeriesStateStore state;
    private final IssuedForecastStore issued;
    private final RefitProperties properties;
    private final Clock clock;
    private final ObjectProvider<Jobs> jobs;
    private final CustomTask<Void> refitTask;

    RefitQueue(SeriesStateStore state, IssuedForecastStore issued, RefitProperties properties,
            Clock clock, ObjectProvider<Jobs> jobs, CustomTask<Void> refitTask) {
        this.state = state;
        this.issued = issued;
        this.properties = properties;
        this.clock = clock;
        this.jobs = jobs;
        this.refitTask = refitTask;
    }

    /** The tasks this feature adds to the job queue. */
    @Configuration(proxyBeanMethods = false)
    static class RefitTasks {

        @Bean
        CustomTask<Void> refitTask(RefitService refits, SeriesStateStore state, RefitProperties properties,
                ObjectProvider<Jobs> jobs) {
            return Tasks.custom(REFIT, Void.class)
                    .onFailure(new FailureHandler.MaxRetriesFailureHandler<>(3,
                            new FailureHandler.ExponentialBackoffFailureHandler<>(Duration.ofSeconds(30))))
                    .onDeadExecutionRevive()
                    .execute((instance, context) -> {
                        SeriesStateStore.SeriesKey key = SeriesStateStore.SeriesKey.parse(instance.getId());
                        RefitService.Outcome outcome = refits.refit(key.locationId(), key.measure(),
                                jobs.getObject().instanceName());
                        boolean again = state.changedSince(key, outcome.cutoff());
                        return (CompletionHandler<Void>) (complete, operations) -> {
                            if (again) {
                                operations.reschedule(complete, Instant.now().plus(properties.coalesce()));
                            } else {
                                operations.remove();
                            }
                        };
                    });
        }

        @Bean
        RecurringTask<Void> nightlySweep(RefitProperties properties, ObjectProvider<RefitQueue> queue) {
            return Tasks.recurring("nightly-sweep", Schedules.daily(ZoneOffset.UTC, properties.sweepAt()))
                    .execute((instance, context) -> log.info("nightly sweep queued {} stale series",
                            queue.getObject().queueStale()));
        }
    }

    /**
     * Figures are being committed: note the change in the same transaction (on the same connection,
     * so a post never needs a second connection while it holds one; with many posts at once that
     * would exhaust the pool).
     */
    @TransactionalEventListener(phase = TransactionPhase.BEFORE_COMMIT)
    void figuresRecording(FiguresRecorded event) {
        for (FiguresRecorded.SeriesRef ref : event.series()) {
            state.changed(new SeriesStateStore.SeriesKey(ref.locationId(), ref.measure()), event.at());
        }
    }

    /**
     * Figures were committed: queue a re-fit of each series after the coalescing window. A module
     * event: kept in the event publication registry from the posting transaction until this has
     * run, and run again at the next start should the process die first, so every committed figure
     * leads to its re-fit without waiting for the nightly sweep. Queueing is idempotent (one queue
     * entry per series), so a second delivery changes nothing.
     */
    @ApplicationModuleListener
    void figuresRecorded(FiguresRecorded event) {
        Instant due = Instant.now().plus(properties.coalesce());
        for (FiguresRecorded.SeriesRef ref : event.series()) {
            var key = new SeriesStateStore.SeriesKey(ref.locationId(), ref.measure());
            jobs.getObject().client().scheduleIfNotExists(refitTask.instance(key.instance()), due);
        }
    }

    /** Queues a re-fit now of every series of one location (or of all, when null); returns how many. */
    public int refitNow(Long locationId) {
        return dueNow(state.all(locationId));
    }

    /** Queues every stale series; returns how many. */
    public int queueStale() {
        return dueNow(state.stale(clock.instant().minus(Duration.ofHours(20))));
    }

    /** Makes a re-fit of each series due now: queued if absent, brought forward if waiting; a running one is left. */
    private int dueNow(List<SeriesStateStore.SeriesKey> keys) {
        Instant now = Instant.now();
        for (SeriesStateStore.SeriesKey key : keys) {
            var instance = refitTask.instance(key.instance());
            if (!jobs.getObject().client().scheduleIfNotExists(instance, now)) {
                try {
                    jobs.getObject().client().reschedule(instance, now);
                } catch (RuntimeException picked) {
                    // already running: it re-runs by itself if figures changed meanwhile
                }
            }
        }
        return keys.size();
    }

    /**
     * Queue progress: waiting, running, issued in the last 24 hours, series whose last re-fit failed,
     * and the newest forecast issued (its id, 0 before the first, and when), so that a page can tell
     * that a new forecast arrived.
     */
    public record Status(long queued, long running, long doneLast24h, long failing, long newestForecast,
            Instant lastIssuedAt) {

        /** Nothing waiting or running. */
        public boolean idle() {
            return queued == 0 && running == 0;
        }
    }

    /** Progress of the whole chain. */
    public Status status() {
        return status(null);
    }

    /** Progress of one location's series (all locations when null), for a token scoped to one location. */
    public Status status(Long locationId) {
        Jobs.Counts tasks = jobs.getObject().counts(REFIT, locationId == null ? null : locationId + ":");
        var newest = issued.newest(locationId);
        return new Status(tasks.waiting(), tasks.running(),
                issued.issuedSince(clock.instant().minus(Duration.ofHours(24)), locationId), state.failing(locationId),
                newest.map(java.util.Map.Entry::getKey).orElse(0L), newest.map(java.util.Map.Entry::getValue).orElse(null));
    }
}

package dev.tallyvane.system;

import com.github.kagkarlsson.scheduler.task.helper.RecurringTask;
import com.github.kagkarlsson.scheduler.task.helper.Tasks;
import com.github.kagkarlsson.scheduler.task.schedule.Schedules;
import java.time.Duration;
import org.slf4j.Logger;
import org.slf4j.LoggerFactory;
import org.springframework.beans.factory.ObjectProvider;
import org.springframework.beans.factory.annotation.Value;
import org.springframework.context.annotation.Bean;
import org.springframework.context.annotation.Configuration;
import org.springframework.modulith.events.IncompleteEventPublications;

/**
 * Module events whose listener failed (the database busy for a moment, a lock timeout) are handed
 * to it again by a recurring job, once they are older than {@code tallyvane.events.resubmit-after}
 * (default 5 minutes), so a passing fault does not leave a figure waiting for its re-fit until the
 * next start or the nightly sweep. Every listener is idempotent, so a publication still being
 * handled elsewhere at that moment costs a repeat, not a wrong result. Runs on the shared job queue:
 * once per interval across the cluster.
 */
@Configuration(proxyBeanMethods = false)
class ModuleEvents {

    private static final Logger log = LoggerFactory.getLogger(ModuleEvents.class);

    @Bean
    RecurringTask<Void> eventResubmission(ObjectProvider<IncompleteEventPublications> incomplete,
            @Value("${tallyvane.events.resubmit-after:5m}") Duration after) {
        return Tasks.recurring("event-resubmission", Schedules.fixedDelay(after)).execute((instance, context) -> {
            incomplete.getObject().resubmitIncompletePublicationsOlderThan(after);
            log.debug("resubmitted module events older than {}", after);
        });
    }
}

package dev.tallyvane.summary;

import com.github.kagkarlsson.scheduler.task.FailureHandler;
import com.github.kagkarlsson.scheduler.task.helper.OneTimeTask;
import com.github.kagkarlsson.scheduler.task.helper.RecurringTask;
import com.github.kagkarlsson.scheduler.task.helper.Tasks;
import com.github.kagkarlsson.scheduler.task.schedule.Schedules;
import dev.tallyvane.account.UserService;
import dev.tallyvane.system.Jobs;
import java.sql.Timestamp;
import java.time.Clock;
import java.time.DayOfWeek;
import java.time.Instant;
import java.time.LocalDate;
import java.time.ZoneId;
import java.time.temporal.TemporalAdjusters;
import java.util.List;
import java.util.Locale;
import java.util.UUID;
import org.slf4j.Logger;
import org.slf4j.LoggerFactory;
import org.springframework.beans.factory.ObjectProvider;
import org.springframework.context.annotation.Bean;
import org.springframework.context.annotation.Configuration;
import org.springframework.jdbc.core.JdbcTemplate;
import org.springframework.stereotype.Service;
import org.springframework.transaction.annotation.Propagation;
import org.springframework.transaction.annotation.Transactional;

/**
 * The weekly summary: once a week (cluster-wide, on the job queue) a send is recorded for every
 * recipient and week (unique, so a second run adds nothing); each send is its own job, retried
 * with back-off on an SMTP failure and logged; it is sent at most once (a sent row is never sent
 * again).
 */
@Service
public class SummaryService {

    private static final Logger log = LoggerFactory.getLogger(SummaryService.class);
    static final String SEND = "summary-send";

    private final SummaryBuilder builder;
    private final SummaryMail mail;
    private final UnsubscribeLinks links;
    private final UserService users;
    private final SummaryProperties properties;
    private final JdbcTemplate jdbc;
    private final Clock clock;
    private final ObjectProvider<Jobs> jobs;
    private final ObjectProvider<OneTimeTask<Long>> sendTask;
    private final ObjectProvider<SummaryService> self;

    SummaryService(SummaryBuilder builder, SummaryMail mail, UnsubscribeLinks links, UserService users,
            SummaryProperties properties, JdbcTemplate jdbc, Clock clock, ObjectProvider<Jobs> jobs,
            ObjectProvider<OneTimeTask<Long>> sendTask, ObjectProvider<SummaryService> self) {
        this.builder = builder;
        this.mail = mail;
        this.links = links;
        this.users = users;
        this.properties = properties;
        this.jdbc = jdbc;
        this.clock = clock;
        this.jobs = jobs;
        this.sendTask = sendTask;
        this.self = self;
    }

    /** The tasks this feature adds to the job queue. */
    @Configuration(proxyBeanMethods = false)
    static class SummaryTasks {

        @Bean
        RecurringTask<Void> weeklySummary(SummaryProperties properties, ObjectProvider<SummaryService> summaries) {
            String cron = String.format(Locale.ROOT, "0 %d %d * * %s", properties.time().getMinute(),
                    properties.time().getHour(), properties.day().name().substring(0, 3));
            return Tasks.recurring("weekly-summary", Schedules.cron(cron, zone(properties)))
                    .execute((instance, context) -> {
                        SummaryService s = summaries.getObject();
                        log.info("weekly summary: {} e-mails planned", s.plan(s.lastCompletedWeek()));
                    });
        }

        @Bean
        OneTimeTask<Long> summarySend(SummaryProperties properties, ObjectProvider<SummaryService> summaries) {
            return Tasks.oneTime(SEND, Long.class)
                    .onFailure(new FailureHandler.MaxRetriesFailureHandler<>(properties.maxAttempts(),
                            new FailureHandler.ExponentialBackoffFailureHandler<>(properties.retryDelay()),
                            (complete, operations) -> {
                                summaries.getObject().givenUp((Long) complete.getExecution().taskInstance.getData());
                                operations.stop();
                            }))
                    .execute((instance, context) -> summaries.getObject().sendOnce(instance.getData()));
        }
    }

    static ZoneId zone(SummaryProperties properties) {
        return ZoneId.of(properties.zone() == null || properties.zone().isBlank() ? "UTC" : properties.zone());
    }

    /** Monday of the last week that has ended, in the business's time zone. */
    public LocalDate lastCompletedWeek() {
        LocalDate today = LocalDate.now(clock.withZone(zone(properties)));
        return today.with(TemporalAdjusters.previousOrSame(DayOfWeek.MONDAY)).minusWeeks(1);
    }

    /** Records a send for every recipient of the week (at most one each) and queues the new ones; returns how many. */
    @Transactional
    public int plan(LocalDate weekStart) {
        int planned = 0;
        for (UserService.Recipient r : users.weeklyRecipients()) {
            Long id = insert(weekStart, r, "WEEKLY", "weekly:" + weekStart + ":" + r.id());
            if (id != null) {
                // in this transaction: a worker must not pick the send before its row is committed
                jobs.getObject().transactionalClient().scheduleIfNotExists(sendTask.getObject().instance("send-" + id, id),
                        Instant.now());
                planned++;
            }
        }
        return planned;
    }

    /** Records a send unless one with the same key exists (then null): no error, so the transaction goes on. */
    private Long insert(LocalDate week, UserService.Recipient r, String kind, String dedupe) {
        int inserted = jdbc.update("insert into summary_send (week_start, user_id, email, kind, status, created_at, "
                + "dedupe_key) values (?, ?, ?, ?, 'PENDING', ?, ?) on conflict do nothing", week, r.id(), r.email(), kind,
                Timestamp.from(clock.instant()), dedupe);
        return inserted == 0 ? null
                : jdbc.queryForObject("select id from summary_send where dedupe_key = ?", Long.class, dedupe);
    }

    /** Sends one recorded e-mail unless it was sent already; on failure notes the attempt and throws (to be retried). */
    void sendOnce(long sendId) {
        try {
            self.getObject().deliver(sendId);
        } catch (RuntimeException e) {
            self.getObject().attemptFailed(sendId, e);
            throw e;
        }
    }

    /** A send row. */
    public record Send(long id, LocalDate weekStart, long userId, String email, String kind, String status, int attempts,
            String lastError, Instant createdAt, Instant sentAt) {
    }

    @Transactional
    public void deliver(long sendId) {
        List<Send> rows = jdbc.query("select id, week_start, user_id, email, kind, status, attempts, last_error, created_at, "
                + "sent_at from summary_send where id = ? for update", this::send, sendId);
        if (rows.isEmpty() || !rows.get(0).status().equals("PENDING")) {
            return;
        }
        Send s = rows.get(0);
        WeeklySummary summary = builder.build(s.weekStart(), zone(properties));
        if (!summary.hasFigures() && properties.skipEmptyWeeks() && s.kind().equals("WEEKLY")) {
            jdbc.update("update summary_send set status = 'SKIPPED' where id = ?", sendId);
            return;
        }
        String name = users.all().stream().filter(u -> u.getId() == s.userId()).map(u -> u.getDisplayName()).findFirst()
                .orElse("");
        String unsubscribe = unsubscribeUrl(s.userId());
        SummaryMail.Rendered rendered = mail.render(summary, name, unsubscribe, "cid:chart");
        try {
            mail.send(s.email(), rendered, unsubscribe);
        } catch (jakarta.mail.MessagingException e) {
            throw new IllegalStateException("the message could not be built: " + e.getMessage(), e);
        }
        jdbc.update("update summary_send set status = 'SENT', attempts = attempts + 1, sent_at = ?, last_error = null "
                + "where id = ?", Timestamp.from(clock.instant()), sendId);
    }

    @Transactional(propagation = Propagation.REQUIRES_NEW)
    public void attemptFailed(long sendId, RuntimeException e) {
        String message = String.valueOf(e.getMessage());
        jdbc.update("update summary_send set attempts = attempts + 1, last_error = ? where id = ?",
                message.length() > 500 ? message.substring(0, 500) : message, sendId);
        log.warn("weekly summary #{} not sent: {}", sendId, message);
    }

    @Transactional
    public void givenUp(long sendId) {
        jdbc.update("update summary_send set status = 'FAILED' where id = ? and status = 'PENDING'", sendId);
    }

    /** Sends this week's summary to one user now ("send me a test e-mail"), logged as a test. */
    public Send sendTest(String username) {
        UserService.Recipient r = users.recipient(username).filter(x -> x.email() != null)
                .orElseThrow(() -> new dev.tallyvane.system.InvalidRequest("email", "your account has no e-mail address"));
        Long id = self.getObject().insertTest(lastCompletedWeek(), r);
        sendOnce(id);
        return log(1).get(0);
    }

    @Transactional
    public Long insertTest(LocalDate week, UserService.Recipient r) {
        return insert(week, r, "TEST", "test:" + UUID.randomUUID());
    }

    /** The exact HTML of a week's e-mail as the given user would get it, with the chart at {@code chartUrl}. */
    @Transactional(readOnly = true)
    public String preview(LocalDate weekStart, String username, String chartUrl) {
        UserService.Recipient r = users.recipient(username).orElseThrow();
        return mail.render(builder.build(weekStart, zone(properties)), r.displayName(), unsubscribeUrl(r.id()), chartUrl)
                .html();
    }

    @Transactional(readOnly = true)
    public byte[] chart(LocalDate weekStart) {
        return SummaryChart.png(builder.build(weekStart, zone(properties)).chart());
    }

    @Transactional(readOnly = true)
    public List<Send> log(int limit) {
        return jdbc.query("select id, week_start, user_id, email, kind, status, attempts, last_error, created_at, sent_at "
                + "from summary_send order by created_at desc, id desc fetch first " + limit + " rows only", this::send);
    }

    private Send send(java.sql.ResultSet rs, int i) throws java.sql.SQLException {
        return new Send(rs.getLong(1), rs.getObject(2, LocalDate.class), rs.getLong(3), rs.getString(4), rs.getString(5),
                rs.getString(6), rs.getInt(7), rs.getString(8), rs.getTimestamp(9).toInstant(),
                rs.getTimestamp(10) == null ? null : rs.getTimestamp(10).toInstant());
    }

    String unsubscribeUrl(long userId) {
        return properties.dashboardUrl() + "/email/unsubscribe?u=" + userId + "&t=" + links.token(userId);
    }

    /** Applies a signed unsubscribe link; false when the signature does not match. */
    public boolean unsubscribe(long userId, String token) {
        if (!links.valid(userId, token)) {
            return false;
        }
        users.weeklyEmail(userId, false, "unsubscribe link");
        return true;
    }
}

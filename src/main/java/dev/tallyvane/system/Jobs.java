package dev.tallyvane.system;

import com.github.kagkarlsson.scheduler.Scheduler;
import com.github.kagkarlsson.scheduler.SchedulerClient;
import com.github.kagkarlsson.scheduler.SchedulerName;
import com.github.kagkarlsson.scheduler.task.helper.RecurringTask;
import com.github.kagkarlsson.scheduler.task.Task;
import java.util.List;
import javax.sql.DataSource;
import org.springframework.jdbc.datasource.TransactionAwareDataSourceProxy;
import org.springframework.context.SmartLifecycle;
import org.springframework.stereotype.Component;

/**
 * The background job queue, shared by every instance through the database table
 * {@code scheduled_tasks} (db-scheduler): each due job is picked by exactly one instance; an
 * instance that stops sending heartbeats has its picked jobs revived elsewhere; recurring jobs run
 * once per due time across the cluster. Features contribute their tasks as beans.
 */
@Component
public class Jobs implements SmartLifecycle {

    private final DataSource dataSource;
    private final List<Task<?>> tasks;
    private final JobsProperties properties;
    private final SchedulerClient client;
    private final SchedulerClient transactionalClient;
    private Scheduler scheduler;
    private final boolean autoStart;

    Jobs(DataSource dataSource, List<Task<?>> tasks, JobsProperties properties,
            @org.springframework.beans.factory.annotation.Value("${tallyvane.jobs.start:true}") boolean autoStart) {
        this.autoStart = autoStart;
        this.dataSource = dataSource;
        this.tasks = List.copyOf(tasks);
        this.properties = properties;
        // the client queues work whether or not this instance's worker pool is running
        this.client = SchedulerClient.Builder.create(dataSource, this.tasks).build();
        // db-scheduler leaves a connection whose auto-commit is off to its owner, so through this proxy a job
        // queued inside a Spring transaction is written (and becomes visible to the workers) with it
        this.transactionalClient = SchedulerClient.Builder.create(new TransactionAwareDataSourceProxy(dataSource),
                this.tasks).build();
    }

    /** Queues and reschedules jobs at once, on a connection of its own. */
    public SchedulerClient client() {
        return client;
    }

    /**
     * Queues jobs as part of the caller's transaction (outside one it behaves like {@link #client()}):
     * a job about rows the transaction writes can neither run before they are committed nor outlive
     * their rollback. For new, uniquely named instances only: a failed statement would abort the
     * caller's transaction on PostgreSQL.
     */
    public SchedulerClient transactionalClient() {
        return transactionalClient;
    }

    /** How many jobs of a task wait (not picked) and run (picked), of instances whose id starts with {@code prefix} (all when null). */
    public record Counts(long waiting, long running) {
    }

    public Counts counts(String taskName, String instancePrefix) {
        String where = "task_name = ?" + (instancePrefix == null ? "" : " and task_instance like ?");
        Object[] args = instancePrefix == null ? new Object[] {taskName}
                : new Object[] {taskName, instancePrefix + "%"}; // prefixes such as "12:" hold no wildcard
        return new org.springframework.jdbc.core.JdbcTemplate(dataSource).queryForObject("select "
                + "coalesce(sum(case when picked then 0 else 1 end), 0), coalesce(sum(case when picked then 1 else 0 end), 0) "
                + "from scheduled_tasks where " + where, (rs, i) -> new Counts(rs.getLong(1), rs.getLong(2)), args);
    }

    public String instanceName() {
        return properties.instanceName();
    }

    /** Starts this instance's worker pool (a fresh one each time: a stopped db-scheduler cannot restart). */
    @Override
    @SuppressWarnings({"unchecked", "rawtypes"})
    public synchronized void start() {
        if (scheduler == null) {
            // recurring tasks schedule themselves at start (one-time tasks also implement OnStartup: not those)
            List recurring = tasks.stream().filter(t -> t instanceof RecurringTask).toList();
            List<Task<?>> others = tasks.stream().filter(t -> !(t instanceof RecurringTask)).toList();
            scheduler = Scheduler.create(dataSource, others).startTasks(recurring)
                    .schedulerName(new SchedulerName.Fixed(properties.instanceName()))
                    .threads(properties.threads()).pollingInterval(properties.pollingInterval())
                    .heartbeatInterval(properties.heartbeat()).enableImmediateExecution().build();
            scheduler.start();
        }
    }

    /** False for a one-off command run against the database (no worker pool then; queueing still works). */
    @Override
    public boolean isAutoStartup() {
        return autoStart;
    }

    @Override
    public synchronized void stop() {
        if (scheduler != null) {
            scheduler.stop();
            scheduler = null;
        }
    }

    @Override
    public synchronized boolean isRunning() {
        return scheduler != null;
    }
}

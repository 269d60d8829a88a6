-- At most one current value per figure, enforced by the database (PostgreSQL partial index).
create unique index uq_figure_current on figure_revision (location_id, measure, granularity, period_start)
    where superseded_at is null;

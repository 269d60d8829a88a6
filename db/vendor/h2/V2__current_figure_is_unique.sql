-- H2 has no partial indexes: at most one current value per figure is guaranteed by the intake
-- service, which writes a location's figures only while holding that location's row lock.
create index ix_figure_current on figure_revision (location_id, measure, granularity, period_start, superseded_at);

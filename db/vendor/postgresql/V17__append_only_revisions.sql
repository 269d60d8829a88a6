-- Revisions become append-only: a correction no longer updates the old row (superseded_at) but
-- only inserts the new one, numbered one past the value it replaces. The current value of a figure
-- is its highest revision_no; "as of T" is the highest revision_no recorded at or before T; a
-- revision was replaced when the next one was recorded. The unique index keeps the numbering
-- linear (two writers replacing the same value cannot both succeed) and serves every series read.
-- Measured in docs/benchmarks.md: a 100,000-figure correction was an update of 100,000 rows plus
-- an insert of 100,000; now it is the insert alone.
--
-- The foreign key from a figure to its location goes (on PostgreSQL; the embedded H2 keeps it): it is
-- checked by a trigger row by row, a third of the time of writing 100,000 figures (COPY 0.78 s with
-- it, 0.45 s without, on the benchmark machine). What it guarded is kept otherwise: figures are
-- written only for locations the intake has just read and locked (select … for update in the same
-- transaction), and locations are closed, never deleted.
alter table figure_revision add column revision_no integer;

update figure_revision f set revision_no = r.n
from (select id, row_number() over (partition by location_id, measure, granularity, period_start
                                    order by recorded_at, id) as n
      from figure_revision) r
where r.id = f.id;

alter table figure_revision alter column revision_no set not null;
drop index uq_figure_current;
drop index ix_figure_series;
alter table figure_revision drop column superseded_at;
create unique index uq_figure_revision on figure_revision (location_id, measure, granularity, period_start, revision_no);
alter table figure_revision drop constraint figure_revision_location_id_fkey;

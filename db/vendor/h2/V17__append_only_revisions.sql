-- Revisions become append-only: a correction no longer updates the old row (superseded_at) but
-- only inserts the new one, numbered one past the value it replaces. The current value of a figure
-- is its highest revision_no; "as of T" is the highest revision_no recorded at or before T; a
-- revision was replaced when the next one was recorded. The unique index keeps the numbering
-- linear (two writers replacing the same value cannot both succeed) and serves every series read.
-- (On PostgreSQL the figure's foreign key to its location goes too, for speed; here it stays.)
alter table figure_revision add column revision_no integer;

merge into figure_revision f
using (select id, row_number() over (partition by location_id, measure, granularity, period_start
                                     order by recorded_at, id) as n
       from figure_revision) r
on f.id = r.id
when matched then update set revision_no = r.n;

alter table figure_revision alter column revision_no set not null;
drop index ix_figure_current;
drop index ix_figure_series;
alter table figure_revision drop column superseded_at;
create unique index uq_figure_revision on figure_revision (location_id, measure, granularity, period_start, revision_no);

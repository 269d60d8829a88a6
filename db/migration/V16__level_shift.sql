-- A level shift the drift watch found in a series' forecast errors (a sustained run on one side), owned by
-- forecasting: each re-fit tries starting the models there against the whole history, out of sample, and
-- keeps what the trial found so the drift flag can say what the service did. One per series (the newest).
create table level_shift (
    location_id  bigint       not null references location (id),
    measure      varchar(40)  not null,
    from_day     date         not null,
    detected_at  timestamp with time zone not null,
    tried_at     timestamp with time zone,
    origins      integer,
    full_mae     double precision,
    after_mae    double precision,
    primary key (location_id, measure)
);

-- One drift flag per episode and series: the signals that fired are kept as detail beside the lead one.
alter table drift_flag add column signals varchar(600);
update drift_flag set cleared_at = raised_at
 where cleared_at is null
   and exists (select 1 from drift_flag o where o.location_id = drift_flag.location_id and o.measure = drift_flag.measure
                 and o.cleared_at is null and o.id < drift_flag.id);

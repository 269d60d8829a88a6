-- What the overview shows per series without reading its history: the newest one-step-ahead
-- score and the recent absolute percentage errors. Rewritten whenever the series is scored.
create table accuracy_glance (
    location_id    bigint           not null references location (id),
    measure        varchar(40)      not null,
    granularity    varchar(8)       not null,
    last_period    date             not null,
    last_actual    double precision not null,
    last_forecast  double precision not null,
    -- up to 12 absolute percentage errors, oldest first, comma-separated; empty where the actual was 0
    recent_ape     varchar(400)     not null,
    updated_at     timestamp with time zone not null,
    primary key (location_id, measure)
);

-- The newest fit of each series: its data with the chosen model's fitted values (the location
-- page's chart). Replaced each time a forecast is issued; issued forecasts themselves are kept.
create table series_fit (
    location_id   bigint      not null references location (id),
    measure       varchar(40) not null,
    issued_id     bigint      not null references issued_forecast (id),
    history_json  text        not null,
    primary key (location_id, measure)
);

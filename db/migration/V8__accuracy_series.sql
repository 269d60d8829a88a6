-- One row per scored series: the accuracy module locks it while it scores the series, so two
-- listeners (figures recorded, forecast issued) never score the same points twice at once.
create table accuracy_series (
    location_id  bigint      not null references location (id),
    measure      varchar(40) not null,
    primary key (location_id, measure)
);

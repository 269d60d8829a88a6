-- The owner's mark that a series' sales changed for good from a day on (a new competitor, a rebuilt shop):
-- re-fits start the models from that day when enough figures follow it. One mark per series; removing it is
-- in the activity log.
create table series_break (
    location_id  bigint       not null references location (id),
    measure      varchar(40)  not null,
    from_day     date         not null,
    marked_by    varchar(120) not null,
    marked_at    timestamp with time zone not null,
    primary key (location_id, measure)
);

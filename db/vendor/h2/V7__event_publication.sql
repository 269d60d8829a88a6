-- Spring Modulith's event publication registry (its JDBC schema v2 for H2, release 2.0.3), with a
-- wider serialized_event: an upload touching many series publishes one event naming them all. A
-- module event is written here in the transaction that publishes it, one row per listener, and
-- completed (deleted) when the listener succeeded; rows left incomplete by a crash are resubmitted at start.
create table event_publication (
    id                     uuid not null,
    completion_date        timestamp(9) with time zone,
    event_type             varchar(512) not null,
    listener_id            varchar(512) not null,
    publication_date       timestamp(9) with time zone not null,
    serialized_event       varchar(1000000) not null,
    status                 varchar(20),
    completion_attempts    int,
    last_resubmission_date timestamp(9) with time zone,
    primary key (id)
);
create index event_publication_by_listener_id_idx on event_publication (listener_id);
create index event_publication_by_completion_date_idx on event_publication (completion_date);

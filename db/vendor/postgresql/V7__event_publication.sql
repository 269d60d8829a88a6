-- Spring Modulith's event publication registry (its JDBC schema v2 for PostgreSQL, release 2.0.3):
-- a module event is written here in the transaction that publishes it, one row per listener, and
-- completed (deleted, see spring.modulith.events.completion-mode) when the listener succeeded; rows
-- left incomplete by a crash are resubmitted at start.
create table event_publication (
    id                     uuid not null,
    listener_id            text not null,
    event_type             text not null,
    serialized_event       text not null,
    publication_date       timestamp with time zone not null,
    completion_date        timestamp with time zone,
    status                 text,
    completion_attempts    int,
    last_resubmission_date timestamp with time zone,
    primary key (id)
);
create index event_publication_serialized_event_hash_idx on event_publication using hash (serialized_event);
create index event_publication_by_completion_date_idx on event_publication (completion_date);

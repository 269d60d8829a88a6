-- The one-time setup of the first owner may happen once: the single row of this table is its
-- proof. Concurrent setups insert the same key; the database lets one commit and refuses the
-- others (a check-then-insert in the application could not).
create table first_run_setup (
    id        smallint primary key,
    done_at   timestamp with time zone not null,
    constraint ck_first_run_single check (id = 1)
);

-- databases that already have users are set up
insert into first_run_setup (id, done_at)
select 1, current_timestamp from app_user having count(*) > 0;

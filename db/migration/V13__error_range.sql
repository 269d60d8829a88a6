-- The 80% range each scored forecast point carried, kept beside its error: the chain total reads
-- the locations' past errors relative to the range they were forecast with (how much they moved
-- together), without reading the forecasting module's tables. Earlier scores get theirs from the
-- forecast they scored.
alter table forecast_error add column lo80 double precision;
alter table forecast_error add column hi80 double precision;
update forecast_error set
    lo80 = (select p.lo80 from issued_forecast_point p where p.issued_id = forecast_error.issued_id and p.step = forecast_error.step),
    hi80 = (select p.hi80 from issued_forecast_point p where p.issued_id = forecast_error.issued_id and p.step = forecast_error.step);
create index ix_error_chain on forecast_error (measure, granularity, step, period_start);

-- The day a location closed: no forecasts are issued for it afterwards (its history is kept), and
-- figures for periods up to that day are still accepted (a bookkeeper's late month-end figures).
alter table location add column closed_on date;

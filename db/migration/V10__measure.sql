-- The measures a chain keeps (net_sales by default; the owner declares others, e.g. transactions).
-- Figures naming an undeclared measure are refused with the nearest declared name suggested.
create table measure (
    name        varchar(40)  not null primary key,
    description varchar(200) not null,
    declared_at timestamp with time zone not null,
    declared_by varchar(120) not null
);
insert into measure (name, description, declared_at, declared_by)
    values ('net_sales', 'sales after discounts and refunds, before tax', current_timestamp, 'tallyvane');
-- measures already in use before declarations existed stay usable
insert into measure (name, description, declared_at, declared_by)
    select distinct measure, 'in use before measures were declared', current_timestamp, 'tallyvane'
    from figure_revision where measure <> 'net_sales';

-- Why a figure was corrected by hand in the browser (null for figures from uploads, the API or the demo).
alter table figure_revision add column note varchar(500);

-- Imported sessions waiting for their rollup contributions (#8), found and marked in (day, id) order without a sort:
-- the sessionizer reads the next pending rows of a site through this index and marks a whole (day, id) range rolled
-- up with one UPDATE. It replaces the (site_id, rolled_up) index, which left an ORDER BY to sort every pending row of
-- the site for each chunk.
CREATE INDEX session_fact_pending_idx ON session_fact (site_id, rolled_up, origin, local_day, id);
DROP INDEX session_fact_rollup_idx;

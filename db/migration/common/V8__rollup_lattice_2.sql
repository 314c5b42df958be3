-- Issue #3: lattice 2 of the rollups adds views (sessions/Cuboid.java, docs/architecture.md). Sites that already
-- have rollups are marked here; on startup RollupFill fills the new views from the stored sessions, one local day
-- at a time, and records the first day from which they hold every session (days whose sessions retention has
-- already deleted stay unfilled, and questions reaching back to them keep reading the older views). Until a site's
-- row says 'done', no question reads that site's new views. Sites created later have no row: all views are theirs.
CREATE TABLE rollup_fill (
    site_id       BIGINT                   NOT NULL REFERENCES site (id) ON DELETE CASCADE,
    lattice       SMALLINT                 NOT NULL,
    state         VARCHAR(8)               NOT NULL,
    complete_from DATE,
    filled_at     TIMESTAMP WITH TIME ZONE,
    PRIMARY KEY (site_id, lattice)
);

INSERT INTO rollup_fill (site_id, lattice, state)
SELECT s.id, 2, 'pending' FROM site s WHERE EXISTS (SELECT 1 FROM rollup_session r WHERE r.site_id = s.id);

-- Issue #3: lattice 3 of the rollups adds weekly twins of the large views that the entry-page and ad-density answers
-- read (sessions/Cuboid.java, docs/architecture.md): the same dimensions, one cell per Monday-to-Sunday week of the
-- site's local days. Sites that already have rollups are marked here, as V8 did for lattice 2; RollupFill fills the
-- twins a week at a time on startup, and until a site's row says 'done' questions read the daily views only.
INSERT INTO rollup_fill (site_id, lattice, state)
SELECT s.id, 3, 'pending' FROM site s WHERE EXISTS (SELECT 1 FROM rollup_session r WHERE r.site_id = s.id);

-- Issue #3: weekly twins of the rollup views (sessions/Cuboid.java, docs/architecture.md). Their rows live in
-- rollup_session and rollup_page under new view ids, one cell per Monday-to-Sunday week stored under the Monday.
-- A week's twins are built from its daily rows once the week is over (sessions/WeeklyViews.java); this table records
-- the Monday of the last built week of each site. Existing sites have no row: their past weeks are built by the
-- sessionizer's next run, and until then questions read the daily views only.
CREATE TABLE rollup_week (
    site_id       BIGINT NOT NULL PRIMARY KEY REFERENCES site (id) ON DELETE CASCADE,
    built_through DATE   NOT NULL
);

package com.example.foldline.sessions;

import static org.assertj.core.api.Assertions.assertThat;

import java.sql.Connection;
import java.sql.DriverManager;
import java.sql.ResultSet;
import java.sql.Statement;
import java.util.ArrayList;
import java.util.List;
import java.util.UUID;

import org.flywaydb.core.Flyway;
import org.junit.jupiter.api.Test;

/**
 * Issue #3: a database migrated before lattice 2 (V6, with rollups) gets its sites marked for filling the new views
 * by V8; a site without rollups is not marked. V9 adds the record of built weekly views, empty: the sessionizer's
 * next run builds them. The fill itself is tested on H2 and PostgreSQL in MetricsApiContract
 * (rollupsOfTheOldLatticeGetTheNewViewsFilled).
 */
class RollupLatticeMigrationTests {

    @Test
    void v8MarksSitesThatHaveRollupsAndV9LeavesTheirWeeksToBeBuilt() throws Exception {
        String url = "jdbc:h2:mem:" + UUID.randomUUID() + ";MODE=PostgreSQL;DATABASE_TO_LOWER=TRUE;"
                + "CASE_INSENSITIVE_IDENTIFIERS=TRUE;DEFAULT_NULL_ORDERING=HIGH;NON_KEYWORDS=VALUE,KEY;DB_CLOSE_DELAY=-1";
        try (Connection keep = DriverManager.getConnection(url, "sa", "")) {
            Flyway.configure().dataSource(url, "sa", "").locations("classpath:db/migration/common").target("6").load()
                    .migrate();
            try (Statement s = keep.createStatement()) {
                s.execute("INSERT INTO site (id, name, domain, timezone, currency) VALUES "
                        + "(1, 'Old', 'old.example', 'UTC', 'EUR'), (2, 'Empty', 'empty.example', 'UTC', 'EUR')");
                s.execute("""
                        INSERT INTO rollup_session (site_id, cuboid, local_day, local_hour, device, source, browser,
                               variant, country, region, entry_ads, pages, entry_path, sessions, bounces, pageviews,
                               pageviews_sq, engaged_ms, engaged_sq, revenue_micros, revenue_sq, entry_ads_sum,
                               impressions, viewable_impressions, clicks)
                        VALUES (1, 0, DATE '2026-10-20', -1, '', '', '', '', '', '', -1, -1, '', 1, 1, 1, 1, 0, 0, 0, 0,
                                0, 0, 0, 0)""");
            }
            Flyway.configure().dataSource(url, "sa", "").locations("classpath:db/migration/common").load().migrate();
            List<String> marked = new ArrayList<>();
            try (Statement s = keep.createStatement();
                 ResultSet rs = s.executeQuery("SELECT site_id, lattice, state FROM rollup_fill ORDER BY site_id, lattice")) {
                while (rs.next()) {
                    marked.add(rs.getLong(1) + "/" + rs.getInt(2) + "/" + rs.getString(3));
                }
            }
            assertThat(marked).containsExactly("1/2/pending");
            try (Statement s = keep.createStatement();
                 ResultSet rs = s.executeQuery("SELECT COUNT(*) FROM rollup_week")) {
                rs.next();
                assertThat(rs.getInt(1)).isZero();
            }
        }
    }
}

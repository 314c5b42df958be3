package com.example.foldline.ingest;

import java.sql.PreparedStatement;
import java.sql.SQLException;
import java.sql.Timestamp;
import java.sql.Types;
import java.time.Instant;
import java.time.ZonedDateTime;
import java.util.List;

import org.springframework.jdbc.core.JdbcTemplate;
import org.springframework.jdbc.support.GeneratedKeyHolder;
import org.springframework.stereotype.Repository;

import com.example.foldline.sites.Site;

/**
 * Batched, idempotent writes of validated events. Each insert skips a row whose (site, id) is already stored and
 * reports how many rows were new, so a retried batch is counted as duplicates instead of stored twice.
 */
@Repository
class EventWriter {

    private final JdbcTemplate jdbc;

    EventWriter(JdbcTemplate jdbc) {
        this.jdbc = jdbc;
    }

    /** Opens the request's batch: its id marks every row the request writes, for the sessionizer. */
    long openBatch(Site site) {
        GeneratedKeyHolder keys = new GeneratedKeyHolder();
        jdbc.update(c -> {
            PreparedStatement ps = c.prepareStatement("INSERT INTO ingest_batch (site_id) VALUES (?)", new String[]{"id"});
            ps.setLong(1, site.id());
            return ps;
        }, keys);
        return keys.getKey().longValue();
    }

    /** Records the newest pageview time of the batch (sessions close against it). */
    void closeBatch(long batch, Instant newest) {
        jdbc.update("UPDATE ingest_batch SET newest_ts = ? WHERE id = ?", newest == null ? null : Timestamp.from(newest),
                batch);
    }

    int pageviews(Site site, long batch, List<Event.Pageview> rows, Instant receivedAt) {
        Timestamp received = Timestamp.from(receivedAt);
        int[][] counts = jdbc.batchUpdate("""
                        INSERT INTO pageview (site_id, id, ts, visitor, client_session, path, referrer, source, device,
                                              browser, os, country, region, variant, ads, engaged_ms, received_at,
                                              ingest_batch)
                        VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)
                        ON CONFLICT DO NOTHING""", rows, rows.size(), (ps, e) -> {
                    ps.setLong(1, site.id());
                    ps.setString(2, e.id());
                    ps.setTimestamp(3, Timestamp.from(e.ts()));
                    ps.setString(4, e.visitor());
                    ps.setString(5, e.clientSession());
                    ps.setString(6, e.path());
                    ps.setString(7, e.referrer());
                    segment(ps, 8, e.segment());
                    ps.setInt(15, e.ads());
                    setLong(ps, 16, e.engagedMs());
                    ps.setTimestamp(17, received);
                    ps.setLong(18, batch);
                });
        return stored(counts);
    }

    /** A page-end inserts, or raises the stored engaged time; an equal or smaller repeat changes nothing. */
    int pageEnds(Site site, long batch, List<Event.PageEnd> rows, Instant receivedAt) {
        Timestamp received = Timestamp.from(receivedAt);
        int[][] counts = jdbc.batchUpdate("""
                        MERGE INTO page_end t
                        USING (VALUES (CAST(? AS BIGINT), CAST(? AS VARCHAR(64)), CAST(? AS BIGINT), CAST(? AS SMALLINT),
                                       CAST(? AS TIMESTAMP WITH TIME ZONE), CAST(? AS BIGINT)))
                              AS s (site_id, pageview_id, engaged_ms, scroll_pct, received_at, ingest_batch)
                        ON t.site_id = s.site_id AND t.pageview_id = s.pageview_id
                        WHEN MATCHED AND s.engaged_ms > t.engaged_ms THEN
                            UPDATE SET engaged_ms = s.engaged_ms, scroll_pct = s.scroll_pct, received_at = s.received_at,
                                       ingest_batch = s.ingest_batch
                        WHEN NOT MATCHED THEN
                            INSERT (site_id, pageview_id, engaged_ms, scroll_pct, received_at, ingest_batch)
                            VALUES (s.site_id, s.pageview_id, s.engaged_ms, s.scroll_pct, s.received_at,
                                    s.ingest_batch)""",
                rows, rows.size(), (ps, e) -> {
                    ps.setLong(1, site.id());
                    ps.setString(2, e.pageview());
                    ps.setLong(3, e.engagedMs());
                    if (e.scrollPct() == null) {
                        ps.setNull(4, Types.SMALLINT);
                    } else {
                        ps.setInt(4, e.scrollPct());
                    }
                    ps.setTimestamp(5, received);
                    ps.setLong(6, batch);
                });
        return stored(counts);
    }

    /**
     * An impression inserts; a repeat of the same id only raises it (not viewable to viewable, not clicked to clicked,
     * more revenue), as the tag re-sends a slot that became viewable after the page was first hidden. A repeat that
     * raises nothing is a duplicate.
     */
    int impressions(Site site, long batch, List<Event.Impression> rows, Instant receivedAt) {
        Timestamp received = Timestamp.from(receivedAt);
        int[][] counts = jdbc.batchUpdate("""
                        MERGE INTO impression t
                        USING (VALUES (CAST(? AS BIGINT), CAST(? AS VARCHAR(64)), CAST(? AS VARCHAR(64)),
                                       CAST(? AS VARCHAR(64)), CAST(? AS VARCHAR(11)), CAST(? AS BOOLEAN),
                                       CAST(? AS BOOLEAN), CAST(? AS BIGINT), CAST(? AS BIGINT),
                                       CAST(? AS TIMESTAMP WITH TIME ZONE), CAST(? AS BIGINT)))
                              AS s (site_id, id, pageview_id, slot, size, viewable, clicked, revenue_micros, cpm_micros,
                                    received_at, ingest_batch)
                        ON t.site_id = s.site_id AND t.id = s.id
                        WHEN MATCHED AND ((s.viewable AND NOT t.viewable) OR (s.clicked AND NOT t.clicked)
                                          OR s.revenue_micros > t.revenue_micros) THEN
                            UPDATE SET viewable = (t.viewable OR s.viewable), clicked = (t.clicked OR s.clicked),
                                       revenue_micros = GREATEST(t.revenue_micros, s.revenue_micros),
                                       cpm_micros = COALESCE(s.cpm_micros, t.cpm_micros),
                                       received_at = s.received_at, ingest_batch = s.ingest_batch
                        WHEN NOT MATCHED THEN
                            INSERT (site_id, id, pageview_id, slot, size, viewable, clicked, revenue_micros, cpm_micros,
                                    received_at, ingest_batch)
                            VALUES (s.site_id, s.id, s.pageview_id, s.slot, s.size, s.viewable, s.clicked,
                                    s.revenue_micros, s.cpm_micros, s.received_at, s.ingest_batch)""",
                rows, rows.size(), (ps, e) -> {
                    ps.setLong(1, site.id());
                    ps.setString(2, e.id());
                    ps.setString(3, e.pageview());
                    ps.setString(4, e.slot());
                    ps.setString(5, e.size());
                    ps.setBoolean(6, e.viewable());
                    ps.setBoolean(7, e.clicked());
                    ps.setLong(8, e.revenueMicros());
                    setLong(ps, 9, e.cpmMicros());
                    ps.setTimestamp(10, received);
                    ps.setLong(11, batch);
                });
        return stored(counts);
    }

    int sessions(Site site, List<Event.Session> rows, Instant receivedAt) {
        Timestamp received = Timestamp.from(receivedAt);
        int[][] counts = jdbc.batchUpdate("""
                        INSERT INTO session_fact (site_id, id, visitor, client_session, start_ts, end_ts, local_day,
                                                  local_hour, page_detail, pageviews, bounce, engaged_ms, entry_path, entry_ads, later_ads,
                                                  source, device, browser, os, country, region, variant,
                                                  revenue_micros, impressions, viewable_impressions, clicks,
                                                  origin, closed, updated_at)
                        VALUES (?, ?, ?, ?, ?, ?, ?, ?, '', ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, 'import', TRUE, ?)
                        ON CONFLICT DO NOTHING""", rows, rows.size(), (ps, e) -> {
                    ps.setLong(1, site.id());
                    ps.setString(2, e.id());
                    ps.setString(3, e.visitor());
                    ps.setString(4, e.clientSession());
                    ps.setTimestamp(5, Timestamp.from(e.start()));
                    ps.setTimestamp(6, Timestamp.from(e.end()));
                    ZonedDateTime local = e.start().atZone(site.timezone());
                    ps.setObject(7, local.toLocalDate());
                    ps.setInt(8, local.getHour());
                    ps.setInt(9, e.pageviews());
                    ps.setBoolean(10, e.bounce() != null ? e.bounce() : isBounce(site, e.pageviews(), e.engagedMs()));
                    ps.setLong(11, e.engagedMs());
                    ps.setString(12, e.entryPath());
                    ps.setInt(13, e.entryAds());
                    if (e.laterAds() == null) {
                        ps.setNull(14, Types.DOUBLE);
                    } else {
                        ps.setDouble(14, e.laterAds());
                    }
                    segment(ps, 15, e.segment());
                    ps.setLong(22, e.revenueMicros());
                    ps.setInt(23, e.impressions());
                    ps.setInt(24, e.viewableImpressions());
                    ps.setInt(25, e.clicks());
                    ps.setTimestamp(26, received);
                });
        return stored(counts);
    }

    /** Bounce: one pageview, unless the site counts a long enough single page as engaged (docs/metrics.md). */
    static boolean isBounce(Site site, int pageviews, long engagedMs) {
        if (pageviews != 1) {
            return false;
        }
        return site.engagedSeconds() == null || engagedMs < site.engagedSeconds() * 1000L;
    }

    private static void segment(PreparedStatement ps, int first, Event.Segment s) throws SQLException {
        ps.setString(first, s.source());
        ps.setString(first + 1, s.device());
        ps.setString(first + 2, s.browser());
        ps.setString(first + 3, s.os());
        ps.setString(first + 4, s.country());
        ps.setString(first + 5, s.region());
        ps.setString(first + 6, s.variant());
    }

    private static void setLong(PreparedStatement ps, int index, Long value) throws SQLException {
        if (value == null) {
            ps.setNull(index, Types.BIGINT);
        } else {
            ps.setLong(index, value);
        }
    }

    private static int stored(int[][] counts) {
        int n = 0;
        for (int[] batch : counts) {
            for (int c : batch) {
                if (c > 0) {
                    n += c;
                } else if (c == PreparedStatement.SUCCESS_NO_INFO) {
                    throw new IllegalStateException("the JDBC driver did not report row counts; idempotent ingest "
                            + "needs them (do not enable reWriteBatchedInserts)");
                }
            }
        }
        return n;
    }
}

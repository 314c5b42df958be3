package com.example.foldline.sessions;

import static org.assertj.core.api.Assertions.assertThat;

import java.time.Instant;
import java.time.temporal.ChronoUnit;
import java.util.ArrayList;
import java.util.Comparator;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.SplittableRandom;
import java.util.TreeMap;

import org.junit.jupiter.api.Test;
import org.springframework.beans.factory.annotation.Autowired;
import org.springframework.http.MediaType;
import org.springframework.jdbc.core.simple.JdbcClient;
import org.springframework.test.web.servlet.assertj.MockMvcTester;

import com.example.foldline.sites.Site;
import com.example.foldline.sites.SiteSettings;
import com.example.foldline.sites.Sites;

/**
 * The sessionizer's incremental path (issue #3) against one build over all events at once: a seeded stream of
 * pageviews, page-ends and impressions from 40 readers arrives shuffled (late pageviews, impressions and page-ends
 * before their pageview or after their session closed, raised page-ends, changing client session ids, engaged
 * single pages) in small batches, with sessionizer runs in between. The stored sessions must equal
 * {@link SessionBuilder} applied once to every reader's complete history (docs/metrics.md, "Sessions"), every rollup
 * view must add up to them, and a rebuild from the raw events must give the same rollup rows. Run on H2 and
 * PostgreSQL by the subclasses.
 */
abstract class SessionizerContract {

    @Autowired
    MockMvcTester mvc;
    @Autowired
    Sites sites;
    @Autowired
    Sessionizer sessionizer;
    @Autowired
    RollupRebuild rebuild;
    @Autowired
    JdbcClient jdbc;
    @Autowired
    SessionRepository repository;

    record Page(String id, Instant ts, String visitor, String clientSession, String path, int ads, String device,
                String source) {
    }

    record Arrival(double at, String json) {
    }

    @Test
    void shuffledBatchesGiveTheSameSessionsAndRollupsAsOneBuildOverEverything() {
        Site site = sites.create(new SiteSettings("Sessionizer", "sessionizer" + System.nanoTime() + ".example",
                "Europe/Lisbon", "EUR", null, 10, 3660));
        String key = sites.createIngestKey(site.id(), "test").key();
        SplittableRandom r = new SplittableRandom(20261202);
        Instant day = Instant.parse("2026-10-20T08:00:00Z");
        String[] devices = {"phone", "desktop", "tablet"};
        String[] sources = {"search", "social", "direct"};
        List<Page> pages = new ArrayList<>();
        Map<String, Long> engaged = new HashMap<>();
        Map<String, long[]> ads = new HashMap<>();
        List<Arrival> arrivals = new ArrayList<>();
        int n = 0;
        for (int v = 0; v < 40; v++) {
            String visitor = "reader-" + v;
            String device = devices[r.nextInt(3)];
            boolean usesClientSessions = r.nextInt(3) == 0;
            int visits = 1 + r.nextInt(4);
            for (int visit = 0; visit < visits; visit++) {
                Instant t = day.plusSeconds(r.nextInt(6 * 3600));
                String source = sources[r.nextInt(3)];
                String cs = usesClientSessions ? visitor + "-" + visit : null;
                int count = 1 + r.nextInt(6);
                for (int p = 0; p < count; p++) {
                    if (cs != null && r.nextInt(10) == 0) {
                        cs = cs + "x";
                    }
                    Page page = new Page("pv-" + (n++), t, visitor, cs, "/a/" + r.nextInt(8), r.nextInt(7), device,
                            source);
                    pages.add(page);
                    double at = t.getEpochSecond() + (r.nextInt(10) == 0 ? r.nextInt(5400) : r.nextInt(60));
                    arrivals.add(new Arrival(at, pageviewJson(page)));
                    if (r.nextInt(10) < 7) {
                        long ms = 1_000 + r.nextInt(40_000);
                        engaged.put(page.id(), ms);
                        // most page-ends come soon after the page, some long after its session closed
                        arrivals.add(new Arrival(at + (r.nextInt(8) == 0 ? 4000 : 30) + r.nextInt(600),
                                "{\"type\":\"pageend\",\"pageview\":\"%s\",\"engagedMs\":%d}".formatted(page.id(), ms)));
                        if (r.nextInt(5) == 0) {
                            long more = ms + 1 + r.nextInt(20_000);
                            engaged.put(page.id(), more);
                            arrivals.add(new Arrival(at + 700 + r.nextInt(3000),
                                    "{\"type\":\"pageend\",\"pageview\":\"%s\",\"engagedMs\":%d}".formatted(page.id(), more)));
                        }
                    }
                    int impressions = r.nextInt(3);
                    for (int i = 0; i < impressions; i++) {
                        long revenue = r.nextInt(3000);
                        boolean viewable = r.nextBoolean();
                        boolean clicked = r.nextInt(10) == 0;
                        long[] sum = ads.computeIfAbsent(page.id(), k -> new long[4]);
                        sum[0] += revenue;
                        sum[1]++;
                        sum[2] += viewable ? 1 : 0;
                        sum[3] += clicked ? 1 : 0;
                        // some impressions arrive before their pageview
                        arrivals.add(new Arrival(at + (r.nextInt(6) == 0 ? -200 : 5) + r.nextInt(100), """
                                {"type":"impression","id":"%s-i%d","pageview":"%s","revenueMicros":%d,"viewable":%s,\
                                "clicked":%s}""".formatted(page.id(), i, page.id(), revenue, viewable, clicked)));
                    }
                    t = t.plusSeconds(20 + r.nextInt(r.nextInt(8) == 0 ? 3600 : 700));
                }
            }
        }
        arrivals.sort(Comparator.comparingDouble(Arrival::at));
        int runs = 0;
        for (int i = 0; i < arrivals.size(); ) {
            int size = 5 + r.nextInt(60);
            List<String> lines = arrivals.subList(i, Math.min(arrivals.size(), i + size)).stream().map(Arrival::json)
                    .toList();
            post(site, key, String.join("\n", lines));
            i += size;
            if (r.nextInt(10) < 6) {
                sessionizer.run(site.id());
                runs++;
            }
        }
        sessionizer.run(site.id());
        assertThat(runs).isGreaterThan(10);

        // the reference: every reader's complete history built at once
        Map<String, List<PageviewRow>> byVisitor = new TreeMap<>();
        for (Page p : pages) {
            long[] a = ads.getOrDefault(p.id(), new long[4]);
            byVisitor.computeIfAbsent(p.visitor(), k -> new ArrayList<>()).add(new PageviewRow(p.id(), p.ts(),
                    p.visitor(), p.clientSession(), p.path(), p.source(), p.device(), "Lumen", null, "PT", null, null,
                    p.ads(), engaged.get(p.id()), a[0], (int) a[1], (int) a[2], (int) a[3]));
        }
        List<String> expected = new ArrayList<>();
        for (List<PageviewRow> rows : byVisitor.values()) {
            rows.sort(Comparator.comparing(PageviewRow::ts).thenComparing(PageviewRow::id));
            SessionBuilder.build(site, rows, Instant.now()).forEach(s -> expected.add(describe(s.id(), s.start(),
                    s.end(), s.pageviews(), s.bounce(), s.engagedMs(), s.revenueMicros(), s.impressions(),
                    s.viewableImpressions(), s.clicks(), s.entryAds(), s.entryPath(), s.source(), s.closed(),
                    PageStat.encode(s.pages()))));
        }
        assertThat(expected.size()).as("sessions in the fixture").isBetween(60, pages.size() - 1);
        assertThat(storedSessions(site)).containsExactlyInAnyOrderElementsOf(expected);
        assertRollupsAddUp(site);

        List<String> sessionRows = rollupRows(site, "rollup_session", "sessions");
        List<String> pageRows = rollupRows(site, "rollup_page", "pageviews");
        rebuild.rebuild(site.id());
        assertThat(storedSessions(site)).containsExactlyInAnyOrderElementsOf(expected);
        assertThat(rollupRows(site, "rollup_session", "sessions")).isEqualTo(sessionRows);
        assertThat(rollupRows(site, "rollup_page", "pageviews")).isEqualTo(pageRows);
    }

    @Test
    void sessionsCloseByWallTimeOrByTheNewestEventTime() {
        // a 1-minute timeout: a page 30 s ago is an open session by wall time
        Site site = sites.create(new SiteSettings("Closing", "closing" + System.nanoTime() + ".example", "UTC", "EUR",
                1, null, 3660));
        String key = sites.createIngestKey(site.id(), "test").key();
        Instant now = Instant.now().truncatedTo(ChronoUnit.MILLIS);
        post(site, key, pageviewJson(new Page("old", now.minusSeconds(3600), "a", null, "/", 1, "phone", "search"))
                + "\n" + pageviewJson(new Page("recent", now.minusSeconds(30), "b", null, "/", 1, "phone", "search")));
        sessionizer.run(site.id());
        assertThat(closed(site, "old")).isTrue();
        assertThat(closed(site, "recent")).isFalse();
        assertRollupsAddUp(site);
        // a page of another reader 5 minutes ahead (a client clock in the future, within the accepted 10 minutes)
        // moves the newest event time: the open session is now more than the timeout before it
        post(site, key, pageviewJson(new Page("ahead", now.plusSeconds(300), "c", null, "/", 1, "phone", "search")));
        sessionizer.run(site.id());
        assertThat(closed(site, "recent")).isTrue();
        assertThat(closed(site, "ahead")).isFalse();
        assertRollupsAddUp(site);
    }

    @Test
    void importsRollUpByDayRangeAndARangeThatGainedARowIsNotMarked() {
        Site site = sites.create(new SiteSettings("Imports", "imports" + System.nanoTime() + ".example", "UTC", "EUR",
                null, null, 3660));
        String key = sites.createIngestKey(site.id(), "test").key();
        StringBuilder lines = new StringBuilder();
        for (int i = 0; i < 30; i++) {
            lines.append(importedSession("imp-" + (100 + i), "2026-10-" + (10 + i % 3) + "T10:00:00Z", 1 + i % 4))
                    .append('\n');
        }
        post(site, key, lines.toString());
        // the first 10 in (day, id) order are all of 10 October; another import of that day lands inside their range
        List<SessionFact> first = repository.notRolledUp(site.id(), 10);
        assertThat(first).extracting(SessionFact::localDay).containsOnly(java.time.LocalDate.of(2026, 10, 10));
        post(site, key, importedSession("imp-000", "2026-10-10T11:00:00Z", 2));
        assertThat(repository.markRolledUp(site.id(), first)).isFalse();
        // (outside a transaction here: undo the mark the sessionizer would have rolled back)
        jdbc.sql("UPDATE session_fact SET rolled_up = FALSE WHERE site_id = :s").param("s", site.id()).update();
        assertThat(sessionizer.run(site.id()).importsRolledUp()).isEqualTo(31);
        assertThat(jdbc.sql("SELECT COUNT(*) FROM session_fact WHERE site_id = :s AND rolled_up = FALSE")
                .param("s", site.id()).query(Long.class).single()).isZero();
        assertRollupsAddUp(site);
        assertThat(sessionizer.run(site.id()).importsRolledUp()).isZero();
    }

    private static String importedSession(String id, String start, int pages) {
        return """
                {"type":"session","id":"%s","visitor":"r-%s","start":"%s","end":"%s","pageviews":%d,"engagedMs":%d,\
                "entryPath":"/p","entryAds":2,%s"revenueMicros":%d,"impressions":%d,"viewableImpressions":1,\
                "clicks":0,"device":"phone","source":"search","country":"PT"}""".formatted(id, id, start,
                Instant.parse(start).plusSeconds(60L * pages), pages, 5_000L * pages,
                pages > 1 ? "\"laterAds\":3," : "", 700L * pages, 1 + pages);
    }

    private boolean closed(Site site, String id) {
        return jdbc.sql("SELECT closed FROM session_fact WHERE site_id = :s AND id = :id").param("s", site.id())
                .param("id", id).query(Boolean.class).single();
    }

    private static String pageviewJson(Page p) {
        return """
                {"type":"pageview","id":"%s","ts":"%s","visitor":"%s",%s"path":"%s","ads":%d,"device":"%s",\
                "source":"%s","country":"PT","browser":"Lumen"}""".formatted(p.id(), p.ts(), p.visitor(),
                p.clientSession() == null ? "" : "\"session\":\"" + p.clientSession() + "\",", p.path(), p.ads(),
                p.device(), p.source());
    }

    private void post(Site site, String key, String ndjson) {
        assertThat(mvc.post().uri("/api/v1/sites/{id}/events", site.id()).header("Authorization", "Bearer " + key)
                .contentType(MediaType.parseMediaType("application/x-ndjson")).content(ndjson))
                .hasStatusOk().bodyJson().extractingPath("$.rejectedCount").isEqualTo(0);
    }

    private static String describe(Object... fields) {
        StringBuilder sb = new StringBuilder();
        for (Object f : fields) {
            sb.append(sb.isEmpty() ? "" : " ").append(f);
        }
        return sb.toString();
    }

    private List<String> storedSessions(Site site) {
        return jdbc.sql("""
                SELECT id, start_ts, end_ts, pageviews, bounce, engaged_ms, revenue_micros, impressions,
                       viewable_impressions, clicks, entry_ads, entry_path, source, closed, page_detail
                FROM session_fact WHERE site_id = :s AND origin = 'tag'""").param("s", site.id())
                .query((rs, i) -> describe(rs.getString(1), rs.getTimestamp(2).toInstant(),
                        rs.getTimestamp(3).toInstant(), rs.getInt(4), rs.getBoolean(5), rs.getLong(6), rs.getLong(7),
                        rs.getInt(8), rs.getInt(9), rs.getInt(10), rs.getInt(11), rs.getString(12), rs.getString(13),
                        rs.getBoolean(14), rs.getString(15)))
                .list();
    }

    /** Non-empty rollup rows of the site in a fixed order, every column. */
    private List<String> rollupRows(Site site, String table, String count) {
        // the table and column names are constants of this class
        return jdbc.sql("SELECT * FROM " + table + " WHERE site_id = :s AND " + count + " <> 0").param("s", site.id())
                .query((rs, i) -> {
                    StringBuilder sb = new StringBuilder();
                    for (int c = 1; c <= rs.getMetaData().getColumnCount(); c++) {
                        sb.append(rs.getMetaData().getColumnLabel(c).toLowerCase()).append('=').append(rs.getObject(c))
                                .append(' ');
                    }
                    return sb.toString();
                }).list().stream().sorted().toList();
    }

    /**
     * Every daily rollup view adds up to the stored closed sessions, and every weekly view to those of the weeks it
     * holds (up to the site's built-through Monday, WeeklyViews).
     */
    private void assertRollupsAddUp(Site site) {
        java.time.LocalDate built = jdbc.sql("SELECT built_through FROM rollup_week WHERE site_id = :s")
                .param("s", site.id()).query(java.time.LocalDate.class).optional().orElse(null);
        String factSums = """
                SELECT COUNT(*) AS sessions, COALESCE(SUM(pageviews), 0) AS pageviews,
                       COALESCE(SUM(revenue_micros), 0) AS revenue, COALESCE(SUM(engaged_ms), 0) AS engaged,
                       COUNT(*) FILTER (WHERE bounce) AS bounces
                FROM session_fact WHERE site_id = :s AND closed = TRUE AND local_day <= :last""";
        Map<String, Object> all = jdbc.sql(factSums).param("s", site.id())
                .param("last", java.time.LocalDate.parse("9999-12-31")).query().singleRow();
        Map<String, Object> inBuiltWeeks = jdbc.sql(factSums).param("s", site.id())
                .param("last", built == null ? java.time.LocalDate.parse("0001-01-01") : built.plusDays(6))
                .query().singleRow();
        for (Cuboid c : Cuboid.SESSION) {
            Map<String, Object> facts = c.weekly() ? inBuiltWeeks : all;
            Map<String, Object> view = jdbc.sql("""
                    SELECT COALESCE(SUM(sessions), 0) AS sessions, COALESCE(SUM(pageviews), 0) AS pageviews,
                           COALESCE(SUM(revenue_micros), 0) AS revenue, COALESCE(SUM(engaged_ms), 0) AS engaged,
                           COALESCE(SUM(bounces), 0) AS bounces
                    FROM rollup_session WHERE site_id = :s AND cuboid = :c""")
                    .param("s", site.id()).param("c", c.id()).query().singleRow();
            for (String k : List.of("sessions", "pageviews", "revenue", "engaged", "bounces")) {
                assertThat(((Number) view.get(k)).longValue()).as("view %d %s", c.id(), k)
                        .isEqualTo(((Number) facts.get(k)).longValue());
            }
        }
        for (Cuboid c : Cuboid.PAGE) {
            Map<String, Object> facts = c.weekly() ? inBuiltWeeks : all;
            Number pv = (Number) jdbc.sql("""
                    SELECT COALESCE(SUM(pageviews), 0) FROM rollup_page WHERE site_id = :s AND cuboid = :c""")
                    .param("s", site.id()).param("c", c.id()).query().singleValue();
            assertThat(pv.longValue()).as("page view %d", c.id()).isEqualTo(((Number) facts.get("pageviews")).longValue());
        }
    }
}

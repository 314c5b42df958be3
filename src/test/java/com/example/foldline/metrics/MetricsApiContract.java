package com.example.foldline.metrics;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;
import static org.springframework.security.test.web.servlet.request.SecurityMockMvcRequestPostProcessors.httpBasic;

import java.util.List;
import java.util.Map;

import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.springframework.beans.factory.annotation.Autowired;
import org.springframework.http.HttpStatus;
import org.springframework.http.MediaType;
import org.springframework.jdbc.core.simple.JdbcClient;
import org.springframework.test.web.servlet.assertj.MockMvcTester;

import com.example.foldline.sessions.Cuboid;
import com.example.foldline.sessions.Dim;
import com.example.foldline.sessions.RollupFill;
import com.example.foldline.sessions.Sessionizer;
import com.example.foldline.sites.NewIngestKey;
import com.example.foldline.sites.Site;
import com.example.foldline.sites.SiteSettings;
import com.example.foldline.sites.Sites;
import com.example.foldline.support.Events;

import tools.jackson.databind.JsonNode;
import tools.jackson.databind.ObjectMapper;

/**
 * Issue #3: sessions and every metrics endpoint on a small hand-computed fixture (values worked out in the comments),
 * run on H2 and PostgreSQL by the subclasses.
 */
abstract class MetricsApiContract {

    @Autowired
    MockMvcTester mvc;
    @Autowired
    Sites sites;
    @Autowired
    Sessionizer sessionizer;
    @Autowired
    JdbcClient jdbc;
    @Autowired
    ObjectMapper json;
    @Autowired
    RollupFill rollupFill;
    @Autowired
    com.example.foldline.sessions.BulkSessions bulk;

    Site site;
    String key;

    /*
     * Fixture, site in Europe/Lisbon (UTC+1 until 2026-10-25), 30-minute timeout:
     *  A: a1 10:00Z ads 2 /x phone search PT, impressions 1000 (viewable, clicked) + 500; engaged 8 s
     *     a2 10:10Z ads 4 /y, impression 2000 (viewable); engaged 30 s        -> 2 pages, revenue 3500, engaged 38 s
     *  B: b1 12:00Z ads 2 /x phone search PT, engaged 3 s                      -> bounce, revenue 0
     *  C: c1 13:00Z ads 5 /z desktop direct ES, impression 4000 (viewable)     -> bounce, revenue 4000
     *     c2 14:00Z ads 5 /z (60 min later: a new session)                     -> bounce, revenue 0
     * Totals: 4 sessions, 5 pageviews, 3 bounces, revenue 7500, 4 impressions, 3 viewable, 1 click, engaged 41 s.
     */
    @BeforeEach
    void fixture() {
        site = sites.create(new SiteSettings("Tidewater Kitchen", "kitchen" + System.nanoTime() + ".example",
                "Europe/Lisbon", "EUR", null, null, 3660));
        NewIngestKey k = sites.createIngestKey(site.id(), "test");
        key = k.key();
        post(new Events()
                .pageview("a1", "2026-10-20T10:00:00Z", "A", "/x", 2, "phone", "search", "PT")
                .pageview("a2", "2026-10-20T10:10:00Z", "A", "/y", 4, "phone", "search", "PT")
                .impression("i1", "a1", 1000, true, true)
                .impression("i2", "a1", 500, false, false)
                .impression("i3", "a2", 2000, true, false)
                .pageEnd("a1", 8000).pageEnd("a2", 30000)
                .pageview("b1", "2026-10-20T12:00:00Z", "B", "/x", 2, "phone", "search", "PT")
                .pageEnd("b1", 3000)
                .pageview("c1", "2026-10-20T13:00:00Z", "C", "/z", 5, "desktop", "direct", "ES")
                .impression("i4", "c1", 4000, true, false)
                .pageview("c2", "2026-10-20T14:00:00Z", "C", "/z", 5, "desktop", "direct", "ES"));
        sessionizer.run(site.id());
    }

    void post(Events events) {
        assertThat(mvc.post().uri("/api/v1/sites/{id}/events", site.id()).header("Authorization", "Bearer " + key)
                .contentType(MediaType.parseMediaType("application/x-ndjson")).content(events.ndjson()))
                .hasStatusOk().bodyJson().extractingPath("$.rejectedCount").isEqualTo(0);
    }

    JsonNode get(String name, String query) {
        return get(name, "2026-10-20", "2026-10-20", query);
    }

    JsonNode get(String name, String from, String to, String query) {
        var result = mvc.get().uri("/api/v1/sites/" + site.id() + "/metrics/" + name + "?from=" + from + "&to=" + to
                + query).with(httpBasic("admin", "admin-secret")).exchange();
        assertThat(result).hasStatusOk();
        return json.readTree(result.getResponse().getContentAsByteArray());
    }

    @Test
    void overviewMatchesTheHandComputedValues() {
        JsonNode o = get("overview", "").get("current");
        assertThat(o.get("sessions").asLong()).isEqualTo(4);
        assertThat(o.get("pageviews").asLong()).isEqualTo(5);
        assertThat(o.get("bounces").asLong()).isEqualTo(3);
        assertThat(o.get("bounceRate").asDouble()).isEqualTo(0.75);
        assertThat(o.get("pagesPerSession").asDouble()).isEqualTo(1.25);
        assertThat(o.get("engagedMsPerSession").asDouble()).isEqualTo(41_000 / 4.0);
        assertThat(o.get("revenueMicros").asLong()).isEqualTo(7500);
        assertThat(o.get("revenue").asDouble()).isEqualTo(0.0075);
        assertThat(o.get("pageRpmMicros").asDouble()).isEqualTo(7500 / 5.0 * 1000);
        assertThat(o.get("pageRpm").asDouble()).isEqualTo(1.5);
        assertThat(o.get("sessionRpmMicros").asDouble()).isEqualTo(7500 / 4.0 * 1000);
        assertThat(o.get("ecpmMicros").asDouble()).isEqualTo(7500 / 4.0 * 1000);
        assertThat(o.get("viewabilityRate").asDouble()).isEqualTo(0.75);
        assertThat(o.get("ctr").asDouble()).isEqualTo(0.25);
        // filters narrow the sessions: phone readers are A and B
        JsonNode phone = get("overview", "&device=phone").get("current");
        assertThat(phone.get("sessions").asLong()).isEqualTo(2);
        assertThat(phone.get("revenueMicros").asLong()).isEqualTo(3500);
        // a combination no rollup view holds falls back to the sessions table with the same result
        JsonNode odd = get("overview", "&region=PT-11&browser=Lumen&device=phone");
        assertThat(odd.get("scope").get("answeredFrom").stringValue()).contains("session_fact");
        assertThat(odd.get("current").get("sessions").asLong()).isZero();
    }

    @Test
    void comparisonWithThePreviousPeriodNamesItsMethod() {
        JsonNode a = get("overview", "&compare=previous");
        JsonNode cmp = a.get("comparison");
        assertThat(cmp.get("from").stringValue()).isEqualTo("2026-10-19");
        assertThat(cmp.get("values").get("sessions").asLong()).isZero();
        JsonNode bounce = null;
        for (JsonNode c : cmp.get("changes")) {
            if (c.get("metric").stringValue().equals("bounceRate")) {
                bounce = c;
            }
        }
        assertThat(bounce).isNotNull();
        assertThat(bounce.get("method").stringValue()).contains("Newcombe");
        // no sessions before: nothing to test against
        assertThat(bounce.has("significant")).isFalse();
    }

    @Test
    void densityGivesBounceByEntryAdsWithWilsonIntervals() {
        JsonNode points = get("density", "").get("points");
        assertThat(points).hasSize(2);
        assertThat(points.get(0).get("entryAds").asInt()).isEqualTo(2);
        assertThat(points.get(0).get("sessions").asLong()).isEqualTo(2);
        assertThat(points.get(0).get("bounceRate").asDouble()).isEqualTo(0.5);
        // Wilson 95% for 1/2: (0.0945, 0.9055), from the score-interval formula, z = 1.959963985
        assertThat(points.get(0).get("bounceLower").asDouble()).isCloseTo(0.09453120, within(1e-7));
        assertThat(points.get(0).get("bounceUpper").asDouble()).isCloseTo(0.90546880, within(1e-7));
        assertThat(points.get(1).get("entryAds").asInt()).isEqualTo(5);
        assertThat(points.get(1).get("bounceRate").asDouble()).isEqualTo(1.0);
        assertThat(points.get(1).get("sessionRpmMicros").asDouble()).isEqualTo(4000 / 2.0 * 1000);
    }

    @Test
    void depthGivesRevenuePerSessionByPagesAndTheMarginalPage() {
        JsonNode points = get("depth", "").get("points");
        assertThat(points).hasSize(2);
        assertThat(points.get(0).get("pages").asInt()).isEqualTo(1);
        assertThat(points.get(0).get("sessions").asLong()).isEqualTo(3);
        assertThat(points.get(0).get("revenuePerSessionMicros").asDouble()).isCloseTo(4000 / 3.0, within(1e-9));
        assertThat(points.get(1).get("revenuePerSessionMicros").asDouble()).isEqualTo(3500.0);
        assertThat(points.get(1).get("marginalRevenueMicros").asDouble()).isCloseTo(3500 - 4000 / 3.0, within(1e-9));
    }

    @Test
    void depthWithAGapInThePageCountsHasNoMarginalAfterTheGap() {
        // a segment whose sessions all have 3 pages: no 1- or 2-page point, so the 3-page point has no marginal
        post(new Events().pageview("t1", "2026-10-20T16:00:00Z", "T", "/t", 1, "tablet", "email", "FR")
                .pageview("t2", "2026-10-20T16:05:00Z", "T", "/u", 1, "tablet", "email", "FR")
                .pageview("t3", "2026-10-20T16:10:00Z", "T", "/v", 1, "tablet", "email", "FR"));
        sessionizer.run(site.id());
        JsonNode points = get("depth", "&device=tablet").get("points");
        assertThat(points).hasSize(1);
        assertThat(points.get(0).get("pages").asInt()).isEqualTo(3);
        assertThat(points.get(0).has("marginalRevenueMicros")).isFalse();
    }

    @Test
    void engagementGivesRevenuePerPageviewByEngagedTime() {
        JsonNode a = get("engagement", "");
        assertThat(a.get("unmeasuredPageviews").asLong()).isEqualTo(2);   // c1 and c2 have no page-end
        Map<Integer, JsonNode> byBucket = new java.util.HashMap<>();
        a.get("points").forEach(p -> byBucket.put(p.get("bucket").asInt(), p));
        assertThat(byBucket.keySet()).containsExactlyInAnyOrder(0, 1, 4);
        assertThat(byBucket.get(1).get("revenuePerPageviewMicros").asDouble()).isEqualTo(1500.0);  // a1: 8 s
        assertThat(byBucket.get(4).get("revenueMicros").asLong()).isEqualTo(2000);                 // a2: 30 s
        assertThat(byBucket.get(0).get("label").stringValue()).isEqualTo("0-5 s");               // b1: 3 s
    }

    @Test
    void geographyComparesEachCountryWithTheSite() {
        JsonNode rows = get("geography", "&sort=sessionRpm").get("rows");
        assertThat(rows).hasSize(2);
        assertThat(rows.get(0).get("country").stringValue()).isEqualTo("ES");
        assertThat(rows.get(0).get("share").asDouble()).isEqualTo(0.5);
        assertThat(rows.get(0).get("pageRpmMicros").asDouble()).isEqualTo(4000 / 2.0 * 1000);
        assertThat(rows.get(0).get("sessionRpmVsSite").asDouble()).isCloseTo(2_000_000 / 1_875_000.0, within(1e-12));
        assertThat(rows.get(1).get("pageRpmMicros").asDouble()).isCloseTo(3500 / 3.0 * 1000, within(1e-9));
    }

    @Test
    void pagesRanksEntryPathsAndSearches() {
        JsonNode a = get("pages", "&sort=bounceRate&minSessions=1");
        assertThat(a.get("rows")).extracting(r -> r.get("path").stringValue()).containsExactly("/z", "/x");
        assertThat(a.get("rows").get(1).get("meanEntryAds").asDouble()).isEqualTo(2.0);
        assertThat(get("pages", "&q=Z").get("rows")).hasSize(1);
    }

    @Test
    void timeseriesFillsEveryDayAndHour() {
        var result = mvc.get().uri("/api/v1/sites/" + site.id()
                        + "/metrics/timeseries?from=2026-10-19&to=2026-10-21&metric=bounceRate")
                .with(httpBasic("admin", "admin-secret")).exchange();
        JsonNode points = json.readTree(result.getResponse().getContentAsByteArray()).get("points");
        assertThat(points).extracting(p -> p.get("at").stringValue())
                .containsExactly("2026-10-19", "2026-10-20", "2026-10-21");
        assertThat(points.get(1).get("value").asDouble()).isEqualTo(0.75);
        assertThat(points.get(0).has("value")).isFalse();
        JsonNode hourly = get("timeseries", "&grain=hour").get("points");
        assertThat(hourly).hasSize(24);
        // 10:00Z is 11:00 in Lisbon (UTC+1 on 20 October)
        assertThat(hourly.get(11).get("numerator").asDouble()).isEqualTo(1);
    }

    @Test
    void lateEventsLandInTheRightSessionAndTheRollupsFollow() {
        // a late second page for B (20 min after b1) turns B's bounce into a two-page session,
        // and an impression that arrives before its pageview is counted once the pageview is there
        post(new Events().impression("i5", "b2", 700, true, false));
        sessionizer.run(site.id());
        post(new Events().pageview("b2", "2026-10-20T12:20:00Z", "B", "/w", 1, "phone", "search", "PT"));
        sessionizer.run(site.id());
        JsonNode o = get("overview", "").get("current");
        assertThat(o.get("sessions").asLong()).isEqualTo(4);
        assertThat(o.get("bounces").asLong()).isEqualTo(2);
        assertThat(o.get("revenueMicros").asLong()).isEqualTo(8200);
        // a page-end after the session closed updates its engaged time
        post(new Events().pageEnd("c2", 12_000));
        sessionizer.run(site.id());
        assertThat(get("overview", "").get("current").get("engagedMs").asLong()).isEqualTo(41_000 + 12_000);
        // a late first page before A's first page makes it A's entry page (entry ads 0)
        post(new Events().pageview("a0", "2026-10-20T09:55:00Z", "A", "/start", 0, "phone", "search", "PT"));
        sessionizer.run(site.id());
        JsonNode density = get("density", "").get("points");
        assertThat(density.get(0).get("entryAds").asInt()).isZero();
        assertThat(density.get(0).get("sessions").asLong()).isEqualTo(1);
        assertRollupsEqualSessions();
    }

    @Test
    void rebuildFromRawEventsGivesTheSameRollups() {
        String before = get("overview", "").get("current").toString();
        assertThat(mvc.post().uri("/api/v1/admin/rollups/rebuild?siteId=" + site.id())
                .with(httpBasic("admin", "admin-secret"))).hasStatusOk();
        assertThat(get("overview", "").get("current").toString()).isEqualTo(before);
        assertRollupsEqualSessions();
    }

    @Test
    void importedSessionsFlowIntoTheRollups() {
        post(new Events().line("""
                {"type":"session","id":"imp-1","visitor":"Z","start":"2026-10-20T16:00:00Z","end":"2026-10-20T16:05:00Z",\
                "pageviews":3,"engagedMs":60000,"entryPath":"/old","entryAds":1,"laterAds":3,"revenueMicros":900,\
                "impressions":6,"viewableImpressions":4,"clicks":0,"device":"tablet","source":"email","country":"FR"}"""));
        sessionizer.run(site.id());
        JsonNode o = get("overview", "").get("current");
        assertThat(o.get("sessions").asLong()).isEqualTo(5);
        assertThat(o.get("pageviews").asLong()).isEqualTo(8);
        assertThat(o.get("revenueMicros").asLong()).isEqualTo(8400);
        assertRollupsEqualSessions();
    }

    @Test
    void deletingAVisitorRemovesTheirEventsAndTheirShareOfEveryNumber() {
        // visitor A had one session: 2 pageviews, revenue 3500 (see the fixture)
        assertThat(mvc.delete().uri("/api/v1/sites/" + site.id() + "/visitors/A").with(httpBasic("admin", "admin-secret")))
                .hasStatusOk().bodyJson().extractingPath("$.pageviews").isEqualTo(2);
        JsonNode o = get("overview", "").get("current");
        assertThat(o.get("sessions").asLong()).isEqualTo(3);
        assertThat(o.get("pageviews").asLong()).isEqualTo(3);
        assertThat(o.get("revenueMicros").asLong()).isEqualTo(4000);
        long left = jdbc.sql("SELECT count(*) FROM impression WHERE site_id = :s AND pageview_id IN ('a1', 'a2')")
                .param("s", site.id()).query(Long.class).single();
        assertThat(left).isZero();
        assertRollupsEqualSessions();
    }

    @Test
    void retentionDeletesOldEventsButKeepsTheAggregates() {
        sites.update(site.id(), new SiteSettings(site.name(), site.domain(), "Europe/Lisbon", "EUR", null, null, 30));
        assertThat(mvc.post().uri("/api/v1/admin/retention/run").with(httpBasic("admin", "admin-secret"))).hasStatusOk();
        long raw = jdbc.sql("SELECT count(*) FROM pageview WHERE site_id = :s").param("s", site.id())
                .query(Long.class).single();
        long facts = jdbc.sql("SELECT count(*) FROM session_fact WHERE site_id = :s").param("s", site.id())
                .query(Long.class).single();
        assertThat(raw).isZero();
        assertThat(facts).isZero();
        assertThat(get("overview", "").get("current").get("sessions").asLong()).isEqualTo(4);
    }

    @Test
    void questionsWithOneOrTwoReaderFiltersAreReadFromAView() {
        // issue #3: entry paths with a source or country filter, geography with device x variant (docs/architecture.md)
        JsonNode pages = get("pages", "&source=search");
        assertThat(pages.get("scope").get("answeredFrom").stringValue()).isEqualTo("rollup_session view 41");
        assertThat(pages.get("rows")).extracting(r -> r.get("path").stringValue() + "=" + r.get("sessions").asLong())
                .containsExactly("/x=2");
        assertThat(get("pages", "&country=ES").get("scope").get("answeredFrom").stringValue())
                .isEqualTo("rollup_session view 42");
        JsonNode geo = get("geography", "&device=phone&variant=stacked");
        assertThat(geo.get("scope").get("answeredFrom").stringValue()).isEqualTo("rollup_session view 37");
        assertThat(geo.get("rows")).isEmpty();
        assertThat(get("geography", "&device=phone").get("rows").get(0).get("sessions").asLong()).isEqualTo(2);
        assertThat(get("density", "&browser=Lumen").get("scope").get("answeredFrom").stringValue())
                .startsWith("rollup_session view");
        assertThat(get("engagement", "&region=PT-11").get("scope").get("answeredFrom").stringValue())
                .isEqualTo("rollup_page view 16");
        assertRollupsEqualSessions();
    }

    @Test
    void rangesWithWholeWeeksReadThemFromTheWeeklyViewsAndAgreeWithTheirDays() {
        // weekly views (docs/architecture.md): sessions on both sides of week boundaries, the DST change in Lisbon
        // (2026-10-25) inside a week; Wednesday 2026-10-14 to Wednesday 2026-11-04 holds two whole weeks
        String[] days = {"2026-10-14", "2026-10-18", "2026-10-19", "2026-10-25", "2026-10-26", "2026-11-01",
                "2026-11-02", "2026-11-04"};
        Events more = new Events();
        for (int i = 0; i < days.length; i++) {
            more.pageview("w" + i, days[i] + "T12:00:00Z", "W" + i, i % 2 == 0 ? "/x" : "/w", 1 + i % 3,
                    i % 3 == 0 ? "phone" : "desktop", "search", "PT");
        }
        post(more);
        sessionizer.run(site.id());
        // the run built every week that is over in Lisbon: the last is the week before this one
        java.time.LocalDate thisMonday = java.time.LocalDate.now(java.time.ZoneId.of("Europe/Lisbon"))
                .with(java.time.temporal.TemporalAdjusters.previousOrSame(java.time.DayOfWeek.MONDAY));
        assertThat(builtThrough()).isEqualTo(thisMonday.minusDays(7));
        JsonNode all = get("pages", "2026-10-14", "2026-11-04", "&limit=500");
        // by hand: /x from A, B and four new sessions; /w four new ones; /z C's two sessions
        assertThat(all.get("rows")).extracting(r -> r.get("path").stringValue() + "=" + r.get("sessions").asLong())
                .containsExactly("/x=6", "/w=4", "/z=2");
        assertThat(all.get("scope").get("answeredFrom").stringValue())
                .isEqualTo("rollup_session view 18, whole weeks from view " + twinOf(18));
        assertThat(get("density", "2026-10-14", "2026-11-04", "&device=phone&source=search").get("scope")
                .get("answeredFrom").stringValue())
                .isEqualTo("rollup_session view 13, whole weeks from view " + twinOf(13));
        assertWeeksAgreeWithDays();
        // a late pageview in a built week goes to its weekly view too: A's session of 20 October gets a third page
        post(new Events().pageview("a3", "2026-10-20T10:20:00Z", "A", "/late", 1, "phone", "search", "PT"));
        sessionizer.run(site.id());
        JsonNode depth = get("depth", "2026-10-19", "2026-10-25", "&device=phone&source=search");
        assertThat(depth.get("scope").get("answeredFrom").stringValue()).isEqualTo("rollup_session view 16, whole "
                + "weeks from view " + twinOf(16));
        // phone readers from search that week: A (3 pages with the late one), B and W3 (1 page each)
        assertThat(depth.get("points")).extracting(p -> p.get("pages").asInt() + "=" + p.get("sessions").asLong())
                .contains("1=2", "3=1");
        assertWeeksAgreeWithDays();
        assertRollupsEqualSessions();
    }

    /** Entry pages and density over 14 October to 4 November equal the same questions asked day by day, added up. */
    private void assertWeeksAgreeWithDays() {
        for (String filter : List.of("", "&device=phone&source=search", "&country=PT")) {
            JsonNode pages = get("pages", "2026-10-14", "2026-11-04", filter + "&limit=500");
            JsonNode density = get("density", "2026-10-14", "2026-11-04", filter);
            assertThat(pages.get("scope").get("answeredFrom").stringValue()).as(filter).contains("whole weeks");
            Map<String, Long> pathsByDay = new java.util.TreeMap<>();
            Map<Integer, Long> adsByDay = new java.util.TreeMap<>();
            for (java.time.LocalDate d = java.time.LocalDate.parse("2026-10-14");
                 !d.isAfter(java.time.LocalDate.parse("2026-11-04")); d = d.plusDays(1)) {
                JsonNode day = get("pages", d.toString(), d.toString(), filter + "&limit=500");
                assertThat(day.get("scope").get("answeredFrom").stringValue()).doesNotContain("weeks");
                day.get("rows").forEach(r -> pathsByDay.merge(r.get("path").stringValue(), r.get("sessions").asLong(),
                        Long::sum));
                get("density", d.toString(), d.toString(), filter).get("points").forEach(p -> adsByDay.merge(
                        p.get("entryAds").asInt(), p.get("sessions").asLong(), Long::sum));
            }
            Map<String, Long> paths = new java.util.TreeMap<>();
            pages.get("rows").forEach(r -> paths.put(r.get("path").stringValue(), r.get("sessions").asLong()));
            Map<Integer, Long> ads = new java.util.TreeMap<>();
            density.get("points").forEach(p -> ads.merge(p.get("entryAds").asInt(), p.get("sessions").asLong(),
                    Long::sum));
            assertThat(paths).as(filter).isNotEmpty().isEqualTo(pathsByDay);
            ads.values().removeIf(n -> n == 0);
            adsByDay.values().removeIf(n -> n == 0);
            assertThat(ads).as(filter).isNotEmpty().isEqualTo(adsByDay);
        }
    }

    /** The Monday of the last week the site's weekly views hold (table rollup_week), or null. */
    java.time.LocalDate builtThrough() {
        return jdbc.sql("SELECT built_through FROM rollup_week WHERE site_id = :s").param("s", site.id())
                .query(java.time.LocalDate.class).optional().orElse(null);
    }

    private static int twinOf(int daily) {
        return Cuboid.SESSION.stream().filter(c -> c.weekOf() == daily).findFirst().orElseThrow().id();
    }

    @Test
    void rollupsOfTheOldLatticeGetTheNewViewsFilled() {
        // a database whose rollups were built before lattice 2: no rows in the new views, marked by migration V8
        simulateOldLattice();
        JsonNode before = get("pages", "&source=search");
        assertThat(before.get("scope").get("answeredFrom").stringValue()).contains("session_fact");
        assertThat(rollupFill.fillPending()).singleElement().satisfies(r -> {
            assertThat(r.siteId()).isEqualTo(site.id());
            assertThat(r.sessions()).isEqualTo(4);
            assertThat(r.completeFrom()).isNull();
        });
        assertThat(jdbc.sql("SELECT state FROM rollup_fill WHERE site_id = :s").param("s", site.id())
                .query(String.class).single()).isEqualTo("done");
        // the weekly views were built while the new daily views were empty: the fill drops them to be built again
        assertThat(builtThrough()).isNull();
        JsonNode after = get("pages", "&source=search");
        assertThat(after.get("scope").get("answeredFrom").stringValue()).isEqualTo("rollup_session view 41");
        assertThat(after.get("rows").toString()).isEqualTo(before.get("rows").toString());
        assertRollupsEqualSessions();
        // the sessionizer keeps the filled views right afterwards
        post(new Events().pageview("d1", "2026-10-20T15:00:00Z", "D", "/x", 1, "tablet", "search", "PT"));
        sessionizer.run(site.id());
        assertRollupsEqualSessions();
    }

    @Test
    void sessionsStoredWithTheNewestViewsDeferredReachThemThroughTheFill() {
        // the demo's quick first start: sessions stored with the first lattice's views only, the rest left pending
        simulateOldLattice();
        java.time.Instant start = java.time.Instant.parse("2026-10-20T16:00:00Z");
        assertThat(bulk.store(site, List.of(new com.example.foldline.sessions.SessionInput("q1", "Q", start,
                start.plusSeconds(300), "/quick", "social", "phone", "Lumen", "other", "PT", "PT-11", "B",
                List.of(new com.example.foldline.sessions.SessionInput.Page(3, 20_000L, 1_500, 3, 2, 0),
                        new com.example.foldline.sessions.SessionInput.Page(2, 10_000L, 900, 2, 1, 0)))), 1))
                .isEqualTo(1);
        for (Cuboid c : Cuboid.SESSION) {
            assertThat(jdbc.sql("SELECT COUNT(*) FROM rollup_session WHERE site_id = :s AND cuboid = :c")
                    .param("s", site.id()).param("c", c.id()).query(Long.class).single())
                    .as("view %d", c.id()).matches(n -> c.lattice() == 1 ? n > 0 : n == 0);
        }
        JsonNode before = get("pages", "&source=social");
        assertThat(before.get("scope").get("answeredFrom").stringValue()).contains("session_fact");
        rollupFill.fillPending();
        JsonNode after = get("pages", "&source=social");
        assertThat(after.get("scope").get("answeredFrom").stringValue()).startsWith("rollup_session view");
        assertThat(after.get("rows").toString()).isEqualTo(before.get("rows").toString()).contains("/quick");
        assertRollupsEqualSessions();
    }

    @Test
    void fillingAfterRetentionLeavesDaysWithoutSessionsOnTheOldViews() {
        java.time.LocalDate recent = java.time.LocalDate.now(java.time.ZoneId.of("Europe/Lisbon")).minusDays(2);
        post(new Events().pageview("r1", recent + "T12:00:00Z", "R", "/new", 3, "tablet", "email", "FR"));
        sessionizer.run(site.id());
        simulateOldLattice();
        // retention (30 days) deletes the fixture's sessions of 2026-10-20; the rollups keep them
        sites.update(site.id(), new SiteSettings(site.name(), site.domain(), "Europe/Lisbon", "EUR", null, null, 30));
        assertThat(mvc.post().uri("/api/v1/admin/retention/run").with(httpBasic("admin", "admin-secret"))).hasStatusOk();
        assertThat(rollupFill.fill(site.id(), 2).completeFrom()).isEqualTo(java.time.LocalDate.parse("2026-10-21"));
        // from the first complete day on, the new views answer
        JsonNode late = get("pages", recent.toString(), recent.toString(), "&source=email");
        assertThat(late.get("scope").get("answeredFrom").stringValue()).isEqualTo("rollup_session view 41");
        assertThat(late.get("rows").get(0).get("sessions").asLong()).isEqualTo(1);
        // a range reaching back to 2026-10-20 does not read the new views, whose rows lack that day's sessions
        JsonNode early = get("pages", "2026-10-20", recent.toString(), "&source=email");
        assertThat(early.get("scope").get("answeredFrom").stringValue()).contains("session_fact");
        assertThat(get("geography", "2026-10-20", recent.toString(), "&browser=Lumen").get("scope")
                .get("answeredFrom").stringValue()).contains("session_fact");
        // and old views keep every day
        assertThat(get("overview", "2026-10-20", recent.toString(), "").get("current").get("sessions").asLong())
                .isEqualTo(5);
    }

    /** Removes the rows of the views after lattice 1 and marks the site as migration V8 does for existing rollups. */
    private void simulateOldLattice() {
        for (Cuboid c : Cuboid.SESSION) {
            if (c.lattice() > 1) {
                jdbc.sql("DELETE FROM rollup_session WHERE site_id = :s AND cuboid = :c").param("s", site.id())
                        .param("c", c.id()).update();
            }
        }
        for (Cuboid c : Cuboid.PAGE) {
            if (c.lattice() > 1) {
                jdbc.sql("DELETE FROM rollup_page WHERE site_id = :s AND cuboid = :c").param("s", site.id())
                        .param("c", c.id()).update();
            }
        }
        for (int lattice = 2; lattice <= Cuboid.LATTICE; lattice++) {
            rollupFill.defer(site.id(), lattice);
        }
    }

    @Test
    void badFilterInputIs400NamingTheParameter() {
        assertBad("?shoeSize=42", "shoeSize");
        assertBad("?device=fridge", "device");
        assertBad("?country=XX", "country");
        assertBad("?from=2026-10-21&to=2026-10-20", "from");
        assertBad("?from=2025-01-01&to=2026-10-20", "from");
        assertBad("?from=yesterday", "from");
        assertBad("?compare=later", "compare");
        assertThat(mvc.get().uri("/api/v1/sites/" + site.id() + "/metrics/nonsense")
                .with(httpBasic("admin", "admin-secret"))).hasStatus(HttpStatus.NOT_FOUND);
        assertThat(mvc.get().uri("/api/v1/sites/" + site.id() + "/metrics/timeseries?grain=hour&from=2026-10-01"
                + "&to=2026-10-20").with(httpBasic("admin", "admin-secret"))).hasStatus(HttpStatus.BAD_REQUEST)
                .bodyJson().extractingPath("$.errors[0].field").isEqualTo("grain");
    }

    private void assertBad(String query, String field) {
        assertThat(mvc.get().uri("/api/v1/sites/" + site.id() + "/metrics/overview" + query)
                .with(httpBasic("admin", "admin-secret"))).hasStatus(HttpStatus.BAD_REQUEST)
                .bodyJson().extractingPath("$.errors[0].field").isEqualTo(field);
    }

    /**
     * Every rollup view must hold the stored closed sessions cell by cell (the invariant the incremental updates and
     * the fill of new views keep): each session view grouped by day and its dimensions equals the sessions grouped
     * the same way; each page view grouped by day and its segment dimensions equals the sessions' pageviews.
     */
    void assertRollupsEqualSessions() {
        for (Cuboid c : Cuboid.SESSION) {
            List<String> rollup = new java.util.ArrayList<>(List.of("local_day"));
            List<String> fact = new java.util.ArrayList<>(List.of("local_day"));
            for (Dim d : Dim.values()) {
                if (c.has(d)) {
                    rollup.add(d.column());
                    fact.add(switch (d) {
                        case PAGES -> "LEAST(pageviews, 11)";
                        case HOUR, ENTRY_ADS, ENTRY_PATH -> d.column();
                        default -> "COALESCE(" + d.column() + ", '')";
                    });
                }
            }
            assertThat(cells("SELECT " + String.join(", ", rollup) + """
                    , SUM(sessions), SUM(bounces), SUM(pageviews), SUM(revenue_micros), SUM(entry_ads_sum)
                    FROM rollup_session WHERE site_id = :s AND cuboid = """ + c.id() + " GROUP BY "
                    + String.join(", ", rollup) + " HAVING SUM(sessions) <> 0"))
                    .as("session view %d %s", c.id(), c.dims())
                    .containsExactlyInAnyOrderElementsOf(byWeekIf(c.weekly(), fact.size(), cells("SELECT "
                            + String.join(", ", fact) + """
                            , COUNT(*), SUM(CASE WHEN bounce THEN 1 ELSE 0 END), SUM(pageviews), SUM(revenue_micros),
                            SUM(entry_ads) FROM session_fact WHERE site_id = :s AND closed = TRUE GROUP BY """
                            + " " + String.join(", ", fact))));
        }
        for (Cuboid c : Cuboid.PAGE) {
            List<String> rollup = new java.util.ArrayList<>(List.of("local_day"));
            List<String> fact = new java.util.ArrayList<>(List.of("local_day"));
            for (Dim d : Dim.values()) {
                if (c.has(d) && d.isSegment()) {
                    rollup.add(d.column());
                    fact.add("COALESCE(" + d.column() + ", '')");
                }
            }
            assertThat(cells("SELECT " + String.join(", ", rollup) + ", SUM(pageviews), SUM(exits) FROM rollup_page"
                    + " WHERE site_id = :s AND cuboid = " + c.id() + " GROUP BY " + String.join(", ", rollup)
                    + " HAVING SUM(pageviews) <> 0"))
                    .as("page view %d %s", c.id(), c.dims())
                    .containsExactlyInAnyOrderElementsOf(byWeekIf(c.weekly(), fact.size(), cells("SELECT "
                            + String.join(", ", fact)
                            + ", SUM(pageviews), COUNT(*) FROM session_fact WHERE site_id = :s AND closed = TRUE"
                            + " GROUP BY " + String.join(", ", fact))));
        }
    }

    /**
     * For a weekly twin, the rows of {@link #cells} (first column a local day, then {@code keys} − 1 more key
     * columns, then sums) of the built weeks added up by the Monday of the day's week; otherwise the rows as they are.
     */
    private List<String> byWeekIf(boolean weekly, int keys, List<String> rows) {
        if (!weekly) {
            return rows;
        }
        java.time.LocalDate built = builtThrough(); // the twins hold the weeks up to this Monday only
        Map<String, long[]> sums = new java.util.TreeMap<>();
        for (String row : rows) {
            String[] f = row.split("\\|", -1);
            java.time.LocalDate monday = java.time.LocalDate.parse(f[0])
                    .with(java.time.temporal.TemporalAdjusters.previousOrSame(java.time.DayOfWeek.MONDAY));
            if (built == null || monday.isAfter(built)) {
                continue;
            }
            StringBuilder key = new StringBuilder(monday.toString()).append('|');
            for (int k = 1; k < keys; k++) {
                key.append(f[k]).append('|');
            }
            long[] add = new long[f.length - 1 - keys];
            for (int k = 0; k < add.length; k++) {
                add[k] = Long.parseLong(f[keys + k]);
            }
            sums.merge(key.toString(), add, (a, b) -> {
                long[] t = a.clone();
                for (int k = 0; k < t.length; k++) {
                    t[k] += b[k];
                }
                return t;
            });
        }
        List<String> out = new java.util.ArrayList<>();
        sums.forEach((k, v) -> {
            StringBuilder row = new StringBuilder(k);
            for (long x : v) {
                row.append(x).append('|');
            }
            out.add(row.toString());
        });
        return out;
    }

    /** Rows of a grouped query as text, numbers as longs (the two databases return different number types). */
    private List<String> cells(String sql) {
        return jdbc.sql(sql).param("s", site.id()).query((rs, i) -> {
            StringBuilder row = new StringBuilder();
            for (int k = 1; k <= rs.getMetaData().getColumnCount(); k++) {
                Object v = rs.getObject(k);
                row.append(v instanceof Number n ? Long.toString(n.longValue()) : String.valueOf(v)).append('|');
            }
            return row.toString();
        }).list();
    }
}

package com.example.foldline.ingest;

import static org.assertj.core.api.Assertions.assertThat;

import java.time.Clock;
import java.time.Duration;
import java.time.Instant;
import java.time.temporal.ChronoUnit;

import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.springframework.beans.factory.annotation.Autowired;
import org.springframework.http.HttpStatus;
import org.springframework.http.MediaType;
import org.springframework.jdbc.core.simple.JdbcClient;
import org.springframework.test.web.servlet.assertj.MockMvcTester;
import org.springframework.test.web.servlet.assertj.MvcTestResult;

import com.example.foldline.sites.Sites;
import com.example.foldline.support.TestData;
import com.example.foldline.support.TestData.SiteWithKey;

/**
 * The ingest API contract of issue #2, run against H2 and against PostgreSQL by the subclasses.
 */
abstract class IngestApiContract {

    static final MediaType NDJSON = MediaType.parseMediaType("application/x-ndjson");

    @Autowired
    MockMvcTester mvc;
    @Autowired
    Sites sites;
    @Autowired
    JdbcClient jdbc;
    @Autowired
    Clock clock;

    SiteWithKey site;
    Instant now;

    @BeforeEach
    void newSite() {
        site = TestData.site(sites, "Europe/Lisbon");
        now = clock.instant().truncatedTo(ChronoUnit.SECONDS);
    }

    MvcTestResult post(String body) {
        return mvc.post().uri("/api/v1/sites/{id}/events", site.site().id())
                .header("Authorization", "Bearer " + site.key()).contentType(NDJSON).content(body).exchange();
    }

    long count(String table) {
        return jdbc.sql("SELECT count(*) FROM " + table + " WHERE site_id = :site")
                .param("site", site.site().id()).query(Long.class).single();
    }

    String pv(String id) {
        return TestData.pageview(id, now.minusSeconds(60), "reader-1", "/a", 3);
    }

    @Test
    void storesValidEventsOfEveryType() {
        String body = String.join("\n",
                pv("p1"),
                "{\"type\":\"pageend\",\"pageview\":\"p1\",\"engagedMs\":4200,\"scrollPct\":80}",
                "{\"type\":\"impression\",\"id\":\"i1\",\"pageview\":\"p1\",\"slot\":\"top\",\"size\":\"300x250\","
                        + "\"viewable\":true,\"clicked\":false,\"revenueMicros\":1500}",
                "{\"type\":\"session\",\"id\":\"s1\",\"visitor\":\"old-reader\",\"start\":\"" + now.minusSeconds(7200)
                        + "\",\"end\":\"" + now.minusSeconds(7000) + "\",\"pageviews\":3,\"engagedMs\":90000,"
                        + "\"entryPath\":\"/b\",\"entryAds\":2,\"laterAds\":4.5,\"revenueMicros\":9000,"
                        + "\"impressions\":8,\"viewableImpressions\":5,\"clicks\":1,\"device\":\"desktop\"}");
        assertThat(post(body)).hasStatusOk().bodyJson()
                .hasPathSatisfying("$.accepted", v -> v.assertThat().isEqualTo(4))
                .hasPathSatisfying("$.duplicates", v -> v.assertThat().isEqualTo(0))
                .hasPathSatisfying("$.rejected", v -> v.assertThat().asList().isEmpty());
        assertThat(count("pageview")).isEqualTo(1);
        assertThat(count("page_end")).isEqualTo(1);
        assertThat(count("impression")).isEqualTo(1);
        assertThat(count("session_fact")).isEqualTo(1);
        // the visitor id is stored only as a keyed hash (docs/security.md)
        String stored = jdbc.sql("SELECT visitor FROM pageview WHERE site_id = :s").param("s", site.site().id())
                .query(String.class).single();
        assertThat(stored).hasSize(32).doesNotContain("reader");
    }

    @Test
    void sameBatchTwiceIsStoredOnceAndReportsDuplicates() {
        String body = pv("d1") + "\n" + pv("d2") + "\n"
                + "{\"type\":\"impression\",\"id\":\"di\",\"pageview\":\"d1\",\"revenueMicros\":10}";
        assertThat(post(body)).hasStatusOk().bodyJson().extractingPath("$.accepted").isEqualTo(3);
        assertThat(post(body)).hasStatusOk().bodyJson()
                .hasPathSatisfying("$.accepted", v -> v.assertThat().isEqualTo(0))
                .hasPathSatisfying("$.duplicates", v -> v.assertThat().isEqualTo(3));
        assertThat(count("pageview")).isEqualTo(2);
        assertThat(count("impression")).isEqualTo(1);
    }

    @Test
    void duplicateIdWithinOneBatchIsCountedOnce() {
        assertThat(post(pv("x1") + "\n" + pv("x1"))).hasStatusOk().bodyJson()
                .hasPathSatisfying("$.accepted", v -> v.assertThat().isEqualTo(1))
                .hasPathSatisfying("$.duplicates", v -> v.assertThat().isEqualTo(1));
    }

    @Test
    void mixedBatchStoresExactlyTheGoodLinesAndNamesEachBadOne() {
        String future = now.plus(Duration.ofMinutes(11)).toString();
        String tooOld = now.minus(Duration.ofDays(401)).toString();
        String body = String.join("\n",
                pv("ok1"),
                "{not json",
                TestData.pageview("neg", now, "v", "/x", -1),
                TestData.pageview("many", now, "v", "/x", 101),
                "{\"type\":\"impression\",\"id\":\"i9\",\"pageview\":\"ok1\",\"revenueMicros\":-5}",
                "{\"type\":\"impression\",\"id\":\"i10\",\"pageview\":\"ok1\",\"revenueMicros\":1.5}",
                TestData.pageview("fut", Instant.parse(future), "v", "/x", 1),
                TestData.pageview("old", Instant.parse(tooOld), "v", "/x", 1),
                pv("badcountry").replace("\"PT\"", "\"XX\""),
                "{\"type\":\"click\",\"id\":\"c\"}",
                "",
                pv("ok2"));
        assertThat(post(body)).hasStatusOk().bodyJson()
                .hasPathSatisfying("$.accepted", v -> v.assertThat().isEqualTo(2))
                .hasPathSatisfying("$.rejectedCount", v -> v.assertThat().isEqualTo(9))
                .hasPathSatisfying("$.rejected[0].line", v -> v.assertThat().isEqualTo(2))
                .hasPathSatisfying("$.rejected[1].field", v -> v.assertThat().isEqualTo("ads"))
                .hasPathSatisfying("$.rejected[1].line", v -> v.assertThat().isEqualTo(3))
                .hasPathSatisfying("$.rejected[2].field", v -> v.assertThat().isEqualTo("ads"))
                .hasPathSatisfying("$.rejected[3].field", v -> v.assertThat().isEqualTo("revenueMicros"))
                .hasPathSatisfying("$.rejected[3].message", v -> v.assertThat().asString().contains("negative"))
                .hasPathSatisfying("$.rejected[4].field", v -> v.assertThat().isEqualTo("revenueMicros"))
                .hasPathSatisfying("$.rejected[5].field", v -> v.assertThat().isEqualTo("ts"))
                .hasPathSatisfying("$.rejected[5].message", v -> v.assertThat().asString().contains("future"))
                .hasPathSatisfying("$.rejected[6].message", v -> v.assertThat().asString().contains("retention"))
                .hasPathSatisfying("$.rejected[7].field", v -> v.assertThat().isEqualTo("country"))
                .hasPathSatisfying("$.rejected[8].field", v -> v.assertThat().isEqualTo("type"))
                .hasPathSatisfying("$.rejected[8].line", v -> v.assertThat().isEqualTo(10));
        assertThat(count("pageview")).isEqualTo(2);
        assertThat(count("impression")).isEqualTo(0);
    }

    @Test
    void acceptsAJsonArrayAndEpochMilliseconds() {
        String body = "[" + pv("arr1") + ",{\"type\":\"pageview\",\"id\":\"arr2\",\"ts\":" + now.toEpochMilli()
                + ",\"visitor\":\"v\",\"path\":\"/p?utm_medium=email\",\"ads\":0,"
                + "\"userAgent\":\"Mozilla/5.0 (Linux) Mobile Safari\"}]";
        assertThat(mvc.post().uri("/api/v1/sites/{id}/events", site.site().id())
                .header("Authorization", "Bearer " + site.key()).contentType(MediaType.APPLICATION_JSON).content(body))
                .hasStatusOk().bodyJson().extractingPath("$.accepted").isEqualTo(2);
        var row = jdbc.sql("SELECT source, device FROM pageview WHERE site_id = :s AND id = 'arr2'")
                .param("s", site.site().id()).query().singleRow();
        assertThat(row).containsEntry("source", "email").containsEntry("device", "phone");
    }

    @Test
    void pageEndRaisesEngagedTimeAndAnEqualRepeatIsADuplicate() {
        String end = "{\"type\":\"pageend\",\"pageview\":\"late\",\"engagedMs\":%d}";
        // the page-end may arrive before its pageview
        assertThat(post(end.formatted(1000))).hasStatusOk().bodyJson().extractingPath("$.accepted").isEqualTo(1);
        assertThat(post(end.formatted(5000))).hasStatusOk().bodyJson().extractingPath("$.accepted").isEqualTo(1);
        assertThat(post(end.formatted(5000))).hasStatusOk().bodyJson().extractingPath("$.duplicates").isEqualTo(1);
        assertThat(post(end.formatted(3000))).hasStatusOk().bodyJson().extractingPath("$.duplicates").isEqualTo(1);
        long engaged = jdbc.sql("SELECT engaged_ms FROM page_end WHERE site_id = :s AND pageview_id = 'late'")
                .param("s", site.site().id()).query(Long.class).single();
        assertThat(engaged).isEqualTo(5000);
    }

    @Test
    void aRepeatedImpressionCanOnlyBeRaised() {
        String imp = "{\"type\":\"impression\",\"id\":\"r1\",\"pageview\":\"p\",\"viewable\":%s,\"clicked\":%s,"
                + "\"revenueMicros\":%d}";
        assertThat(post(imp.formatted(false, false, 100))).hasStatusOk().bodyJson().extractingPath("$.accepted").isEqualTo(1);
        // the slot became viewable after the page was first hidden: the tag sends it again
        assertThat(post(imp.formatted(true, false, 100))).hasStatusOk().bodyJson().extractingPath("$.accepted").isEqualTo(1);
        assertThat(post(imp.formatted(false, false, 50))).hasStatusOk().bodyJson().extractingPath("$.duplicates")
                .isEqualTo(1);
        var row = jdbc.sql("SELECT viewable, clicked, revenue_micros FROM impression WHERE site_id = :s AND id = 'r1'")
                .param("s", site.site().id()).query().singleRow();
        assertThat(row).containsEntry("viewable", true).containsEntry("clicked", false);
        assertThat(((Number) row.get("revenue_micros")).longValue()).isEqualTo(100);
    }

    @Test
    void missingWrongOrRevokedKeyOrUnknownSiteIs401WithoutSayingWhich() {
        String body = pv("k1");
        assertThat(mvc.post().uri("/api/v1/sites/{id}/events", site.site().id()).contentType(NDJSON).content(body))
                .hasStatus(HttpStatus.UNAUTHORIZED).bodyJson().extractingPath("$.detail")
                .isEqualTo("missing, wrong or revoked ingest key, or unknown site");
        assertThat(mvc.post().uri("/api/v1/sites/{id}/events", site.site().id())
                .header("Authorization", "Bearer flk_wrong").contentType(NDJSON).content(body))
                .hasStatus(HttpStatus.UNAUTHORIZED);
        assertThat(mvc.post().uri("/api/v1/sites/{id}/events", 987654321L)
                .header("Authorization", "Bearer " + site.key()).contentType(NDJSON).content(body))
                .hasStatus(HttpStatus.UNAUTHORIZED);
        // another site's valid key does not open this site
        SiteWithKey other = TestData.site(sites, "UTC");
        assertThat(mvc.post().uri("/api/v1/sites/{id}/events", site.site().id())
                .header("Authorization", "Bearer " + other.key()).contentType(NDJSON).content(body))
                .hasStatus(HttpStatus.UNAUTHORIZED);
        long keyId = sites.ingestKeys(site.site().id()).get(0).id();
        sites.revokeIngestKey(site.site().id(), keyId);
        assertThat(post(body)).hasStatus(HttpStatus.UNAUTHORIZED);
        assertThat(count("pageview")).isZero();
    }

    @Test
    void wrongContentTypeIs415() {
        assertThat(mvc.post().uri("/api/v1/sites/{id}/events", site.site().id())
                .header("Authorization", "Bearer " + site.key()).contentType(MediaType.APPLICATION_XML)
                .content("<pageview/>"))
                .hasStatus(HttpStatus.UNSUPPORTED_MEDIA_TYPE).bodyJson().extractingPath("$.detail").asString()
                .contains("Content-Type");
    }

    @Test
    void bodyOverTheMaximumIs413AndStoresNothing() {
        StringBuilder big = new StringBuilder();
        int i = 0;
        while (big.length() <= 70_000) {
            big.append(pv("big" + i++)).append('\n');
        }
        assertThat(post(big.toString())).hasStatus(HttpStatus.CONTENT_TOO_LARGE).bodyJson()
                .extractingPath("$.detail").asString().contains("maximum");
        assertThat(count("pageview")).isZero();
    }

    @Test
    void corsAllowsTheSitesOwnDomainOnly() {
        String own = "https://www." + site.site().domain();
        assertThat(mvc.options().uri("/api/v1/sites/{id}/events", site.site().id()).header("Origin", own)
                .header("Access-Control-Request-Method", "POST"))
                .hasStatus(HttpStatus.NO_CONTENT).headers().hasValue("Access-Control-Allow-Origin", own);
        assertThat(mvc.options().uri("/api/v1/sites/{id}/events", site.site().id())
                .header("Origin", "https://elsewhere.example").header("Access-Control-Request-Method", "POST"))
                .hasStatus(HttpStatus.FORBIDDEN).headers().doesNotContainHeader("Access-Control-Allow-Origin");
    }

    @Test
    void beaconStyleKeyInQueryWithTextPlainIsAccepted() {
        assertThat(mvc.post().uri("/api/v1/sites/{id}/events?key={key}", site.site().id(), site.key())
                .contentType(MediaType.TEXT_PLAIN).content(pv("beacon")))
                .hasStatusOk().bodyJson().extractingPath("$.accepted").isEqualTo(1);
    }
}

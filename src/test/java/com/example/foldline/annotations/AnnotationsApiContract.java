package com.example.foldline.annotations;

import static org.assertj.core.api.Assertions.assertThat;
import static org.springframework.security.test.web.servlet.request.SecurityMockMvcRequestPostProcessors.httpBasic;

import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.springframework.beans.factory.annotation.Autowired;
import org.springframework.http.HttpStatus;
import org.springframework.http.MediaType;
import org.springframework.test.web.servlet.assertj.MockMvcTester;
import org.springframework.test.web.servlet.assertj.MvcTestResult;

import com.example.foldline.sites.Site;
import com.example.foldline.sites.Sites;
import com.example.foldline.support.TestData;

import tools.jackson.databind.JsonNode;
import tools.jackson.databind.ObjectMapper;

/**
 * Issue #5: annotations, the dated notes on a site's timeline; run on H2 and PostgreSQL by the subclasses, which
 * repeat the metrics tests' configuration so the cached application contexts are shared.
 */
abstract class AnnotationsApiContract {

    @Autowired
    MockMvcTester mvc;
    @Autowired
    Sites sites;
    @Autowired
    ObjectMapper json;

    Site site;

    @BeforeEach
    void site() {
        site = TestData.site(sites, "Europe/Lisbon").site();
    }

    MvcTestResult post(long siteId, String body) {
        return mvc.post().uri("/api/v1/sites/{id}/annotations", siteId).with(httpBasic("admin", "admin-secret"))
                .contentType(MediaType.APPLICATION_JSON).content(body).exchange();
    }

    JsonNode list(String query) {
        MvcTestResult r = mvc.get().uri("/api/v1/sites/" + site.id() + "/annotations" + query)
                .with(httpBasic("admin", "admin-secret")).exchange();
        assertThat(r).hasStatusOk();
        return json.readTree(r.getResponse().getContentAsByteArray());
    }

    @Test
    void addListAndDelete() {
        MvcTestResult created = post(site.id(), """
                {"date": "2026-03-04", "text": "  new sidebar ad <b>B</b>  "}""");
        assertThat(created).hasStatus(HttpStatus.CREATED);
        JsonNode a = json.readTree(created.getResponse().getContentAsByteArray());
        // stored as sent (trimmed), never interpreted: the UI shows it as text
        assertThat(a.get("text").stringValue()).isEqualTo("new sidebar ad <b>B</b>");
        assertThat(a.get("date").stringValue()).isEqualTo("2026-03-04");
        assertThat(a.get("siteId").asLong()).isEqualTo(site.id());
        assertThat(a.get("createdBy").stringValue()).isEqualTo("admin");
        assertThat(post(site.id(), "{\"date\": \"2026-03-01\", \"text\": \"earlier\"}")).hasStatus(HttpStatus.CREATED);

        // ordered by date; from/to narrow the range, both ends included
        assertThat(list("")).extracting(n -> n.get("text").stringValue())
                .containsExactly("earlier", "new sidebar ad <b>B</b>");
        assertThat(list("?from=2026-03-02&to=2026-03-04")).hasSize(1);
        assertThat(list("?from=2026-03-05")).isEmpty();

        long id = a.get("id").asLong();
        assertThat(mvc.delete().uri("/api/v1/sites/{s}/annotations/{id}", site.id(), id)
                .with(httpBasic("admin", "admin-secret"))).hasStatus(HttpStatus.NO_CONTENT);
        assertThat(list("")).hasSize(1);
        assertThat(mvc.delete().uri("/api/v1/sites/{s}/annotations/{id}", site.id(), id)
                .with(httpBasic("admin", "admin-secret"))).hasStatus(HttpStatus.NOT_FOUND);
    }

    @Test
    void anotherSitesAnnotationCannotBeDeletedThroughThisSite() {
        Site other = TestData.site(sites, "UTC").site();
        JsonNode a = json.readTree(post(other.id(), "{\"date\": \"2026-03-04\", \"text\": \"theirs\"}")
                .getResponse().getContentAsByteArray());
        assertThat(mvc.delete().uri("/api/v1/sites/{s}/annotations/{id}", site.id(), a.get("id").asLong())
                .with(httpBasic("admin", "admin-secret"))).hasStatus(HttpStatus.NOT_FOUND);
        assertThat(list("")).isEmpty();
    }

    @Test
    void invalidInputIs400NamingTheField() {
        assertBad("{\"text\": \"no date\"}", "date");
        assertBad("{\"date\": \"4 March\", \"text\": \"x\"}", "date");
        assertBad("{\"date\": \"2026-02-30\", \"text\": \"x\"}", "date");
        assertBad("{\"date\": \"2026-03-04\", \"text\": \"   \"}", "text");
        assertBad("{\"date\": \"2026-03-04\", \"text\": \"" + "x".repeat(201) + "\"}", "text");
        assertThat(post(site.id(), "{\"date\": \"2026-03-04\", \"text\": \"" + "x".repeat(200) + "\"}"))
                .hasStatus(HttpStatus.CREATED);
        assertThat(mvc.get().uri("/api/v1/sites/" + site.id() + "/annotations?from=2026-03-05&to=2026-03-01")
                .with(httpBasic("admin", "admin-secret"))).hasStatus(HttpStatus.BAD_REQUEST)
                .bodyJson().extractingPath("$.errors[0].field").isEqualTo("from");
    }

    @Test
    void unknownSiteIs404AndAnonymousCallersAreRefused() {
        assertThat(post(987_654_321L, "{\"date\": \"2026-03-04\", \"text\": \"x\"}")).hasStatus(HttpStatus.NOT_FOUND);
        assertThat(mvc.get().uri("/api/v1/sites/" + site.id() + "/annotations")).hasStatus(HttpStatus.UNAUTHORIZED);
    }

    private void assertBad(String body, String field) {
        assertThat(post(site.id(), body)).hasStatus(HttpStatus.BAD_REQUEST)
                .bodyJson().extractingPath("$.errors[0].field").isEqualTo(field);
    }
}

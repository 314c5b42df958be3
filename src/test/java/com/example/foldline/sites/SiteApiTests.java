package com.example.foldline.sites;

import static org.springframework.security.test.web.servlet.request.SecurityMockMvcRequestPostProcessors.httpBasic;
import static org.assertj.core.api.Assertions.assertThat;

import org.junit.jupiter.api.Test;
import org.springframework.beans.factory.annotation.Autowired;
import org.springframework.boot.test.context.SpringBootTest;
import org.springframework.boot.webmvc.test.autoconfigure.AutoConfigureMockMvc;
import org.springframework.http.HttpStatus;
import org.springframework.http.MediaType;
import org.springframework.test.context.ActiveProfiles;
import org.springframework.test.context.TestPropertySource;
import org.springframework.test.web.servlet.assertj.MockMvcTester;

import tools.jackson.databind.JsonNode;
import tools.jackson.databind.ObjectMapper;

/** Issue #2: sites and ingest keys through the API, admin only, with field-level errors. */
@SpringBootTest
@AutoConfigureMockMvc
@ActiveProfiles("test")
@TestPropertySource(properties = "foldline.ingest.max-body-bytes=65536")
class SiteApiTests {

    @Autowired
    MockMvcTester mvc;
    @Autowired
    ObjectMapper json;

    @Test
    void adminCreatesASiteAndAKeyThatIsShownOnceAndWorks() {
        var created = mvc.post().uri("/api/v1/sites").with(httpBasic("admin", "admin-secret"))
                .contentType(MediaType.APPLICATION_JSON)
                .content("{\"name\":\"Harbour Recipes\",\"domain\":\"recipes.example\",\"timezone\":\"Europe/Lisbon\","
                        + "\"currency\":\"eur\"}").exchange();
        assertThat(created).hasStatus(HttpStatus.CREATED);
        JsonNode site = json.readTree(created.getResponse().getContentAsByteArray());
        assertThat(site.get("currency").stringValue()).isEqualTo("EUR");
        assertThat(site.get("sessionTimeoutMinutes").asInt()).isEqualTo(30);
        long id = site.get("id").asLong();

        var key = mvc.post().uri("/api/v1/sites/{id}/ingest-keys", id).with(httpBasic("admin", "admin-secret"))
                .exchange();
        assertThat(key).hasStatus(HttpStatus.CREATED);
        JsonNode k = json.readTree(key.getResponse().getContentAsByteArray());
        String secret = k.get("key").stringValue();
        assertThat(secret).startsWith("flk_");

        assertThat(mvc.get().uri("/api/v1/sites/{id}/ingest-keys", id).with(httpBasic("admin", "admin-secret")))
                .hasStatusOk().bodyText().doesNotContain(secret).contains(k.get("prefix").stringValue());
        assertThat(mvc.get().uri("/api/v1/sites").with(httpBasic("admin", "admin-secret")))
                .hasStatusOk().bodyText().contains("Harbour Recipes");

        assertThat(mvc.delete().uri("/api/v1/sites/{id}/ingest-keys/{key}", id, k.get("id").asLong())
                .with(httpBasic("admin", "admin-secret"))).hasStatus(HttpStatus.NO_CONTENT);
        assertThat(mvc.delete().uri("/api/v1/sites/{id}/ingest-keys/{key}", id, 99999)
                .with(httpBasic("admin", "admin-secret"))).hasStatus(HttpStatus.NOT_FOUND);
    }

    @Test
    void badSiteFieldsAreEachNamed() {
        assertThat(mvc.post().uri("/api/v1/sites").with(httpBasic("admin", "admin-secret"))
                .contentType(MediaType.APPLICATION_JSON)
                .content("{\"name\":\"\",\"domain\":\"not a host\",\"timezone\":\"Mars/Base\",\"currency\":\"XYZ1\","
                        + "\"sessionTimeoutMinutes\":0}"))
                .hasStatus(HttpStatus.BAD_REQUEST).bodyJson()
                .hasPathSatisfying("$.errors[*].field", v -> v.assertThat().asList()
                        .containsExactly("name", "domain", "timezone", "currency", "sessionTimeoutMinutes"));
    }

    @Test
    void siteManagementNeedsAnAdmin() {
        assertThat(mvc.post().uri("/api/v1/sites").contentType(MediaType.APPLICATION_JSON).content("{}"))
                .hasStatus(HttpStatus.UNAUTHORIZED);
        assertThat(mvc.get().uri("/api/v1/sites").with(httpBasic("admin", "wrong")))
                .hasStatus(HttpStatus.UNAUTHORIZED);
    }

    @Test
    void apiDescriptionAndEventSchemaAreServed() {
        assertThat(mvc.get().uri("/v3/api-docs")).hasStatusOk().bodyText().contains("/api/v1/sites/{siteId}/events");
        assertThat(mvc.get().uri("/schemas/events.schema.json")).hasStatusOk().bodyText().contains("revenueMicros");
        assertThat(mvc.get().uri("/actuator/health")).hasStatusOk();
    }
}

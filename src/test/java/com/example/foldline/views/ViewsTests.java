package com.example.foldline.views;

import static org.assertj.core.api.Assertions.assertThat;
import static org.springframework.security.test.web.servlet.request.SecurityMockMvcRequestPostProcessors.httpBasic;

import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.springframework.beans.factory.annotation.Autowired;
import org.springframework.boot.test.context.SpringBootTest;
import org.springframework.boot.webmvc.test.autoconfigure.AutoConfigureMockMvc;
import org.springframework.http.HttpStatus;
import org.springframework.http.MediaType;
import org.springframework.test.context.ActiveProfiles;
import org.springframework.test.context.TestPropertySource;
import org.springframework.test.web.servlet.assertj.MockMvcTester;

import com.example.foldline.accounts.Accounts;
import com.example.foldline.accounts.SiteAccess;
import com.example.foldline.accounts.SiteRole;
import com.example.foldline.sites.Site;
import com.example.foldline.sites.SiteSettings;
import com.example.foldline.sites.Sites;

import tools.jackson.databind.JsonNode;
import tools.jackson.databind.ObjectMapper;

/** Issue #6: saving, listing, opening by link, relative ranges, deletion and no-access pages. */
@SpringBootTest
@AutoConfigureMockMvc
@ActiveProfiles("test")
@TestPropertySource(properties = "foldline.ingest.max-body-bytes=65536")
class ViewsTests {

    static final String PW = "password-for-tests";

    @Autowired
    MockMvcTester mvc;
    @Autowired
    Sites sites;
    @Autowired
    Accounts accounts;
    @Autowired
    SiteAccess access;
    @Autowired
    ObjectMapper json;

    Site site;
    String editor;
    String colleague;
    String outsider;

    @BeforeEach
    void setUp() {
        long n = System.nanoTime() % 1_000_000_000L;
        site = sites.create(new SiteSettings("Views " + n, "views" + n + ".example", "UTC", "EUR", null, null, null));
        editor = "ed" + n;
        colleague = "co" + n;
        outsider = "out" + n;
        accounts.create(editor, PW, false);
        accounts.create(colleague, PW, false);
        accounts.create(outsider, PW, false);
        access.grantUser(site.id(), editor, SiteRole.EDITOR);
        access.grantUser(site.id(), colleague, SiteRole.VIEWER);
    }

    JsonNode save(String name, String state, boolean shared) {
        var r = mvc.post().uri("/api/v1/sites/" + site.id() + "/views").with(httpBasic(editor, PW))
                .contentType(MediaType.APPLICATION_JSON)
                .content("{\"name\":\"" + name + "\",\"screen\":\"density\",\"state\":\"" + state + "\",\"shared\":"
                        + shared + "}").exchange();
        assertThat(r).hasStatus(HttpStatus.CREATED);
        return json.readTree(r.getResponse().getContentAsByteArray());
    }

    @Test
    void aSharedViewOpensForColleaguesWithItsStateAndRelativeRange() {
        JsonNode view = save("Phone readers from search, last 28 days", "device=phone&source=search&range=28d", true);
        String link = view.get("link").stringValue();
        assertThat(link).matches("/v/[a-z0-9]{10}");
        assertThat(mvc.get().uri(link).with(httpBasic(colleague, PW))).hasStatus(HttpStatus.FOUND).headers()
                .hasValue("Location", "/?screen=density&site=" + site.id() + "&device=phone&source=search&range=28d");
        // the list shows owner and when it was last opened
        assertThat(mvc.get().uri("/api/v1/sites/" + site.id() + "/views").with(httpBasic(colleague, PW)))
                .hasStatusOk().bodyJson().hasPathSatisfying("$[0].owner", v -> v.assertThat().isEqualTo(editor))
                .hasPathSatisfying("$[0].lastOpenedAt", v -> v.assertThat().isNotNull());
    }

    @Test
    void aPrivateViewIsOnlyTheOwners() {
        JsonNode view = save("Mine", "device=tablet", false);
        assertThat(mvc.get().uri("/api/v1/sites/" + site.id() + "/views").with(httpBasic(colleague, PW)))
                .hasStatusOk().bodyJson().extractingPath("$").asList().isEmpty();
        assertThat(mvc.get().uri(view.get("link").stringValue()).with(httpBasic(colleague, PW)))
                .hasStatus(HttpStatus.FORBIDDEN);
        assertThat(mvc.get().uri(view.get("link").stringValue()).with(httpBasic(editor, PW)))
                .hasStatus(HttpStatus.FOUND);
    }

    @Test
    void someoneWithoutAccessGetsAPlainNoAccessPage() {
        JsonNode view = save("Shared", "", true);
        assertThat(mvc.get().uri(view.get("link").stringValue()).with(httpBasic(outsider, PW)))
                .hasStatus(HttpStatus.FORBIDDEN).bodyText().contains("No access").doesNotContain("Exception");
        assertThat(mvc.get().uri("/v/nosuchview").with(httpBasic(outsider, PW))).hasStatus(HttpStatus.NOT_FOUND)
                .bodyText().contains("No such view");
    }

    @Test
    void aDeletedViewLeavesOldLinksWithAClearMessage() {
        JsonNode view = save("Soon gone <script>", "device=phone", true);
        long id = view.get("id").asLong();
        assertThat(mvc.delete().uri("/api/v1/sites/" + site.id() + "/views/" + id).with(httpBasic(colleague, PW)))
                .hasStatus(HttpStatus.FORBIDDEN);
        assertThat(mvc.delete().uri("/api/v1/sites/" + site.id() + "/views/" + id).with(httpBasic(editor, PW)))
                .hasStatus(HttpStatus.NO_CONTENT);
        assertThat(mvc.get().uri(view.get("link").stringValue()).with(httpBasic(colleague, PW)))
                .hasStatus(HttpStatus.GONE).bodyText().contains("was deleted").contains("&lt;script&gt;")
                .doesNotContain("<script>");
    }

    @Test
    void pinningPutsAViewFirstAndBadInputIsNamed() {
        save("B view", "", true);
        JsonNode a = save("Z view", "", true);
        assertThat(mvc.post().uri("/api/v1/sites/" + site.id() + "/views/" + a.get("id").asLong() + "/pin")
                .with(httpBasic(editor, PW)).contentType(MediaType.APPLICATION_JSON).content("{\"pinned\":true}"))
                .hasStatusOk();
        assertThat(mvc.get().uri("/api/v1/sites/" + site.id() + "/views").with(httpBasic(colleague, PW)))
                .hasStatusOk().bodyJson().extractingPath("$[0].name").isEqualTo("Z view");
        assertThat(mvc.post().uri("/api/v1/sites/" + site.id() + "/views").with(httpBasic(editor, PW))
                .contentType(MediaType.APPLICATION_JSON).content("{\"name\":\"\",\"screen\":\"nowhere\",\"state\":\"\"}"))
                .hasStatus(HttpStatus.BAD_REQUEST).bodyJson().extractingPath("$.errors[1].field").isEqualTo("screen");
    }
}

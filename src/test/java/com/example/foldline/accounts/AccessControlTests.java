package com.example.foldline.accounts;

import static org.assertj.core.api.Assertions.assertThat;
import static org.springframework.security.test.web.servlet.request.SecurityMockMvcRequestPostProcessors.csrf;
import static org.springframework.security.test.web.servlet.request.SecurityMockMvcRequestPostProcessors.httpBasic;

import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.Set;

import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.springframework.beans.factory.annotation.Autowired;
import org.springframework.beans.factory.annotation.Qualifier;
import org.springframework.boot.test.context.SpringBootTest;
import org.springframework.boot.webmvc.test.autoconfigure.AutoConfigureMockMvc;
import org.springframework.http.HttpMethod;
import org.springframework.http.HttpStatus;
import org.springframework.http.MediaType;
import org.springframework.mock.web.MockHttpSession;
import org.springframework.test.context.ActiveProfiles;
import org.springframework.test.context.TestPropertySource;
import org.springframework.test.web.servlet.assertj.MockMvcTester;
import org.springframework.test.web.servlet.assertj.MvcTestResult;
import org.springframework.web.method.HandlerMethod;
import org.springframework.web.servlet.mvc.method.RequestMappingInfo;
import org.springframework.web.servlet.mvc.method.annotation.RequestMappingHandlerMapping;

import com.example.foldline.sites.Site;
import com.example.foldline.sites.SiteSettings;
import com.example.foldline.sites.Sites;

/**
 * Issue #6: access control tested from outside, over every endpoint the application maps (the list comes from the
 * request mappings, so a new endpoint without a rule fails {@link #everyEndpointHasAnAccessRule()}).
 */
@SpringBootTest
@AutoConfigureMockMvc
@ActiveProfiles("test")
@TestPropertySource(properties = "foldline.ingest.max-body-bytes=65536")
class AccessControlTests {

    /** Paths open to everyone (the ingest endpoint authenticates by ingest key). */
    static final Set<String> PUBLIC = Set.of("/api/v1/sites/{siteId}/events", "/error", "/v3/api-docs",
            "/v3/api-docs.yaml", "/v3/api-docs/swagger-config", "/swagger-ui.html", "/actuator/health");

    @Autowired
    MockMvcTester mvc;
    @Autowired
    Accounts accounts;
    @Autowired
    SiteAccess access;
    @Autowired
    Teams teams;
    @Autowired
    Sites sites;
    @Autowired
    ApiTokens tokens;
    @Autowired
    @Qualifier("requestMappingHandlerMapping")
    RequestMappingHandlerMapping mappings;

    Site siteA;
    Site siteB;
    String viewerA;
    String editorA;
    static final String PW = "password-for-tests";

    @BeforeEach
    void people() {
        long n = System.nanoTime() % 1_000_000_000L;
        siteA = sites.create(new SiteSettings("A " + n, "a" + n + ".example", "UTC", "EUR", null, null, null));
        siteB = sites.create(new SiteSettings("B " + n, "b" + n + ".example", "UTC", "EUR", null, null, null));
        viewerA = "viewer" + n;
        editorA = "editor" + n;
        accounts.create(viewerA, PW, false);
        accounts.create(editorA, PW, false);
        // team A holds viewer on site A; the editor holds editor directly
        Teams.Team team = teams.create("team-a-" + n);
        teams.addMember(team.id(), viewerA);
        access.grantTeam(siteA.id(), team.name(), SiteRole.VIEWER);
        access.grantUser(siteA.id(), editorA, SiteRole.EDITOR);
    }

    record Endpoint(HttpMethod method, String pattern) {
        String path(long siteId) {
            return pattern.replace("{siteId}", Long.toString(siteId)).replaceAll("\\{[^}]+}", "1");
        }
    }

    List<Endpoint> endpoints() {
        List<Endpoint> list = new ArrayList<>();
        for (Map.Entry<RequestMappingInfo, HandlerMethod> e : mappings.getHandlerMethods().entrySet()) {
            Set<String> patterns = e.getKey().getPatternValues();
            var methods = e.getKey().getMethodsCondition().getMethods();
            for (String p : patterns) {
                if (methods.isEmpty()) {
                    list.add(new Endpoint(HttpMethod.GET, p));
                }
                methods.forEach(m -> list.add(new Endpoint(HttpMethod.valueOf(m.name()), p)));
            }
        }
        return list;
    }

    /** Which rule covers an endpoint; null when none does. */
    static String rule(Endpoint e) {
        String p = e.pattern();
        if (PUBLIC.contains(p) || p.startsWith("/swagger-ui") || p.startsWith("/v3/api-docs")) {
            return "public";
        }
        if (p.startsWith("/api/v1/admin/") || (p.equals("/api/v1/sites") && e.method() == HttpMethod.POST)) {
            return "global admin";
        }
        if (p.startsWith("/api/v1/sites/{siteId}")) {
            return "site role";
        }
        // the alert bell lists only the caller's visible sites (AlertsH2Tests checks it)
        if (p.equals("/api/v1/sites") || p.startsWith("/api/v1/me") || p.startsWith("/api/v1/fits/")
                || p.equals("/api/v1/alerts/unread")
                || p.equals("/v/{slug}")) {
            return "signed-in user";
        }
        return null;
    }

    MvcTestResult call(Endpoint e, String path, String user) {
        var request = mvc.method(e.method()).uri(path).with(httpBasic(user, PW)).contentType(MediaType.APPLICATION_JSON)
                .content("{}");
        return request.exchange();
    }

    @Test
    void everyEndpointHasAnAccessRule() {
        List<Endpoint> uncovered = endpoints().stream().filter(e -> rule(e) == null).toList();
        assertThat(uncovered).as("endpoints without an access rule").isEmpty();
        assertThat(endpoints().stream().filter(e -> "site role".equals(rule(e)))).hasSizeGreaterThan(10);
    }

    @Test
    void aUserOfOneSiteNeverGetsAnotherSitesData() {
        for (Endpoint e : endpoints()) {
            if (!"site role".equals(rule(e)) || e.pattern().endsWith("/events")) {
                continue;
            }
            MvcTestResult result = call(e, e.path(siteB.id()), viewerA);
            assertThat(result.getResponse().getStatus()).as("%s %s as a viewer of another site", e.method(), e.pattern())
                    .isIn(403, 404);
        }
    }

    @Test
    void aViewerCannotCreateOrChangeAnything() {
        for (Endpoint e : endpoints()) {
            if (!"site role".equals(rule(e)) || e.method() == HttpMethod.GET || e.pattern().endsWith("/events")) {
                continue;
            }
            MvcTestResult result = call(e, e.path(siteA.id()), viewerA);
            assertThat(result.getResponse().getStatus()).as("%s %s as a viewer", e.method(), e.pattern()).isEqualTo(403);
        }
        for (Endpoint e : endpoints()) {
            if (!"global admin".equals(rule(e))) {
                continue;
            }
            assertThat(call(e, e.path(siteA.id()), editorA).getResponse().getStatus())
                    .as("%s %s as a non-administrator", e.method(), e.pattern()).isEqualTo(403);
        }
    }

    @Test
    void nothingButPublicPathsAnswersWithoutCredentials() {
        for (Endpoint e : endpoints()) {
            if ("public".equals(rule(e))) {
                continue;
            }
            MvcTestResult result = mvc.method(e.method()).uri(e.path(siteA.id())).contentType(MediaType.APPLICATION_JSON)
                    .content("{}").exchange();
            assertThat(result.getResponse().getStatus()).as("%s %s anonymously", e.method(), e.pattern())
                    .isIn(401, 403);
        }
    }

    @Test
    void rolesAllowWhatTheyShould() {
        assertThat(mvc.get().uri("/api/v1/sites/" + siteA.id() + "/metrics/overview").with(httpBasic(viewerA, PW)))
                .hasStatusOk();
        assertThat(mvc.get().uri("/api/v1/sites").with(httpBasic(viewerA, PW))).hasStatusOk().bodyText()
                .contains(siteA.name()).doesNotContain(siteB.name());
        assertThat(mvc.post().uri("/api/v1/sites/" + siteA.id() + "/views").with(httpBasic(editorA, PW))
                .contentType(MediaType.APPLICATION_JSON)
                .content("{\"name\":\"Phones\",\"screen\":\"density\",\"state\":\"device=phone\"}"))
                .hasStatus(HttpStatus.CREATED);
        assertThat(mvc.post().uri("/api/v1/sites/" + siteA.id() + "/ingest-keys").with(httpBasic(editorA, PW)))
                .hasStatus(HttpStatus.FORBIDDEN);
        assertThat(mvc.get().uri("/api/v1/me").with(httpBasic(viewerA, PW))).hasStatusOk().bodyJson()
                .extractingPath("$.sites." + siteA.id()).isEqualTo("VIEWER");
    }

    @Test
    void tokensWorkUntilRevokedOrTheirUserIsRemoved() {
        long id = accounts.find(editorA).orElseThrow().id();
        ApiTokens.NewToken t = tokens.create(id, "script");
        String path = "/api/v1/sites/" + siteA.id() + "/metrics/overview";
        assertThat(mvc.get().uri(path).header("Authorization", "Bearer " + t.token())).hasStatusOk();
        assertThat(mvc.get().uri("/api/v1/sites/" + siteB.id() + "/metrics/overview")
                .header("Authorization", "Bearer " + t.token())).hasStatus(HttpStatus.FORBIDDEN);
        tokens.revoke(id, t.id());
        assertThat(mvc.get().uri(path).header("Authorization", "Bearer " + t.token())).hasStatus(HttpStatus.UNAUTHORIZED);
        ApiTokens.NewToken second = tokens.create(id, "second");
        accounts.disable(editorA);
        assertThat(mvc.get().uri(path).header("Authorization", "Bearer " + second.token()))
                .hasStatus(HttpStatus.UNAUTHORIZED);
    }

    @Test
    void cookieSessionsNeedTheCsrfTokenAndExpireOnLogout() {
        MockHttpSession session = new MockHttpSession();
        MvcTestResult login = mvc.post().uri("/login").session(session).with(csrf())
                .param("username", editorA).param("password", PW).exchange();
        assertThat(login.getResponse().getStatus()).isEqualTo(302);
        MockHttpSession signedIn = (MockHttpSession) login.getRequest().getSession();
        String views = "/api/v1/sites/" + siteA.id() + "/views";
        String body = "{\"name\":\"x\",\"screen\":\"density\",\"state\":\"\"}";
        assertThat(mvc.get().uri(views).session(signedIn)).hasStatusOk();
        assertThat(mvc.post().uri(views).session(signedIn).contentType(MediaType.APPLICATION_JSON).content(body))
                .hasStatus(HttpStatus.FORBIDDEN);
        assertThat(mvc.post().uri(views).session(signedIn).with(csrf()).contentType(MediaType.APPLICATION_JSON)
                .content(body)).hasStatus(HttpStatus.CREATED);
        signedIn.invalidate();
        assertThat(mvc.get().uri(views).session(signedIn)).hasStatus(HttpStatus.UNAUTHORIZED);
    }

    @Test
    void repeatedWrongPasswordsLockTheNameForAWhile() {
        for (int i = 0; i < LoginThrottle.MAX_FAILURES; i++) {
            assertThat(mvc.get().uri("/api/v1/me").with(httpBasic(viewerA, "wrong-password"))).hasStatus(HttpStatus.UNAUTHORIZED);
        }
        assertThat(mvc.get().uri("/api/v1/me").with(httpBasic(viewerA, PW))).hasStatus(HttpStatus.UNAUTHORIZED);
        assertThat(mvc.get().uri("/api/v1/me").with(httpBasic(editorA, PW))).hasStatusOk();
    }
}

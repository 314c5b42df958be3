package com.example.foldline.web;

import static org.assertj.core.api.Assertions.assertThat;
import static org.springframework.security.test.web.servlet.request.SecurityMockMvcRequestPostProcessors.httpBasic;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.regex.Matcher;

import org.junit.jupiter.api.Test;
import org.springframework.beans.factory.annotation.Autowired;
import org.springframework.boot.test.context.SpringBootTest;
import org.springframework.boot.webmvc.test.autoconfigure.AutoConfigureMockMvc;
import org.springframework.test.context.ActiveProfiles;
import org.springframework.test.context.TestPropertySource;
import org.springframework.test.web.servlet.assertj.MockMvcTester;

/** Issue #5: the browser UI is served with a Content-Security-Policy that allows no inline script but the import map. */
@SpringBootTest
@AutoConfigureMockMvc
@ActiveProfiles("test")
@TestPropertySource(properties = "foldline.ingest.max-body-bytes=65536")
class ContentSecurityPolicyTests {

    @Autowired
    MockMvcTester mvc;

    @Test
    void theAppIsServedWithAPolicyThatAllowsOnlyItsOwnScriptsAndTheImportMap() throws Exception {
        String html = Files.readString(Path.of("frontend/app/index.html"));
        Matcher m = java.util.regex.Pattern.compile("<script type=\"importmap\">(.*?)</script>", java.util.regex.Pattern.DOTALL)
                .matcher(html);
        assertThat(m.find()).isTrue();
        String expected = "script-src 'self' 'sha256-" + ContentSecurityPolicyFilter.sha256(m.group(1)) + "';";
        var page = mvc.get().uri("/").with(httpBasic("admin", "admin-secret")).exchange();
        assertThat(page).hasStatusOk();
        String policy = page.getResponse().getHeader("Content-Security-Policy");
        assertThat(mvc.get().uri("/index.html").with(httpBasic("admin", "admin-secret")).exchange().getResponse()
                .getHeader("Content-Security-Policy")).isEqualTo(policy);
        assertThat(policy).contains(expected, "style-src 'self';", "object-src 'none'", "frame-ancestors 'none'")
                .doesNotContain("unsafe-inline", "unsafe-eval");
        // the UI's pages (the app and its own sign-in page, public); not the tag, which other sites load
        var login = mvc.get().uri("/login.html").exchange();
        assertThat(login).hasStatusOk();
        assertThat(login.getResponse().getHeader("Content-Security-Policy")).isEqualTo(policy);
        assertThat(mvc.get().uri("/tag.js").exchange().getResponse().getHeader("Content-Security-Policy")).isNull();
    }

    @Test
    void noPageOfTheAppHasInlineScriptsStylesOrHandlers() throws Exception {
        for (String page : java.util.List.of("index.html", "login.html")) {
            String html = Files.readString(Path.of("frontend/app", page));
            assertThat(html.replaceAll("(?s)<script type=\"importmap\">.*?</script>", "")).as(page)
                    .doesNotContainPattern("<script(?![^>]*\\ssrc=)[^>]*>")
                    .doesNotContainPattern("(?i)\\son[a-z]+=")
                    .doesNotContainPattern("(?i)<style|\\sstyle=");
        }
        try (var files = Files.walk(Path.of("frontend/app/js"))) {
            for (Path f : files.filter(p -> p.toString().endsWith(".js") && !p.toString().contains("/test/")).toList()) {
                assertThat(Files.readString(f)).as(f.toString())
                        .doesNotContain("innerHTML", "outerHTML", "insertAdjacentHTML", "document.write", "eval(",
                                "new Function");
            }
        }
    }
}

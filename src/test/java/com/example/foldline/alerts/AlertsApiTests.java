package com.example.foldline.alerts;

import static org.assertj.core.api.Assertions.assertThat;
import static org.springframework.security.test.web.servlet.request.SecurityMockMvcRequestPostProcessors.httpBasic;

import java.io.IOException;
import java.net.InetSocketAddress;
import java.nio.charset.StandardCharsets;
import java.time.Instant;
import java.time.temporal.ChronoUnit;
import java.util.ArrayList;
import java.util.Collections;
import java.util.List;
import java.util.concurrent.atomic.AtomicInteger;
import java.util.function.IntUnaryOperator;

import org.junit.jupiter.api.Test;
import org.springframework.http.HttpStatus;
import org.springframework.http.MediaType;
import org.springframework.test.web.servlet.assertj.MvcTestResult;

import com.icegreen.greenmail.util.GreenMail;
import com.sun.net.httpserver.HttpServer;

import jakarta.mail.internet.MimeMessage;
import tools.jackson.databind.JsonNode;

/**
 * Issue #7 through the HTTP API: rule validation and life cycle, signed and retried webhooks to a loopback test
 * server, e-mail to an in-process SMTP server (GreenMail), the bell, and jump suggestions. Runs on H2.
 */
abstract class AlertsApiTests extends AlertsContract {

    @org.springframework.beans.factory.annotation.Autowired
    com.example.foldline.accounts.Accounts accounts;
    @org.springframework.beans.factory.annotation.Autowired
    com.example.foldline.accounts.SiteAccess access;

    /** A request the test server received. */
    record Received(String path, byte[] body, String signature, String event, String delivery) {
    }

    /** A loopback HTTP server answering with {@code status.applyAsInt(callNumber)}. */
    static final class Receiver implements AutoCloseable {
        final HttpServer server;
        final List<Received> received = Collections.synchronizedList(new ArrayList<>());
        final AtomicInteger calls = new AtomicInteger();

        Receiver(IntUnaryOperator status, String redirectTo) throws IOException {
            server = HttpServer.create(new InetSocketAddress("127.0.0.1", 0), 0);
            server.createContext("/", exchange -> {
                byte[] body = exchange.getRequestBody().readAllBytes();
                received.add(new Received(exchange.getRequestURI().getPath(), body,
                        exchange.getRequestHeaders().getFirst("Foldline-Signature"),
                        exchange.getRequestHeaders().getFirst("Foldline-Event"),
                        exchange.getRequestHeaders().getFirst("Foldline-Delivery")));
                int code = status.applyAsInt(calls.incrementAndGet());
                if (redirectTo != null) {
                    exchange.getResponseHeaders().add("Location", redirectTo.replace("{port}",
                            Integer.toString(port())));
                }
                exchange.sendResponseHeaders(code, -1);
                exchange.close();
            });
            server.start();
        }

        int port() {
            return server.getAddress().getPort();
        }

        String url(String path) {
            return "http://127.0.0.1:" + port() + path;
        }

        @Override
        public void close() {
            server.stop(0);
        }
    }

    MvcTestResult call(org.springframework.test.web.servlet.assertj.MockMvcTester.MockMvcRequestBuilder request) {
        return request.with(httpBasic("admin", "admin-secret")).exchange();
    }

    JsonNode body(MvcTestResult result) {
        return json.readTree(result.getResponse().getContentAsByteArray());
    }

    NewWebhook webhook(String url) {
        MvcTestResult r = call(mvc.post().uri("/api/v1/sites/{id}/alerts/webhooks", jump.id())
                .contentType(MediaType.APPLICATION_JSON)
                .content("{\"name\":\"desk\",\"url\":\"" + url + "\"}"));
        assertThat(r).hasStatus(HttpStatus.CREATED);
        return json.readValue(r.getResponse().getContentAsByteArray(), NewWebhook.class);
    }

    @Test
    void invalidRulesAreRefusedNamingEachField() {
        MvcTestResult r = call(mvc.post().uri("/api/v1/sites/{id}/alerts/rules", jump.id())
                .contentType(MediaType.APPLICATION_JSON).content("""
                        {"name": "", "metric": "revenue", "window": "PT90M", "segment": {"device": ["fridge"]},
                         "condition": {"type": "jump", "by": -1}, "guard": {"method": "welch", "confidence": 1.2},
                         "emails": ["not-an-address"], "webhookIds": [999999]}"""));
        assertThat(r).hasStatus(HttpStatus.BAD_REQUEST);
        assertThat(body(r).get("errors").findValuesAsString("field")).contains("name", "metric", "window",
                "segment.device", "condition.by", "guard.method", "guard.confidence", "emails", "webhookIds");
        MvcTestResult noType = call(mvc.post().uri("/api/v1/sites/{id}/alerts/rules", jump.id())
                .contentType(MediaType.APPLICATION_JSON).content("{\"name\": \"x\", \"condition\": {\"type\": "
                        + "\"above\", \"threshold\": 1.5, \"by\": 3}}"));
        assertThat(body(noType).get("errors").findValuesAsString("field"))
                .containsExactlyInAnyOrder("condition.threshold", "condition");
    }

    @Test
    void ruleLifeCycleThroughTheApi() {
        MvcTestResult created = call(mvc.post().uri("/api/v1/sites/{id}/alerts/rules", jump.id())
                .contentType(MediaType.APPLICATION_JSON)
                .content("{\"name\": \"Phones\", \"segment\": {\"device\": [\"phone\"]}, "
                        + "\"condition\": {\"type\": \"jump\", \"by\": 5}}"));
        assertThat(created).hasStatus(HttpStatus.CREATED);
        JsonNode rule = body(created);
        long id = rule.get("id").asLong();
        JsonNode d = rule.get("definition");
        assertThat(d.get("metric").stringValue()).isEqualTo("bounceRate");
        assertThat(d.get("window").stringValue()).isEqualTo("PT1H");
        assertThat(d.get("condition").get("direction").stringValue()).isEqualTo("up");
        assertThat(d.get("condition").get("baseline").stringValue()).isEqualTo("trailingDays");
        assertThat(d.get("condition").get("baselinePeriods").asInt()).isEqualTo(7);
        assertThat(d.get("guard").get("method").stringValue()).isEqualTo("zTest");
        assertThat(d.get("guard").get("minSessions").asInt()).isEqualTo(200);
        assertThat(d.get("cooldown").stringValue()).isEqualTo("PT6H");
        assertThat(d.get("clearsAfter").stringValue()).isEqualTo("PT2H");
        assertThat(rule.get("state").stringValue()).isEqualTo("CALM");

        String uri = "/api/v1/sites/" + jump.id() + "/alerts/rules/" + id;
        assertThat(call(mvc.put().uri(uri).contentType(MediaType.APPLICATION_JSON)
                .content("{\"name\": \"Phones, renamed\", \"condition\": {\"type\": \"above\", \"threshold\": 0.7}}")))
                .hasStatusOk().bodyJson().extractingPath("$.definition.name").isEqualTo("Phones, renamed");
        assertThat(call(mvc.post().uri(uri + "/pause"))).hasStatusOk().bodyJson().extractingPath("$.state")
                .isEqualTo("PAUSED");
        assertThat(evaluator.evaluateAll(at(jump, day9(13))).rules()).isZero();      // paused rules are skipped
        assertThat(call(mvc.post().uri(uri + "/resume"))).hasStatusOk().bodyJson().extractingPath("$.state")
                .isEqualTo("CALM");
        assertThat(call(mvc.get().uri(uri + "/history"))).hasStatusOk().bodyJson()
                .extractingPath("$[0].reason").isEqualTo("resumed");
        assertThat(call(mvc.put().uri(uri + "/mute").contentType(MediaType.APPLICATION_JSON)
                .content("{\"until\": \"2001-01-01T00:00:00Z\"}"))).hasStatus(HttpStatus.BAD_REQUEST);
        assertThat(call(mvc.delete().uri(uri))).hasStatus(HttpStatus.NO_CONTENT);
        assertThat(call(mvc.get().uri(uri))).hasStatus(HttpStatus.NOT_FOUND);
    }

    @Test
    void webhooksAreSignedRetriedAndLogged() throws Exception {
        try (Receiver receiver = new Receiver(n -> n == 1 ? 503 : 200, null)) {
            NewWebhook hook = webhook(receiver.url("/hook"));
            assertThat(hook.secret()).startsWith("whsec_");
            rules.create(jump.id(), jumpRule("Signed", null, List.of(hook.webhook().id()), null));
            Instant t = at(jump, day9(13));
            evaluator.evaluateAll(t);
            assertThat(dispatcher.dispatchDue(t)).isEqualTo(1);                    // 503
            assertThat(dispatcher.dispatchDue(t.plusSeconds(29))).isZero();       // backoff: not due yet
            assertThat(dispatcher.dispatchDue(t.plusSeconds(30))).isEqualTo(1);   // 200
            assertThat(dispatcher.dispatchDue(t.plusSeconds(3600))).isZero();     // sent: nothing more
            assertThat(receiver.received).hasSize(2);
            for (Received r : receiver.received) {
                // the receiver's check: HMAC-SHA256 of the raw body under the secret, compared with the header
                javax.crypto.Mac mac = javax.crypto.Mac.getInstance("HmacSHA256");
                mac.init(new javax.crypto.spec.SecretKeySpec(hook.secret().getBytes(StandardCharsets.UTF_8),
                        "HmacSHA256"));
                String expected = "sha256=" + java.util.HexFormat.of().formatHex(mac.doFinal(r.body()));
                assertThat(r.signature()).isEqualTo(expected);
                assertThat(r.event()).isEqualTo("alert.raised");
            }
            assertThat(receiver.received.get(0).body()).isEqualTo(receiver.received.get(1).body());
            JsonNode payload = json.readTree(receiver.received.get(0).body());
            assertThat(payload.get("rule").get("name").stringValue()).isEqualTo("Signed");
            assertThat(payload.get("test").get("method").stringValue()).contains("z test");
            assertThat(payload.get("baseline").get("sessions").asLong()).isEqualTo(1400);
            assertThat(payload.get("link").stringValue()).contains("/?screen=health&site=" + jump.id() + "&");

            JsonNode log = body(call(mvc.get().uri("/api/v1/sites/{id}/alerts/deliveries?webhookId={w}", jump.id(),
                    hook.webhook().id())));
            assertThat(log).hasSize(2);
            assertThat(log.get(0).get("statusCode").asInt()).isEqualTo(200);
            assertThat(log.get(0).get("outcome").stringValue()).isEqualTo("ok");
            assertThat(log.get(0).get("status").stringValue()).isEqualTo("sent");
            assertThat(log.get(1).get("statusCode").asInt()).isEqualTo(503);
            assertThat(log.get(1).get("attempt").asInt()).isEqualTo(1);
        }
    }

    @Test
    void aRedirectToAnotherHostIsRefused() throws Exception {
        // 127.0.0.1 redirects to localhost: another host name, so the redirect is not followed and not retried
        try (Receiver receiver = new Receiver(n -> 307, "http://localhost:{port}/elsewhere")) {
            NewWebhook hook = webhook(receiver.url("/hook"));
            rules.create(jump.id(), jumpRule("Redirected", null, List.of(hook.webhook().id()), null));
            Instant t = at(jump, day9(13));
            evaluator.evaluateAll(t);
            assertThat(dispatcher.dispatchDue(t)).isEqualTo(1);
            assertThat(dispatcher.dispatchDue(t.plus(1, ChronoUnit.DAYS))).isZero();
            assertThat(receiver.received).extracting(Received::path).containsExactly("/hook");
            JsonNode log = body(call(mvc.get().uri("/api/v1/sites/{id}/alerts/deliveries", jump.id())));
            assertThat(log.get(0).get("outcome").stringValue()).isEqualTo("refused");
            assertThat(log.get(0).get("error").stringValue()).contains("redirect to another host");
            assertThat(log.get(0).get("status").stringValue()).isEqualTo("failed");
        }
    }

    @Test
    void siteRolesApply() {
        String name = "editor" + System.nanoTime();
        accounts.create(name, "editor-password-1", false);
        access.grantUser(jump.id(), name, com.example.foldline.accounts.SiteRole.EDITOR);
        var editor = httpBasic(name, "editor-password-1");
        assertThat(mvc.post().uri("/api/v1/sites/{id}/alerts/rules", jump.id()).with(editor)
                .contentType(MediaType.APPLICATION_JSON)
                .content("{\"name\": \"x\", \"condition\": {\"type\": \"above\", \"threshold\": 0.9}}"))
                .hasStatus(HttpStatus.CREATED);
        // webhooks make the server send requests: site admins only
        assertThat(mvc.post().uri("/api/v1/sites/{id}/alerts/webhooks", jump.id()).with(editor)
                .contentType(MediaType.APPLICATION_JSON).content("{\"name\":\"x\",\"url\":\"http://127.0.0.1/\"}"))
                .hasStatus(HttpStatus.FORBIDDEN);
        // no role on the flat site: nothing there, and the bell does not count it
        assertThat(mvc.get().uri("/api/v1/sites/{id}/alerts/rules", flat.id()).with(editor))
                .hasStatus(HttpStatus.FORBIDDEN);
        assertThat(mvc.get().uri("/api/v1/alerts/unread").with(editor)).hasStatusOk().bodyJson()
                .extractingPath("$.total").isEqualTo(0);
    }

    @Test
    void webhookTargetsOutsideTheAllowListAreRefused() {
        MvcTestResult r = call(mvc.post().uri("/api/v1/sites/{id}/alerts/webhooks", jump.id())
                .contentType(MediaType.APPLICATION_JSON)
                .content("{\"name\":\"x\",\"url\":\"http://203.0.113.10/hook\"}"));
        assertThat(r).hasStatus(HttpStatus.BAD_REQUEST);
        assertThat(body(r).get("errors").get(0).get("message").stringValue()).contains("allowed-hosts");
        assertThat(call(mvc.post().uri("/api/v1/sites/{id}/alerts/webhooks", jump.id())
                .contentType(MediaType.APPLICATION_JSON).content("{\"name\":\"x\",\"url\":\"gopher://127.0.0.1/\"}")))
                .hasStatus(HttpStatus.BAD_REQUEST);
    }

    @Test
    void emailGoesOutOverSmtp() throws Exception {
        GreenMail smtp = AlertMailServer.get();
        smtp.purgeEmailFromAllMailboxes();
        rules.create(jump.id(), jumpRule("Mailed", null, null, List.of("desk@gazette.example")));
        Instant t = at(jump, day9(13));
        evaluator.evaluateAll(t);
        assertThat(dispatcher.dispatchDue(t)).isEqualTo(1);
        assertThat(smtp.waitForIncomingEmail(5000, 1)).isTrue();
        MimeMessage message = smtp.getReceivedMessages()[0];
        assertThat(message.getAllRecipients()[0].toString()).isEqualTo("desk@gazette.example");
        assertThat(message.getSubject()).isEqualTo("[Foldline] Raised: Mailed on Harbour Gazette");
        String text = (String) message.getContent();   // decoded (the wire form is quoted-printable)
        assertThat(text).contains("two-proportion z test").contains("/?screen=health&site=" + jump.id() + "&");
    }

    @Test
    void theBellCountsUnreadAndMutingKeepsNoticesQuiet() {
        RuleView rule = rules.create(jump.id(), jumpRule("Bell", null, null, null));
        String base = "/api/v1/sites/" + jump.id() + "/alerts";
        evaluator.evaluateAll(at(jump, day9(13)));
        assertThat(call(mvc.get().uri(base + "/notifications/unread-count"))).bodyJson()
                .extractingPath("$.unread").isEqualTo(1);
        assertThat(call(mvc.get().uri("/api/v1/alerts/unread"))).bodyJson()
                .extractingPath("$.bySite." + jump.id()).isEqualTo(1);
        JsonNode list = body(call(mvc.get().uri(base + "/notifications?unread=true")));
        assertThat(list).hasSize(1);
        long id = list.get(0).get("id").asLong();
        assertThat(call(mvc.post().uri(base + "/notifications/" + id + "/acknowledge"))).bodyJson()
                .extractingPath("$.unread").isEqualTo(0);
        assertThat(body(call(mvc.get().uri(base + "/notifications"))).get(0).get("acknowledgedBy").stringValue())
                .isEqualTo("admin");
        // muted: the recovery is kept in the app but not counted and not sent
        assertThat(call(mvc.put().uri(base + "/rules/" + rule.id() + "/mute").contentType(MediaType.APPLICATION_JSON)
                .content("{\"until\": \"" + Instant.now().plus(1, ChronoUnit.DAYS) + "\"}"))).hasStatusOk();
        evaluator.evaluateAll(at(jump, day9(15)));
        JsonNode all = body(call(mvc.get().uri(base + "/notifications")));
        assertThat(all).hasSize(2);
        assertThat(all.get(0).get("kind").stringValue()).isEqualTo("CLEARED");
        assertThat(all.get(0).get("muted").asBoolean()).isTrue();
        assertThat(call(mvc.get().uri(base + "/notifications/unread-count"))).bodyJson()
                .extractingPath("$.unread").isEqualTo(0);
    }

    @Test
    void suggestionsFindTheJumpAndBecomeARule() {
        MvcTestResult r = call(mvc.get().uri("/api/v1/sites/{id}/alerts/suggestions?days=8&to=2026-11-09",
                jump.id()));
        assertThat(r).hasStatusOk();
        JsonNode answer = body(r);
        assertThat(answer.get("method").stringValue()).contains("CUSUM");
        JsonNode s = answer.get("suggestions");
        assertThat(s).hasSize(1);
        assertThat(s.get(0).get("direction").stringValue()).isEqualTo("up");
        assertThat(s.get(0).get("startedAt").stringValue()).isEqualTo("2026-11-09T12:00:00");
        assertThat(s.get(0).get("expectedRate").asDouble()).isEqualTo(0.4);
        JsonNode suggested = s.get(0).get("suggestedRule");
        assertThat(call(mvc.post().uri("/api/v1/sites/{id}/alerts/rules", jump.id())
                .contentType(MediaType.APPLICATION_JSON).content(suggested.toString())))
                .hasStatus(HttpStatus.CREATED);
        assertThat(body(call(mvc.get().uri("/api/v1/sites/{id}/alerts/suggestions?days=8&to=2026-11-09",
                flat.id()))).get("suggestions")).isEmpty();
        assertThat(call(mvc.get().uri("/api/v1/sites/{id}/alerts/suggestions?days=2&colour=red", jump.id())))
                .hasStatus(HttpStatus.BAD_REQUEST);
    }
}

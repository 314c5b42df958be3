package com.example.foldline.alerts;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.time.Duration;
import java.time.Instant;
import java.time.LocalDate;
import java.time.LocalDateTime;
import java.time.ZonedDateTime;
import java.util.ArrayList;
import java.util.Collections;
import java.util.List;
import java.util.Map;

import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.TestInstance;
import org.springframework.beans.factory.annotation.Autowired;
import org.springframework.http.MediaType;
import org.springframework.jdbc.core.simple.JdbcClient;
import org.springframework.test.context.DynamicPropertyRegistry;
import org.springframework.test.context.DynamicPropertySource;
import org.springframework.test.web.servlet.assertj.MockMvcTester;

import com.example.foldline.alerts.Evaluation.Verdict;
import com.example.foldline.sessions.Sessionizer;
import com.example.foldline.sites.NewIngestKey;
import com.example.foldline.sites.Site;
import com.example.foldline.sites.SiteSettings;
import com.example.foldline.sites.Sites;
import com.example.foldline.support.Events;

import tools.jackson.databind.JsonNode;
import tools.jackson.databind.ObjectMapper;

/**
 * Issue #7: alert rules on seeded data, run on H2 and PostgreSQL by the subclasses. Three sites in Europe/Berlin
 * (UTC+1 in November, so local hours differ from UTC), sessions seeded through the ingest API for the local hours
 * 12, 13 and 14 of 2026-11-02 … 2026-11-09:
 * <ul>
 * <li>jump: 200 sessions an hour at 40 % bounce, except 2026-11-09 12:00–13:00 at 60 % (120 of 200);</li>
 * <li>flat: the same without the jump (80 of 200 on 2026-11-09 too);</li>
 * <li>thin: 30 sessions an hour at 40 %, and 15 of 30 (50 %) on 2026-11-09 12:00–13:00.</li>
 * </ul>
 * A one-hour window with the trailing 7-day baseline: for the window ending 2026-11-09 13:00 on the jump site,
 * 120/200 against 560/1400. SciPy 1.17.1 {@code chi2_contingency([[120,80],[560,840]], correction=False)}: χ² =
 * 28.6445012788, so z = 5.3520557993 and the one-sided p = 4.34802863439e-08; for the thin site
 * {@code [[15,15],[84,126]]}: z = 1.0407555654, one-sided p = 0.148994503699.
 */
@TestInstance(TestInstance.Lifecycle.PER_CLASS)
abstract class AlertsContract {

    static final ZonedDateTime NOW_REAL = ZonedDateTime.now();
    static final LocalDate DAY9 = LocalDate.of(2026, 11, 9);

    @DynamicPropertySource
    static void mail(DynamicPropertyRegistry registry) {
        registry.add("spring.mail.host", () -> "127.0.0.1");
        registry.add("spring.mail.port", () -> AlertMailServer.get().getSmtp().getPort());
    }

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
    AlertRules rules;
    @Autowired
    AlertEvaluator evaluator;
    @Autowired
    DeliveryDispatcher dispatcher;
    @Autowired
    AlertHistoryRetention retention;

    Site jump;
    Site flat;
    Site thin;

    @BeforeAll
    void seed() {
        jump = seededSite("Harbour Gazette", 200, 80, 120);
        flat = seededSite("Valley Courier", 200, 80, 80);
        thin = seededSite("Lantern Weekly", 30, 12, 15);
    }

    @BeforeEach
    void noRulesFromOtherTests() {
        // the evaluator judges every enabled rule in the database, so each test starts without others' rules
        jdbc.sql("DELETE FROM alert_rule").update();
        jdbc.sql("DELETE FROM alert_webhook").update();
    }

    private Site seededSite(String name, int sessions, int bounces, int bouncesOnDay9At12) {
        Site site = sites.create(new SiteSettings(name, "s" + System.nanoTime() + ".example", "Europe/Berlin", "EUR",
                null, null, 3660));
        NewIngestKey key = sites.createIngestKey(site.id(), "test");
        for (LocalDate day = LocalDate.of(2026, 11, 2); !day.isAfter(DAY9); day = day.plusDays(1)) {
            Events events = new Events();
            for (int hour = 12; hour <= 14; hour++) {
                int b = day.equals(DAY9) && hour == 12 ? bouncesOnDay9At12 : bounces;
                ZonedDateTime start = day.atTime(hour, 0).atZone(site.timezone());
                for (int i = 0; i < sessions; i++) {
                    String id = day + "-" + hour + "-" + i;
                    Instant ts = start.toInstant().plusSeconds(10L * i);
                    events.pageview("a" + id, ts.toString(), "v" + id, "/story", 3, "phone", "search", "DE");
                    if (i >= b) {
                        events.pageview("b" + id, ts.plusSeconds(60).toString(), "v" + id, "/next", 3, "phone",
                                "search", "DE");
                    }
                }
            }
            assertThat(mvc.post().uri("/api/v1/sites/{id}/events", site.id())
                    .header("Authorization", "Bearer " + key.key())
                    .contentType(MediaType.parseMediaType("application/x-ndjson")).content(events.ndjson()))
                    .hasStatusOk().bodyJson().extractingPath("$.rejectedCount").isEqualTo(0);
        }
        sessionizer.run(site.id());
        return site;
    }

    /** When the window ending at local {@code end} is first complete: 30 min session timeout + 15 min margin. */
    static Instant at(Site site, LocalDateTime end) {
        return end.atZone(site.timezone()).toInstant().plus(Duration.ofMinutes(45));
    }

    static LocalDateTime day9(int hour) {
        return DAY9.atTime(hour, 0);
    }

    static RuleRequest jumpRule(String name, Integer minSessions, List<Long> webhooks, List<String> emails) {
        return new RuleRequest(name, "bounceRate", Map.of(), "PT1H",
                new RuleRequest.Condition("jump", null, "up", 5.0, "trailingDays", 7),
                new RuleRequest.Guard(minSessions, 0.95, "zTest"), "PT6H", "PT2H", webhooks, emails, true);
    }

    List<StateChange> history(Site site, long ruleId) {
        List<StateChange> h = new ArrayList<>(rules.history(site.id(), ruleId, 1000));
        Collections.reverse(h);
        return h;
    }

    List<String> notificationKinds(Site site) {
        return jdbc.sql("SELECT kind FROM alert_notification WHERE site_id = :site ORDER BY id")
                .param("site", site.id()).query(String.class).list();
    }

    @Test
    void firesAndClearsOnAKnownJump() {
        RuleView rule = rules.create(jump.id(), jumpRule("Bounce jump", null, null, null));
        evaluator.evaluateAll(at(jump, day9(13)));
        RuleView raised = rules.get(jump.id(), rule.id());
        assertThat(raised.state()).isEqualTo(RuleState.RAISED);
        assertThat(raised.lastEvaluation().verdict()).isEqualTo(Verdict.BREACH);
        evaluator.evaluateAll(at(jump, day9(14)));
        assertThat(rules.get(jump.id(), rule.id()).state()).isEqualTo(RuleState.EASING);
        evaluator.evaluateAll(at(jump, day9(15)));
        assertThat(rules.get(jump.id(), rule.id()).state()).isEqualTo(RuleState.CALM);

        List<StateChange> h = history(jump, rule.id());
        assertThat(h).extracting(c -> c.from() + ">" + c.to() + ":" + c.notice())
                .containsExactly("CALM>RAISED:RAISED", "RAISED>EASING:null", "EASING>CALM:CLEARED");
        StateChange up = h.get(0);
        assertThat(up.windowEnd()).isEqualTo(day9(13));
        assertThat(up.observed()).isEqualTo(0.6);
        assertThat(up.baseline()).isEqualTo(0.4);
        assertThat(up.sessions()).isEqualTo(200);
        assertThat(up.baselineSessions()).isEqualTo(1400);
        assertThat(up.testMethod()).contains("two-proportion z test");
        // SciPy 1.17.1 chi2_contingency([[120,80],[560,840]], correction=False): one-sided p = p / 2
        assertThat(up.pValue()).isCloseTo(4.34802863439e-08, within(1e-17));
        assertThat(up.evaluation().test().statistic()).isCloseTo(5.3520557993, within(1e-9));
        assertThat(up.evaluation().change()).isCloseTo(20.0, within(1e-9));

        assertThat(notificationKinds(jump)).containsExactly("RAISED", "CLEARED");
        JsonNode payload = json.readTree(jdbc.sql("SELECT payload FROM alert_notification WHERE site_id = :site "
                + "AND kind = 'RAISED'").param("site", jump.id()).query(String.class).single());
        assertThat(payload.get("type").stringValue()).isEqualTo("alert.raised");
        assertThat(payload.get("rule").get("name").stringValue()).isEqualTo("Bounce jump");
        assertThat(payload.get("site").get("id").asLong()).isEqualTo(jump.id());
        assertThat(payload.get("window").get("observed").asDouble()).isEqualTo(0.6);
        assertThat(payload.get("window").get("start").stringValue()).isEqualTo("2026-11-09T12:00");
        assertThat(payload.get("window").get("startUtc").stringValue()).isEqualTo("2026-11-09T11:00:00Z");
        assertThat(payload.get("baseline").get("observed").asDouble()).isEqualTo(0.4);
        assertThat(payload.get("test").get("passed").asBoolean()).isTrue();
        assertThat(payload.get("link").stringValue()).isEqualTo("http://localhost:8080/?screen=health&site="
                + jump.id() + "&from=2026-11-03&to=2026-11-09&metric=bounceRate&grain=hour");
    }

    @Test
    void historyOlderThanTheRetentionPeriodIsDeletedWhileTheRuleKeepsItsState() {
        RuleView rule = rules.create(jump.id(), jumpRule("Bounce jump", null, null, null));
        evaluator.evaluateAll(at(jump, day9(13)));
        assertThat(history(jump, rule.id())).hasSize(1);
        assertThat(notificationKinds(jump)).containsExactly("RAISED");
        Instant recorded = jdbc.sql("SELECT MAX(changed_at) FROM alert_state_change WHERE rule_id = :rule")
                .param("rule", rule.id()).query(java.sql.Timestamp.class).single().toInstant();
        Duration kept = Duration.ofDays(400);   // the default of foldline.alerts.history-retention

        assertThat(retention.purge(recorded.plus(kept).minusSeconds(60)))
                .isEqualTo(new AlertHistoryRetention.Purged(0, 0));
        assertThat(history(jump, rule.id())).hasSize(1);

        assertThat(retention.purge(recorded.plus(kept).plusSeconds(60)))
                .isEqualTo(new AlertHistoryRetention.Purged(1, 1));
        assertThat(history(jump, rule.id())).isEmpty();
        assertThat(notificationKinds(jump)).isEmpty();
        assertThat(rules.get(jump.id(), rule.id()).state()).isEqualTo(RuleState.RAISED);
        // and it carries on from that state: the recovery is still announced once
        evaluator.evaluateAll(at(jump, day9(14)));
        evaluator.evaluateAll(at(jump, day9(15)));
        assertThat(rules.get(jump.id(), rule.id()).state()).isEqualTo(RuleState.CALM);
        assertThat(notificationKinds(jump)).containsExactly("CLEARED");
    }

    @Test
    void doesNotFireWithoutTheJump() {
        RuleView rule = rules.create(flat.id(), jumpRule("Bounce jump", null, null, null));
        for (int hour = 13; hour <= 15; hour++) {
            evaluator.evaluateAll(at(flat, day9(hour)));
        }
        RuleView after = rules.get(flat.id(), rule.id());
        assertThat(after.state()).isEqualTo(RuleState.CALM);
        assertThat(after.lastEvaluation().verdict()).isEqualTo(Verdict.NORMAL);
        assertThat(after.lastWindowEnd()).isEqualTo(day9(15));
        assertThat(history(flat, rule.id())).isEmpty();
        assertThat(notificationKinds(flat)).isEmpty();
    }

    @Test
    void guardHoldsBackAJumpOnTooFewSessions() {
        RuleView guarded = rules.create(thin.id(), jumpRule("Thin guard", 200, null, null));
        RuleView tested = rules.create(thin.id(), jumpRule("Thin test", 20, null, null));
        evaluator.evaluateAll(at(thin, day9(13)));
        Evaluation tooFew = rules.get(thin.id(), guarded.id()).lastEvaluation();
        assertThat(tooFew.verdict()).isEqualTo(Verdict.THIN);
        assertThat(tooFew.reason()).contains("only 30 sessions");
        assertThat(tooFew.change()).isNull();
        // enough sessions for the smaller minimum: the 10-point rise is there, but the z test is not confident
        Evaluation notSure = rules.get(thin.id(), tested.id()).lastEvaluation();
        assertThat(notSure.verdict()).isEqualTo(Verdict.UNCONFIRMED);
        assertThat(notSure.change()).isCloseTo(10.0, within(1e-9));
        // SciPy 1.17.1 chi2_contingency([[15,15],[84,126]], correction=False): one-sided p = 0.148994503699
        assertThat(notSure.test().pValue()).isCloseTo(0.148994503699, within(1e-11));
        assertThat(rules.get(thin.id(), guarded.id()).state()).isEqualTo(RuleState.CALM);
        assertThat(rules.get(thin.id(), tested.id()).state()).isEqualTo(RuleState.CALM);
        assertThat(notificationKinds(thin)).isEmpty();
    }

    @Test
    void catchesUpAfterDowntimeWithoutDuplicateNotifications() {
        RuleView rule = rules.create(jump.id(), jumpRule("Catch-up", null, null, null));
        evaluator.evaluateAll(at(jump, day9(10)));
        assertThat(rules.get(jump.id(), rule.id()).lastWindowEnd()).isEqualTo(day9(10));
        // down from 11:00 to 18:00: the next run judges the eight missed windows in order
        EvaluationReport report = evaluator.evaluateAll(at(jump, day9(18)));
        assertThat(report.windows()).isEqualTo(8);
        assertThat(report.transitions()).isEqualTo(3);
        assertThat(report.notifications()).isEqualTo(2);
        assertThat(evaluator.evaluateAll(at(jump, day9(18))).windows()).isZero();
        assertThat(evaluator.evaluateAll(at(jump, day9(19))).notifications()).isZero();
        assertThat(notificationKinds(jump)).containsExactly("RAISED", "CLEARED");
        assertThat(history(jump, rule.id())).extracting(StateChange::windowEnd)
                .containsExactly(day9(13), day9(14), day9(15));
    }

    @Test
    void backTestEqualsTheLiveEvaluatorReplayedHourByHour() {
        RuleRequest request = jumpRule("Replay", null, null, null);
        var answer = mvc.post().uri("/api/v1/sites/{id}/alerts/backtest", jump.id())
                .with(org.springframework.security.test.web.servlet.request.SecurityMockMvcRequestPostProcessors
                        .httpBasic("admin", "admin-secret"))
                .contentType(MediaType.APPLICATION_JSON)
                .content(json.writeValueAsString(new BacktestRequest(request, LocalDate.of(2026, 11, 2), DAY9)))
                .exchange();
        assertThat(answer).hasStatusOk();
        BacktestResult backtest = json.readValue(answer.getResponse().getContentAsByteArray(), BacktestResult.class);
        assertThat(backtest.windows()).isEqualTo(8 * 24);
        assertThat(backtest.raised()).isEqualTo(1);
        assertThat(backtest.cleared()).isEqualTo(1);
        assertThat(backtest.points()).hasSize(8 * 24);

        RuleView live = rules.create(jump.id(), request);
        for (LocalDateTime end : Windows.range(LocalDate.of(2026, 11, 2).atStartOfDay(), DAY9.plusDays(1)
                .atStartOfDay())) {
            evaluator.evaluateAll(at(jump, end));
        }
        List<String> replayed = history(jump, live.id()).stream()
                .map(c -> c.windowEnd() + " " + c.from() + ">" + c.to() + " " + c.notice() + " " + c.observed() + " "
                        + c.baseline() + " " + c.sessions() + " " + c.pValue())
                .toList();
        List<String> backtested = backtest.changes().stream()
                .map(c -> c.windowEnd() + " " + c.from() + ">" + c.to() + " " + c.notice() + " " + c.observed() + " "
                        + c.baseline() + " " + c.sessions() + " " + c.pValue())
                .toList();
        assertThat(replayed).hasSize(3).isEqualTo(backtested);
        assertThat(rules.get(jump.id(), live.id()).lastWindowEnd()).isEqualTo(backtest.to());
    }
}

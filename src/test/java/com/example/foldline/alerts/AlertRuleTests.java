package com.example.foldline.alerts;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatIllegalStateException;

import java.time.LocalDateTime;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;

import org.junit.jupiter.api.Test;

import com.example.foldline.alerts.AlertRule.Notice;
import com.example.foldline.alerts.Evaluation.Verdict;

/** Issue #7: the state transitions of {@link AlertRule} (docs/alerts.md, "States"). */
class AlertRuleTests {

    private static final LocalDateTime T0 = LocalDateTime.of(2026, 11, 9, 13, 0);

    private static AlertRule rule(String cooldown, String clearsAfter) {
        return AlertRule.draft(1, RuleDefinition.from(new RuleRequest("r", null, Map.of(), "PT1H",
                new RuleRequest.Condition("jump", null, null, 5.0, null, null), null, cooldown, clearsAfter, null,
                null, null)));
    }

    @Test
    void aRuleDescribesItselfInPeoplesWords() {
        var segment = new java.util.LinkedHashMap<String, List<String>>();
        segment.put("device", List.of("desktop", "phone"));
        RuleDefinition above = RuleDefinition.from(new RuleRequest("r", "bounceRate", segment, "PT48H",
                new RuleRequest.Condition("above", 0.315, null, null, null, null), null, null, null, null, null, null));
        assertThat(above.describe()).isEqualTo("Bounce rate over the last 2 days (device: desktop, phone) above 31.5%");
        RuleDefinition jump = RuleDefinition.from(new RuleRequest("r", "sessionRpm", Map.of(), "PT1H",
                new RuleRequest.Condition("jump", null, "down", 10.0, null, null), null, null, null, null, null, null));
        assertThat(jump.describe()).isEqualTo("Session RPM over the last 1 hour falls by at least 10 % against the "
                + "same hours on the previous 7 days");
    }

    private static Evaluation at(int hour, Verdict verdict) {
        LocalDateTime end = T0.plusHours(hour);
        return new Evaluation(end.minusHours(1), end, verdict, verdict.name(), 0.5, 0.4, 500L, 3500L, 250, 500, 10.0,
                "percentage points", null, "test");
    }

    /** Feeds verdicts hour by hour; returns "hour:FROM>TO(notice)" for each state change. */
    private static List<String> feed(AlertRule rule, Verdict... verdicts) {
        List<String> out = new ArrayList<>();
        AlertRule r = rule;
        for (int h = 0; h < verdicts.length; h++) {
            AlertRule.Step step = r.judge(at(h, verdicts[h]));
            r = step.rule();
            assertThat(r.status().lastWindowEnd()).isEqualTo(T0.plusHours(h));
            Transition t = step.transition();
            if (t != null) {
                out.add(h + ":" + t.from() + ">" + t.to() + (t.notice() == null ? "" : "(" + t.notice() + ")"));
            }
        }
        return out;
    }

    @Test
    void oneJumpGivesOneRaiseAndOneRecovery() {
        Verdict b = Verdict.BREACH;
        Verdict n = Verdict.NORMAL;
        assertThat(feed(rule("PT6H", "PT2H"), n, b, b, b, n, n, n))
                .containsExactly("1:CALM>RAISED(RAISED)", "4:RAISED>EASING", "5:EASING>CALM(CLEARED)");
    }

    @Test
    void aRelapseWhileEasingSendsNothing() {
        Verdict b = Verdict.BREACH;
        Verdict n = Verdict.NORMAL;
        assertThat(feed(rule("PT6H", "PT2H"), b, n, b, n, n))
                .containsExactly("0:CALM>RAISED(RAISED)", "1:RAISED>EASING", "2:EASING>RAISED", "3:RAISED>EASING",
                        "4:EASING>CALM(CLEARED)");
    }

    @Test
    void thinAndUnconfirmedWindowsNeitherRaiseNorClear() {
        Verdict t = Verdict.THIN;
        Verdict u = Verdict.UNCONFIRMED;
        assertThat(feed(rule("PT6H", "PT2H"), t, u, t, u)).isEmpty();
        // raised, then thin hours: the rule holds; time passes, so the first normal hour after 2 h clears it
        assertThat(feed(rule("PT6H", "PT2H"), Verdict.BREACH, t, u, Verdict.NORMAL))
                .containsExactly("0:CALM>RAISED(RAISED)", "3:RAISED>CALM(CLEARED)");
    }

    @Test
    void clearsAfterZeroCalmsAtTheFirstNormalWindow() {
        assertThat(feed(rule("PT6H", "PT0S"), Verdict.BREACH, Verdict.NORMAL))
                .containsExactly("0:CALM>RAISED(RAISED)", "1:RAISED>CALM(CLEARED)");
    }

    @Test
    void coolDownKeepsASecondRaiseQuietAndItsRecoveryToo() {
        Verdict b = Verdict.BREACH;
        Verdict n = Verdict.NORMAL;
        // raise at 0 (notified), calm at 1, raise again at 2: within 6 h of the notified raise, so no notice, and
        // no recovery notice for that quiet episode; a raise at 8 (8 h after the notified one) is notified again
        assertThat(feed(rule("PT6H", "PT0S"), b, n, b, n, n, n, n, n, b))
                .containsExactly("0:CALM>RAISED(RAISED)", "1:RAISED>CALM(CLEARED)", "2:CALM>RAISED",
                        "3:RAISED>CALM", "8:CALM>RAISED(RAISED)");
    }

    @Test
    void pauseAndResume() {
        AlertRule raised = rule("PT6H", "PT2H").judge(at(0, Verdict.BREACH)).rule();
        AlertRule.Step paused = raised.pause();
        assertThat(paused.transition().to()).isEqualTo(RuleState.PAUSED);
        assertThat(paused.transition().notice()).isNull();
        assertThat(paused.rule().enabled()).isFalse();
        assertThatIllegalStateException().isThrownBy(() -> paused.rule().judge(at(1, Verdict.NORMAL)));
        AlertRule.Step resumed = paused.rule().resume();
        assertThat(resumed.rule().status().state()).isEqualTo(RuleState.CALM);
        assertThat(resumed.rule().status().lastWindowEnd()).isNull();  // no catch-up over the pause
        assertThat(resumed.rule().status().lastRaiseNotice()).isEqualTo(T0);  // the cool-down still counts
        assertThat(resumed.rule().judge(at(1, Verdict.BREACH)).transition().notice()).isNull();
        assertThat(resumed.rule().judge(at(7, Verdict.BREACH)).transition().notice()).isEqualTo(Notice.RAISED);
    }
}

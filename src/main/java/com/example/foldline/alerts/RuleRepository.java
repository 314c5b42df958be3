package com.example.foldline.alerts;

import java.sql.ResultSet;
import java.sql.SQLException;
import java.sql.Timestamp;
import java.sql.Types;
import java.time.Duration;
import java.time.Instant;
import java.time.LocalDateTime;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;

import org.springframework.jdbc.core.namedparam.MapSqlParameterSource;
import org.springframework.jdbc.core.namedparam.NamedParameterJdbcOperations;
import org.springframework.jdbc.core.simple.JdbcClient;
import org.springframework.jdbc.support.GeneratedKeyHolder;
import org.springframework.stereotype.Repository;

import com.example.foldline.alerts.AlertRule.Status;
import com.example.foldline.alerts.RuleDefinition.BaselineKind;
import com.example.foldline.alerts.RuleDefinition.ConditionKind;
import com.example.foldline.alerts.RuleDefinition.Direction;
import com.example.foldline.alerts.RuleDefinition.GuardMethod;
import com.example.foldline.metrics.Metric;

import tools.jackson.core.type.TypeReference;
import tools.jackson.databind.ObjectMapper;

/** Alert rules, their webhooks and their state history. */
@Repository
class RuleRepository {

    private static final String COLUMNS = """
            id, site_id, name, metric, segment, window_hours, condition_kind, threshold, direction, baseline_kind,
            baseline_periods, min_change, min_sessions, confidence, guard_method, cooldown_minutes,
            clears_after_minutes, email_to, enabled, state, state_since, last_window_end, last_breach_end,
            last_raise_notice, episode_notified, muted_until, last_evaluation, last_evaluated_at, created_at,
            updated_at""";
    private static final TypeReference<Map<String, List<String>>> SEGMENT = new TypeReference<>() {
    };

    /** A rule as stored, with what the API shows besides the aggregate. */
    record Stored(AlertRule rule, String lastEvaluation, Instant lastEvaluatedAt, Instant createdAt,
                  Instant updatedAt) {
    }

    private final JdbcClient jdbc;
    private final NamedParameterJdbcOperations batchJdbc;
    private final ObjectMapper json;

    RuleRepository(JdbcClient jdbc, NamedParameterJdbcOperations batchJdbc, ObjectMapper json) {
        this.jdbc = jdbc;
        this.batchJdbc = batchJdbc;
        this.json = json;
    }

    long insert(long siteId, RuleDefinition d, List<String> emails, boolean enabled, Instant now) {
        GeneratedKeyHolder keys = new GeneratedKeyHolder();
        jdbc.sql("""
                        INSERT INTO alert_rule (site_id, name, metric, segment, window_hours, condition_kind, threshold,
                               direction, baseline_kind, baseline_periods, min_change, min_sessions, confidence,
                               guard_method, cooldown_minutes, clears_after_minutes, email_to, enabled, state,
                               episode_notified, created_at, updated_at)
                        VALUES (:site, :name, :metric, :segment, :window, :condition, :threshold, :direction,
                                :baseline, :periods, :by, :minSessions, :confidence, :guard, :cooldown, :clearsAfter,
                                :emails, :enabled, :state, FALSE, :now, :now)""")
                .param("site", siteId).params(definitionParams(d, emails))
                .param("enabled", enabled).param("state", (enabled ? RuleState.CALM : RuleState.PAUSED).name())
                .param("now", Timestamp.from(now))
                .update(keys, "id");
        return keys.getKey().longValue();
    }

    void updateDefinition(long id, RuleDefinition d, List<String> emails, Instant now) {
        jdbc.sql("""
                        UPDATE alert_rule SET name = :name, metric = :metric, segment = :segment, window_hours = :window,
                               condition_kind = :condition, threshold = :threshold, direction = :direction,
                               baseline_kind = :baseline, baseline_periods = :periods, min_change = :by,
                               min_sessions = :minSessions, confidence = :confidence, guard_method = :guard,
                               cooldown_minutes = :cooldown, clears_after_minutes = :clearsAfter, email_to = :emails,
                               updated_at = :now
                        WHERE id = :id""")
                .param("id", id).params(definitionParams(d, emails)).param("now", Timestamp.from(now)).update();
    }

    private Map<String, Object> definitionParams(RuleDefinition d, List<String> emails) {
        Map<String, Object> p = new HashMap<>();
        p.put("name", d.name());
        p.put("metric", d.metric().apiName());
        p.put("segment", json.writeValueAsString(d.segment()));
        p.put("window", d.windowHours());
        p.put("condition", d.condition().name());
        p.put("threshold", d.threshold());
        p.put("direction", d.direction() == null ? null : d.direction().name());
        p.put("baseline", d.baseline() == null ? null : d.baseline().name());
        p.put("periods", d.baseline() == null ? null : d.baselinePeriods());
        p.put("by", d.by());
        p.put("minSessions", d.minSessions());
        p.put("confidence", d.confidence());
        p.put("guard", d.guard().name());
        p.put("cooldown", d.cooldown().toMinutes());
        p.put("clearsAfter", d.clearsAfter().toMinutes());
        p.put("emails", String.join(",", emails));
        return p;
    }

    void replaceWebhooks(long ruleId, List<Long> webhookIds) {
        jdbc.sql("DELETE FROM alert_rule_webhook WHERE rule_id = :id").param("id", ruleId).update();
        for (long w : webhookIds) {
            jdbc.sql("INSERT INTO alert_rule_webhook (rule_id, webhook_id) VALUES (:rule, :webhook)")
                    .param("rule", ruleId).param("webhook", w).update();
        }
    }

    boolean delete(long siteId, long id) {
        return jdbc.sql("DELETE FROM alert_rule WHERE site_id = :site AND id = :id")
                .param("site", siteId).param("id", id).update() == 1;
    }

    Optional<Stored> find(long siteId, long id) {
        return withWebhooks(jdbc.sql("SELECT " + COLUMNS + " FROM alert_rule WHERE site_id = :site AND id = :id")
                .param("site", siteId).param("id", id).query(this::map).list()).stream().findFirst();
    }

    List<Stored> findBySite(long siteId) {
        return withWebhooks(jdbc.sql("SELECT " + COLUMNS + " FROM alert_rule WHERE site_id = :site ORDER BY id")
                .param("site", siteId).query(this::map).list());
    }

    /** The enabled rules without locking them: a snapshot to plan a run by (webhooks not loaded). */
    List<Stored> enabledSnapshot() {
        return jdbc.sql("SELECT " + COLUMNS + " FROM alert_rule WHERE enabled = TRUE ORDER BY id").query(this::map)
                .list();
    }

    List<Long> webhookIds(long ruleId) {
        return jdbc.sql("SELECT webhook_id FROM alert_rule_webhook WHERE rule_id = :id ORDER BY webhook_id")
                .param("id", ruleId).query(Long.class).list();
    }

    /**
     * Locks enabled rules for evaluation until the transaction ends; leaves out those another evaluator holds (SKIP LOCKED: the other one is already doing this work) or the rule was paused or deleted meanwhile.
     * Its webhooks are not loaded ({@link #webhookIds} when a notice needs them).
     */
    List<Stored> lockForEvaluation(List<Long> ids) {
        return jdbc.sql("SELECT " + COLUMNS + " FROM alert_rule WHERE id IN (:ids) AND enabled = TRUE "
                + "ORDER BY id FOR UPDATE SKIP LOCKED").param("ids", ids).query(this::map).list();
    }

    /** Locks a rule for a change of state by a person, waiting for a running evaluation of it to finish. */
    Optional<Stored> lock(long siteId, long id) {
        return withWebhooks(jdbc.sql("SELECT " + COLUMNS + " FROM alert_rule WHERE site_id = :site AND id = :id "
                + "FOR UPDATE").param("site", siteId).param("id", id).query(this::map).list()).stream().findFirst();
    }

    private static final String SAVE_STATUS = """
            UPDATE alert_rule SET enabled = :enabled, state = :state, state_since = :since,
                   last_window_end = :lastWindow, last_breach_end = :lastBreach,
                   last_raise_notice = :lastNotice, episode_notified = :notified,
                   last_evaluation = COALESCE(:evaluation, last_evaluation),
                   last_evaluated_at = COALESCE(:evaluatedAt, last_evaluated_at), updated_at = :now
            WHERE id = :id""";

    void saveStatus(AlertRule rule, Evaluation last, Instant evaluatedAt, Instant now) {
        jdbc.sql(SAVE_STATUS).paramSource(statusParams(rule, last, evaluatedAt, now)).update();
    }

    /** Saves the state of several rules judged at {@code now}, with each one's newest evaluation, in one batch. */
    void saveStatuses(List<AlertRule> judged, List<Evaluation> last, Instant now) {
        if (judged.isEmpty()) {
            return;
        }
        MapSqlParameterSource[] batch = new MapSqlParameterSource[judged.size()];
        for (int i = 0; i < batch.length; i++) {
            batch[i] = statusParams(judged.get(i), last.get(i), now, now);
        }
        batchJdbc.batchUpdate(SAVE_STATUS, batch);
    }

    private MapSqlParameterSource statusParams(AlertRule rule, Evaluation last, Instant evaluatedAt, Instant now) {
        Status s = rule.status();
        return new MapSqlParameterSource("id", rule.id()).addValue("enabled", rule.enabled())
                .addValue("state", s.state().name())
                .addValue("since", s.stateSince(), Types.TIMESTAMP)
                .addValue("lastWindow", s.lastWindowEnd(), Types.TIMESTAMP)
                .addValue("lastBreach", s.lastBreachEnd(), Types.TIMESTAMP)
                .addValue("lastNotice", s.lastRaiseNotice(), Types.TIMESTAMP)
                .addValue("notified", s.episodeNotified())
                .addValue("evaluation", last == null ? null : json.writeValueAsString(last), Types.VARCHAR)
                .addValue("evaluatedAt", evaluatedAt == null ? null : Timestamp.from(evaluatedAt),
                        Types.TIMESTAMP)
                .addValue("now", Timestamp.from(now));
    }

    void setMutedUntil(long id, Instant until, Instant now) {
        jdbc.sql("UPDATE alert_rule SET muted_until = :until, updated_at = :now WHERE id = :id").param("id", id)
                .param("until", until == null ? null : Timestamp.from(until)).param("now", Timestamp.from(now))
                .update();
    }

    void insertStateChange(Transition t, Instant now) {
        Evaluation e = t.evaluation();
        jdbc.sql("""
                        INSERT INTO alert_state_change (rule_id, site_id, window_end, from_state, to_state, reason,
                               observed, baseline, sessions, baseline_sessions, test_method, p_value, notice, details,
                               changed_at)
                        VALUES (:rule, :site, :windowEnd, :from, :to, :reason, :observed, :baseline, :sessions,
                                :baselineSessions, :method, :p, :notice, :details, :now)""")
                .param("rule", t.ruleId()).param("site", t.siteId()).param("windowEnd", t.windowEnd())
                .param("from", t.from().name()).param("to", t.to().name()).param("reason", cut(t.reason(), 500))
                .param("observed", e == null ? null : e.observed()).param("baseline", e == null ? null : e.baseline())
                .param("sessions", e == null ? null : e.sessions())
                .param("baselineSessions", e == null ? null : e.baselineSessions())
                .param("method", e == null || e.test() == null ? null : e.test().method())
                .param("p", e == null || e.test() == null ? null : e.test().pValue())
                .param("notice", t.notice() == null ? null : t.notice().name())
                .param("details", e == null ? null : json.writeValueAsString(e))
                .param("now", Timestamp.from(now))
                .update();
    }

    List<StateChange> history(long siteId, long ruleId, int limit) {
        return jdbc.sql("""
                        SELECT id, rule_id, window_end, from_state, to_state, reason, observed, baseline, sessions,
                               baseline_sessions, test_method, p_value, notice, details, changed_at
                        FROM alert_state_change WHERE site_id = :site AND rule_id = :rule ORDER BY id DESC LIMIT :limit""")
                .param("site", siteId).param("rule", ruleId).param("limit", limit)
                .query((rs, i) -> new StateChange(rs.getLong("id"), rs.getLong("rule_id"),
                        rs.getObject("window_end", LocalDateTime.class), RuleState.valueOf(rs.getString("from_state")),
                        RuleState.valueOf(rs.getString("to_state")), rs.getString("reason"),
                        (Double) rs.getObject("observed", Double.class), rs.getObject("baseline", Double.class),
                        rs.getObject("sessions", Long.class), rs.getObject("baseline_sessions", Long.class),
                        rs.getString("test_method"), rs.getObject("p_value", Double.class), rs.getString("notice"),
                        readEvaluation(rs.getString("details")), rs.getTimestamp("changed_at").toInstant()))
                .list();
    }

    Evaluation readEvaluation(String text) {
        return text == null ? null : json.readValue(text, Evaluation.class);
    }

    private List<Stored> withWebhooks(List<Stored> rules) {
        if (rules.isEmpty()) {
            return rules;
        }
        Map<Long, List<Long>> hooks = new HashMap<>();
        jdbc.sql("SELECT rule_id, webhook_id FROM alert_rule_webhook WHERE rule_id IN (:ids) ORDER BY webhook_id")
                .param("ids", rules.stream().map(s -> s.rule().id()).toList())
                .query(rs -> {
                    hooks.computeIfAbsent(rs.getLong("rule_id"), k -> new ArrayList<>()).add(rs.getLong("webhook_id"));
                });
        return rules.stream().map(s -> {
            AlertRule r = s.rule();
            AlertRule withHooks = new AlertRule(r.id(), r.siteId(), r.definition(),
                    List.copyOf(hooks.getOrDefault(r.id(), List.of())), r.emails(), r.enabled(), r.status(),
                    r.mutedUntil());
            return new Stored(withHooks, s.lastEvaluation(), s.lastEvaluatedAt(), s.createdAt(), s.updatedAt());
        }).toList();
    }

    private Stored map(ResultSet rs, int row) throws SQLException {
        String baseline = rs.getString("baseline_kind");
        String direction = rs.getString("direction");
        RuleDefinition d = new RuleDefinition(rs.getString("name"), Metric.byName(rs.getString("metric")).orElseThrow(),
                json.readValue(rs.getString("segment"), SEGMENT), rs.getInt("window_hours"),
                ConditionKind.valueOf(rs.getString("condition_kind")), rs.getObject("threshold", Double.class),
                direction == null ? null : Direction.valueOf(direction),
                baseline == null ? null : BaselineKind.valueOf(baseline),
                baseline == null ? 0 : rs.getInt("baseline_periods"), rs.getObject("min_change", Double.class),
                rs.getInt("min_sessions"), rs.getDouble("confidence"), GuardMethod.valueOf(rs.getString("guard_method")),
                Duration.ofMinutes(rs.getLong("cooldown_minutes")), Duration.ofMinutes(rs.getLong("clears_after_minutes")));
        String emailTo = rs.getString("email_to");
        List<String> emails = emailTo == null || emailTo.isEmpty() ? List.of() : Arrays.asList(emailTo.split(","));
        Status status = new Status(RuleState.valueOf(rs.getString("state")),
                rs.getObject("state_since", LocalDateTime.class), rs.getObject("last_window_end", LocalDateTime.class),
                rs.getObject("last_breach_end", LocalDateTime.class),
                rs.getObject("last_raise_notice", LocalDateTime.class), rs.getBoolean("episode_notified"));
        AlertRule rule = new AlertRule(rs.getLong("id"), rs.getLong("site_id"), d, List.of(), List.copyOf(emails),
                rs.getBoolean("enabled"), status, instant(rs.getTimestamp("muted_until")));
        return new Stored(rule, rs.getString("last_evaluation"), instant(rs.getTimestamp("last_evaluated_at")),
                instant(rs.getTimestamp("created_at")), instant(rs.getTimestamp("updated_at")));
    }

    static Instant instant(Timestamp t) {
        return t == null ? null : t.toInstant();
    }

    static String cut(String s, int max) {
        return s == null || s.length() <= max ? s : s.substring(0, max - 1) + "…";
    }

    /** Deletes every rule's state changes recorded before {@code cutoff}; returns how many. */
    int deleteHistoryBefore(Instant cutoff) {
        return jdbc.sql("DELETE FROM alert_state_change WHERE changed_at < :cutoff")
                .param("cutoff", Timestamp.from(cutoff)).update();
    }
}

package com.example.foldline.alerts;

import java.sql.ResultSet;
import java.sql.SQLException;
import java.sql.Timestamp;
import java.time.Instant;
import java.time.LocalDateTime;
import java.util.List;
import java.util.Map;
import java.util.Optional;

import org.springframework.jdbc.core.simple.JdbcClient;
import org.springframework.stereotype.Repository;

/** In-app notifications, their outward deliveries and the log of every delivery attempt. */
@Repository
class NotificationRepository {

    static final String PENDING = "pending";
    static final String SENT = "sent";
    static final String FAILED = "failed";

    /** What the dispatcher needs to make one attempt. */
    record Due(long id, long notificationId, String channel, Long webhookId, String recipient, int attempts,
               String kind, String title, String payload, String url, String secret, boolean webhookEnabled) {
    }

    private final JdbcClient jdbc;

    NotificationRepository(JdbcClient jdbc) {
        this.jdbc = jdbc;
    }

    /** Inserts the notification unless one with this key exists; returns its id only when this call inserted it. */
    Optional<Long> insertOnce(long siteId, long ruleId, String kind, String key, LocalDateTime windowEnd, String title,
                              String payload, boolean muted, Instant now) {
        int inserted = jdbc.sql("""
                        INSERT INTO alert_notification (site_id, rule_id, kind, idempotency_key, window_end, title,
                               payload, muted, created_at)
                        VALUES (:site, :rule, :kind, :key, :windowEnd, :title, :payload, :muted, :now)
                        ON CONFLICT DO NOTHING""")
                .param("site", siteId).param("rule", ruleId).param("kind", kind).param("key", key)
                .param("windowEnd", windowEnd).param("title", RuleRepository.cut(title, 400))
                .param("payload", payload).param("muted", muted).param("now", Timestamp.from(now))
                .update();
        if (inserted == 0) {
            return Optional.empty();
        }
        return Optional.of(jdbc.sql("SELECT id FROM alert_notification WHERE idempotency_key = :key")
                .param("key", key).query(Long.class).single());
    }

    void insertDelivery(long notificationId, String channel, Long webhookId, String recipient, String target,
                        Instant now) {
        jdbc.sql("""
                        INSERT INTO alert_delivery (notification_id, channel, webhook_id, recipient, target, status,
                               attempts, next_attempt_at, created_at)
                        VALUES (:notification, :channel, :webhook, :recipient, :target, 'pending', 0, :now, :now)
                        ON CONFLICT DO NOTHING""")
                .param("notification", notificationId).param("channel", channel).param("webhook", webhookId)
                .param("recipient", recipient).param("target", target).param("now", Timestamp.from(now))
                .update();
    }

    List<Notification> list(long siteId, boolean unreadOnly, int limit) {
        return jdbc.sql("SELECT id, site_id, rule_id, kind, window_end, title, payload, muted, created_at, "
                        + "acknowledged_at, acknowledged_by FROM alert_notification WHERE site_id = :site"
                        + (unreadOnly ? " AND acknowledged_at IS NULL AND muted = FALSE" : "")
                        + " ORDER BY id DESC LIMIT :limit")
                .param("site", siteId).param("limit", limit).query(NotificationRepository::map).list();
    }

    long unread(long siteId) {
        return jdbc.sql("SELECT COUNT(*) FROM alert_notification WHERE site_id = :site AND acknowledged_at IS NULL "
                + "AND muted = FALSE").param("site", siteId).query(Long.class).single();
    }

    /** Unread notifications per site (sites without any are left out). */
    Map<Long, Long> unreadBySite() {
        Map<Long, Long> out = new java.util.TreeMap<>();
        jdbc.sql("SELECT site_id, COUNT(*) AS unread FROM alert_notification WHERE acknowledged_at IS NULL "
                        + "AND muted = FALSE GROUP BY site_id")
                .query(rs -> {
                    out.put(rs.getLong("site_id"), rs.getLong("unread"));
                });
        return out;
    }

    boolean acknowledge(long siteId, long id, String user, Instant now) {
        return jdbc.sql("UPDATE alert_notification SET acknowledged_at = COALESCE(acknowledged_at, :now), "
                        + "acknowledged_by = COALESCE(acknowledged_by, :user) WHERE site_id = :site AND id = :id")
                .param("site", siteId).param("id", id).param("user", user).param("now", Timestamp.from(now))
                .update() == 1;
    }

    int acknowledgeAll(long siteId, String user, Instant now) {
        return jdbc.sql("UPDATE alert_notification SET acknowledged_at = :now, acknowledged_by = :user "
                        + "WHERE site_id = :site AND acknowledged_at IS NULL")
                .param("site", siteId).param("user", user).param("now", Timestamp.from(now)).update();
    }

    /** Pending deliveries whose time has come and that no dispatcher holds. */
    List<Long> due(Instant now, int limit) {
        return jdbc.sql("""
                        SELECT id FROM alert_delivery
                        WHERE status = 'pending' AND next_attempt_at <= :now
                          AND (claimed_until IS NULL OR claimed_until < :now)
                        ORDER BY next_attempt_at, id LIMIT :limit""")
                .param("now", Timestamp.from(now)).param("limit", limit).query(Long.class).list();
    }

    /**
     * Claims a delivery for one attempt (a lease until {@code until}), counting the attempt; false when another
     * dispatcher claimed it first. The lease, not a transaction, guards the HTTP call, which must not hold a lock.
     */
    boolean claim(long id, Instant now, Instant until) {
        return jdbc.sql("""
                        UPDATE alert_delivery SET claimed_until = :until, attempts = attempts + 1
                        WHERE id = :id AND status = 'pending' AND next_attempt_at <= :now
                          AND (claimed_until IS NULL OR claimed_until < :now)""")
                .param("id", id).param("now", Timestamp.from(now)).param("until", Timestamp.from(until))
                .update() == 1;
    }

    Due load(long id) {
        return jdbc.sql("""
                        SELECT d.id, d.notification_id, d.channel, d.webhook_id, d.recipient, d.attempts, n.kind, n.title,
                               n.payload, w.url, w.secret, w.enabled
                        FROM alert_delivery d JOIN alert_notification n ON n.id = d.notification_id
                             LEFT JOIN alert_webhook w ON w.id = d.webhook_id
                        WHERE d.id = :id""")
                .param("id", id)
                .query((rs, i) -> new Due(rs.getLong("id"), rs.getLong("notification_id"), rs.getString("channel"),
                        rs.getObject("webhook_id", Long.class), rs.getString("recipient"), rs.getInt("attempts"),
                        rs.getString("kind"), rs.getString("title"), rs.getString("payload"), rs.getString("url"),
                        rs.getString("secret"), rs.getBoolean("enabled")))
                .single();
    }

    void logAttempt(long deliveryId, int attempt, Instant at, DeliveryAttempt a) {
        jdbc.sql("""
                        INSERT INTO alert_delivery_attempt (delivery_id, attempt, attempted_at, outcome, status_code,
                               error, duration_ms)
                        VALUES (:delivery, :attempt, :at, :outcome, :status, :error, :duration)""")
                .param("delivery", deliveryId).param("attempt", attempt).param("at", Timestamp.from(at))
                .param("outcome", a.outcome()).param("status", a.statusCode())
                .param("error", RuleRepository.cut(a.error(), 1000)).param("duration", a.durationMs())
                .update();
    }

    void finish(long id, String status, Instant now) {
        jdbc.sql("UPDATE alert_delivery SET status = :status, finished_at = :now, claimed_until = NULL WHERE id = :id")
                .param("id", id).param("status", status).param("now", Timestamp.from(now)).update();
    }

    void retryAt(long id, Instant next) {
        jdbc.sql("UPDATE alert_delivery SET next_attempt_at = :next, claimed_until = NULL WHERE id = :id")
                .param("id", id).param("next", Timestamp.from(next)).update();
    }

    /** The attempt log of a site's deliveries, newest first; optionally of one webhook. */
    List<DeliveryLogEntry> attempts(long siteId, Long webhookId, int limit) {
        return jdbc.sql("""
                        SELECT d.id AS delivery_id, d.notification_id, d.target, d.status, a.attempt, a.attempted_at,
                               a.outcome, a.status_code, a.error, a.duration_ms
                        FROM alert_delivery_attempt a JOIN alert_delivery d ON d.id = a.delivery_id
                             JOIN alert_notification n ON n.id = d.notification_id
                        WHERE n.site_id = :site""" + (webhookId == null ? "" : " AND d.webhook_id = :webhook")
                        + " ORDER BY a.id DESC LIMIT :limit")
                .param("site", siteId).param("webhook", webhookId == null ? -1L : webhookId).param("limit", limit)
                .query((rs, i) -> new DeliveryLogEntry(rs.getLong("delivery_id"), rs.getLong("notification_id"),
                        rs.getString("target"), rs.getString("status"), rs.getInt("attempt"),
                        rs.getTimestamp("attempted_at").toInstant(), rs.getString("outcome"),
                        rs.getObject("status_code", Integer.class), rs.getString("error"), rs.getLong("duration_ms")))
                .list();
    }

    private static Notification map(ResultSet rs, int row) throws SQLException {
        return new Notification(rs.getLong("id"), rs.getLong("site_id"), rs.getLong("rule_id"), rs.getString("kind"),
                rs.getObject("window_end", LocalDateTime.class), rs.getString("title"), rs.getString("payload"),
                rs.getBoolean("muted"), rs.getTimestamp("created_at").toInstant(),
                RuleRepository.instant(rs.getTimestamp("acknowledged_at")), rs.getString("acknowledged_by"));
    }

    /** Deletes notifications created before {@code cutoff}, their deliveries and attempts with them (cascade). */
    int deleteBefore(Instant cutoff) {
        return jdbc.sql("DELETE FROM alert_notification WHERE created_at < :cutoff")
                .param("cutoff", Timestamp.from(cutoff)).update();
    }
}

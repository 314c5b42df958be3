package com.example.foldline.alerts;

import java.sql.ResultSet;
import java.sql.SQLException;
import java.sql.Timestamp;
import java.time.Instant;
import java.util.List;
import java.util.Optional;

import org.springframework.jdbc.core.simple.JdbcClient;
import org.springframework.jdbc.support.GeneratedKeyHolder;
import org.springframework.stereotype.Repository;

/** Webhooks of sites. */
@Repository
class WebhookRepository {

    private final JdbcClient jdbc;

    WebhookRepository(JdbcClient jdbc) {
        this.jdbc = jdbc;
    }

    long insert(long siteId, String name, String url, String secret, boolean enabled, Instant now) {
        GeneratedKeyHolder keys = new GeneratedKeyHolder();
        jdbc.sql("""
                        INSERT INTO alert_webhook (site_id, name, url, secret, enabled, created_at)
                        VALUES (:site, :name, :url, :secret, :enabled, :now)""")
                .param("site", siteId).param("name", name).param("url", url).param("secret", secret)
                .param("enabled", enabled).param("now", Timestamp.from(now))
                .update(keys, "id");
        return keys.getKey().longValue();
    }

    boolean update(long siteId, long id, String name, String url, boolean enabled) {
        return jdbc.sql("UPDATE alert_webhook SET name = :name, url = :url, enabled = :enabled "
                        + "WHERE site_id = :site AND id = :id")
                .param("site", siteId).param("id", id).param("name", name).param("url", url)
                .param("enabled", enabled).update() == 1;
    }

    boolean replaceSecret(long siteId, long id, String secret) {
        return jdbc.sql("UPDATE alert_webhook SET secret = :secret WHERE site_id = :site AND id = :id")
                .param("site", siteId).param("id", id).param("secret", secret).update() == 1;
    }

    boolean delete(long siteId, long id) {
        return jdbc.sql("DELETE FROM alert_webhook WHERE site_id = :site AND id = :id")
                .param("site", siteId).param("id", id).update() == 1;
    }

    Optional<Webhook> find(long siteId, long id) {
        return jdbc.sql("SELECT id, site_id, name, url, enabled, created_at FROM alert_webhook "
                        + "WHERE site_id = :site AND id = :id")
                .param("site", siteId).param("id", id).query(WebhookRepository::map).optional();
    }

    List<Webhook> findBySite(long siteId) {
        return jdbc.sql("SELECT id, site_id, name, url, enabled, created_at FROM alert_webhook WHERE site_id = :site "
                        + "ORDER BY id")
                .param("site", siteId).query(WebhookRepository::map).list();
    }

    /** Which of these ids are webhooks of the site. */
    List<Long> existing(long siteId, List<Long> ids) {
        if (ids.isEmpty()) {
            return List.of();
        }
        return jdbc.sql("SELECT id FROM alert_webhook WHERE site_id = :site AND id IN (:ids)")
                .param("site", siteId).param("ids", ids).query(Long.class).list();
    }

    private static Webhook map(ResultSet rs, int row) throws SQLException {
        return new Webhook(rs.getLong("id"), rs.getLong("site_id"), rs.getString("name"), rs.getString("url"),
                rs.getBoolean("enabled"), rs.getTimestamp("created_at").toInstant());
    }
}

package com.example.foldline.sites;

import java.sql.ResultSet;
import java.sql.SQLException;
import java.sql.Timestamp;
import java.time.Instant;
import java.time.ZoneId;
import java.util.List;
import java.util.Optional;

import org.springframework.jdbc.core.simple.JdbcClient;
import org.springframework.jdbc.support.GeneratedKeyHolder;
import org.springframework.stereotype.Repository;

@Repository
class SiteRepository {

    private static final String COLUMNS = """
            id, name, domain, timezone, currency, session_timeout_minutes, engaged_seconds, retention_days, created_at""";

    private final JdbcClient jdbc;

    SiteRepository(JdbcClient jdbc) {
        this.jdbc = jdbc;
    }

    long insert(String name, String domain, String timezone, String currency, int sessionTimeoutMinutes,
                Integer engagedSeconds, int retentionDays, Instant now) {
        GeneratedKeyHolder keys = new GeneratedKeyHolder();
        jdbc.sql("""
                        INSERT INTO site (name, domain, timezone, currency, session_timeout_minutes, engaged_seconds,
                                          retention_days, created_at)
                        VALUES (:name, :domain, :timezone, :currency, :timeout, :engaged, :retention, :now)""")
                .param("name", name).param("domain", domain).param("timezone", timezone).param("currency", currency)
                .param("timeout", sessionTimeoutMinutes).param("engaged", engagedSeconds)
                .param("retention", retentionDays).param("now", Timestamp.from(now))
                .update(keys, "id");
        return keys.getKey().longValue();
    }

    void update(long id, String name, String domain, String timezone, String currency, int sessionTimeoutMinutes,
                Integer engagedSeconds, int retentionDays) {
        jdbc.sql("""
                        UPDATE site SET name = :name, domain = :domain, timezone = :timezone, currency = :currency,
                               session_timeout_minutes = :timeout, engaged_seconds = :engaged, retention_days = :retention
                        WHERE id = :id""")
                .param("id", id).param("name", name).param("domain", domain).param("timezone", timezone)
                .param("currency", currency).param("timeout", sessionTimeoutMinutes).param("engaged", engagedSeconds)
                .param("retention", retentionDays)
                .update();
    }

    Optional<Site> findById(long id) {
        return jdbc.sql("SELECT " + COLUMNS + " FROM site WHERE id = :id").param("id", id)
                .query(SiteRepository::map).optional();
    }

    List<Site> findAll() {
        return jdbc.sql("SELECT " + COLUMNS + " FROM site ORDER BY name, id").query(SiteRepository::map).list();
    }

    long count() {
        return jdbc.sql("SELECT count(*) FROM site").query(Long.class).single();
    }

    private static Site map(ResultSet rs, int row) throws SQLException {
        int engagedValue = rs.getInt("engaged_seconds");
        Integer engaged = rs.wasNull() ? null : engagedValue;
        return new Site(rs.getLong("id"), rs.getString("name"), rs.getString("domain"),
                ZoneId.of(rs.getString("timezone")), rs.getString("currency").trim(),
                rs.getInt("session_timeout_minutes"), engaged, rs.getInt("retention_days"),
                rs.getTimestamp("created_at").toInstant());
    }
}

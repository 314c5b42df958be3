package com.example.foldline.sites;

import java.sql.ResultSet;
import java.sql.SQLException;
import java.sql.Timestamp;
import java.time.Instant;
import java.util.List;
import java.util.Optional;

import org.springframework.jdbc.core.simple.JdbcClient;
import org.springframework.jdbc.support.GeneratedKeyHolder;
import org.springframework.stereotype.Repository;

@Repository
class IngestKeyRepository {

    private final JdbcClient jdbc;

    IngestKeyRepository(JdbcClient jdbc) {
        this.jdbc = jdbc;
    }

    long insert(long siteId, String hash, String prefix, String label, Instant now) {
        GeneratedKeyHolder keys = new GeneratedKeyHolder();
        jdbc.sql("""
                        INSERT INTO ingest_key (site_id, key_hash, key_prefix, label, created_at)
                        VALUES (:site, :hash, :prefix, :label, :now)""")
                .param("site", siteId).param("hash", hash).param("prefix", prefix).param("label", label)
                .param("now", Timestamp.from(now))
                .update(keys, "id");
        return keys.getKey().longValue();
    }

    /** The site of an active key with this hash, if any. */
    Optional<Long> activeSiteForHash(String hash) {
        return jdbc.sql("SELECT site_id FROM ingest_key WHERE key_hash = :hash AND revoked_at IS NULL")
                .param("hash", hash).query(Long.class).optional();
    }

    boolean revoke(long siteId, long keyId, Instant now) {
        return jdbc.sql("""
                        UPDATE ingest_key SET revoked_at = :now
                        WHERE site_id = :site AND id = :id AND revoked_at IS NULL""")
                .param("now", Timestamp.from(now)).param("site", siteId).param("id", keyId).update() == 1;
    }

    Optional<String> hashOf(long siteId, long keyId) {
        return jdbc.sql("SELECT key_hash FROM ingest_key WHERE site_id = :site AND id = :id")
                .param("site", siteId).param("id", keyId).query(String.class).optional();
    }

    List<IngestKey> findBySite(long siteId) {
        return jdbc.sql("""
                        SELECT id, site_id, key_prefix, label, created_at, revoked_at FROM ingest_key
                        WHERE site_id = :site ORDER BY id""")
                .param("site", siteId).query(IngestKeyRepository::map).list();
    }

    private static IngestKey map(ResultSet rs, int row) throws SQLException {
        Timestamp revoked = rs.getTimestamp("revoked_at");
        return new IngestKey(rs.getLong("id"), rs.getLong("site_id"), rs.getString("key_prefix"), rs.getString("label"),
                rs.getTimestamp("created_at").toInstant(), revoked == null ? null : revoked.toInstant());
    }
}

package com.example.foldline.accounts;

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
class UserRepository {

    private final JdbcClient jdbc;

    UserRepository(JdbcClient jdbc) {
        this.jdbc = jdbc;
    }

    long insert(String username, String passwordHash, boolean globalAdmin, Instant now) {
        GeneratedKeyHolder keys = new GeneratedKeyHolder();
        jdbc.sql("""
                        INSERT INTO app_user (username, password_hash, global_admin, enabled, created_at)
                        VALUES (:username, :hash, :admin, TRUE, :now)""")
                .param("username", username).param("hash", passwordHash).param("admin", globalAdmin)
                .param("now", Timestamp.from(now))
                .update(keys, "id");
        return keys.getKey().longValue();
    }

    Optional<UserAccount> findByUsername(String username) {
        return jdbc.sql("""
                        SELECT id, username, password_hash, global_admin, enabled, created_at
                        FROM app_user WHERE username = :username""")
                .param("username", username).query(UserRepository::map).optional();
    }

    List<UserAccount> findAll() {
        return jdbc.sql("""
                        SELECT id, username, password_hash, global_admin, enabled, created_at
                        FROM app_user ORDER BY username""")
                .query(UserRepository::map).list();
    }

    long count() {
        return jdbc.sql("SELECT count(*) FROM app_user").query(Long.class).single();
    }

    void setEnabled(long id, boolean enabled) {
        jdbc.sql("UPDATE app_user SET enabled = :enabled WHERE id = :id").param("enabled", enabled).param("id", id)
                .update();
    }

    void updatePassword(long id, String hash) {
        jdbc.sql("UPDATE app_user SET password_hash = :hash WHERE id = :id").param("hash", hash).param("id", id).update();
    }

    private static UserAccount map(ResultSet rs, int row) throws SQLException {
        return new UserAccount(rs.getLong("id"), rs.getString("username"), rs.getString("password_hash"),
                rs.getBoolean("global_admin"), rs.getBoolean("enabled"), rs.getTimestamp("created_at").toInstant());
    }
}

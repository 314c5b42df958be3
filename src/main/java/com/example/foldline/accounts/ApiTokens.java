package com.example.foldline.accounts;

import java.nio.charset.StandardCharsets;
import java.security.MessageDigest;
import java.security.NoSuchAlgorithmException;
import java.security.SecureRandom;
import java.sql.Timestamp;
import java.time.Clock;
import java.time.Instant;
import java.util.Base64;
import java.util.HexFormat;
import java.util.List;
import java.util.Optional;

import org.springframework.jdbc.core.simple.JdbcClient;
import org.springframework.stereotype.Service;
import org.springframework.transaction.annotation.Transactional;

import com.example.foldline.system.BadRequestException;
import com.example.foldline.system.NotFoundException;

/**
 * Personal API tokens ({@code Authorization: Bearer flt_…}): random 256-bit secrets shown once, stored as SHA-256
 * hashes, revocable; a token stops working when its user is disabled.
 */
@Service
public class ApiTokens {

    static final String PREFIX = "flt_";

    /** A token's public facts. */
    public record Token(long id, String name, String prefix, Instant createdAt, Instant lastUsedAt, Instant revokedAt) {
    }

    /** A new token: the only time {@code token} is shown. */
    public record NewToken(long id, String name, String token, String prefix, Instant createdAt) {
    }

    private final JdbcClient jdbc;
    private final Clock clock;
    private final SecureRandom random = new SecureRandom();

    ApiTokens(JdbcClient jdbc, Clock clock) {
        this.jdbc = jdbc;
        this.clock = clock;
    }

    @Transactional
    public NewToken create(long userId, String name) {
        if (name == null || name.isBlank() || name.length() > 100) {
            throw new BadRequestException("name", "must be 1 to 100 characters");
        }
        byte[] secret = new byte[32];
        random.nextBytes(secret);
        String token = PREFIX + Base64.getUrlEncoder().withoutPadding().encodeToString(secret);
        Instant now = clock.instant();
        jdbc.sql("""
                        INSERT INTO api_token (user_id, name, token_hash, token_prefix, created_at)
                        VALUES (:user, :name, :hash, :prefix, :now)""")
                .param("user", userId).param("name", name.strip()).param("hash", sha256(token))
                .param("prefix", token.substring(0, 10)).param("now", Timestamp.from(now)).update();
        long id = jdbc.sql("SELECT id FROM api_token WHERE token_hash = :hash").param("hash", sha256(token))
                .query(Long.class).single();
        return new NewToken(id, name.strip(), token, token.substring(0, 10), now);
    }

    public List<Token> list(long userId) {
        return jdbc.sql("""
                        SELECT id, name, token_prefix, created_at, last_used_at, revoked_at FROM api_token
                        WHERE user_id = :user ORDER BY id""")
                .param("user", userId)
                .query((rs, i) -> new Token(rs.getLong(1), rs.getString(2), rs.getString(3), ts(rs.getTimestamp(4)),
                        ts(rs.getTimestamp(5)), ts(rs.getTimestamp(6))))
                .list();
    }

    @Transactional
    public void revoke(long userId, long tokenId) {
        int n = jdbc.sql("""
                        UPDATE api_token SET revoked_at = :now
                        WHERE id = :id AND user_id = :user AND revoked_at IS NULL""")
                .param("now", Timestamp.from(clock.instant())).param("id", tokenId).param("user", userId).update();
        if (n == 0) {
            throw new NotFoundException("no active token " + tokenId);
        }
    }

    /** The enabled user an active token belongs to. */
    Optional<String> usernameFor(String token) {
        if (token == null || !token.startsWith(PREFIX) || token.length() > 100) {
            return Optional.empty();
        }
        String hash = sha256(token);
        Optional<String> user = jdbc.sql("""
                        SELECT u.username FROM api_token t JOIN app_user u ON u.id = t.user_id
                        WHERE t.token_hash = :hash AND t.revoked_at IS NULL AND u.enabled = TRUE""")
                .param("hash", hash).query(String.class).optional();
        user.ifPresent(u -> jdbc.sql("UPDATE api_token SET last_used_at = :now WHERE token_hash = :hash")
                .param("now", Timestamp.from(clock.instant())).param("hash", hash).update());
        return user;
    }

    private static Instant ts(Timestamp t) {
        return t == null ? null : t.toInstant();
    }

    static String sha256(String text) {
        try {
            return HexFormat.of().formatHex(MessageDigest.getInstance("SHA-256")
                    .digest(text.getBytes(StandardCharsets.UTF_8)));
        } catch (NoSuchAlgorithmException e) {
            throw new IllegalStateException(e);
        }
    }
}

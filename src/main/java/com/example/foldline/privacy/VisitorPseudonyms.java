package com.example.foldline.privacy;

import java.nio.charset.StandardCharsets;
import java.security.GeneralSecurityException;
import java.security.SecureRandom;
import java.util.Base64;
import java.util.HexFormat;

import javax.crypto.Mac;
import javax.crypto.spec.SecretKeySpec;

import org.springframework.beans.factory.annotation.Value;
import org.springframework.jdbc.core.simple.JdbcClient;
import org.springframework.stereotype.Component;
import org.springframework.transaction.support.TransactionTemplate;

/**
 * Turns a client's visitor id into the pseudonym Foldline stores: HMAC-SHA256 keyed by a server-side pepper over
 * the site id and the visitor id, truncated to 128 bits (32 hex characters). The stored value cannot be linked
 * back to the client's id without the pepper, yet the same visitor always maps to the same pseudonym, which is what
 * sessions and deletion by visitor need.
 */
@Component
public class VisitorPseudonyms {

    private static final String SETTING = "visitor-pepper";

    private final byte[] pepper;
    private final ThreadLocal<Mac> macs;

    VisitorPseudonyms(@Value("${foldline.privacy.visitor-pepper:}") String configured, JdbcClient jdbc,
                      TransactionTemplate tx) {
        this.pepper = (configured != null && !configured.isBlank()
                ? configured : storedOrNewPepper(jdbc, tx)).getBytes(StandardCharsets.UTF_8);
        this.macs = ThreadLocal.withInitial(this::newMac);
    }

    /** The stored pseudonym of a client's visitor id on a site. */
    public String of(long siteId, String visitor) {
        Mac mac = macs.get();
        mac.update(Long.toString(siteId).getBytes(StandardCharsets.US_ASCII));
        mac.update((byte) ':');
        byte[] digest = mac.doFinal(visitor.getBytes(StandardCharsets.UTF_8));
        return HexFormat.of().formatHex(digest, 0, 16);
    }

    private Mac newMac() {
        try {
            Mac mac = Mac.getInstance("HmacSHA256");
            mac.init(new SecretKeySpec(pepper, "HmacSHA256"));
            return mac;
        } catch (GeneralSecurityException e) {
            throw new IllegalStateException("HmacSHA256 is part of every Java runtime", e);
        }
    }

    private static String storedOrNewPepper(JdbcClient jdbc, TransactionTemplate tx) {
        return tx.execute(status -> jdbc.sql("SELECT setting FROM app_setting WHERE name = :name")
                .param("name", SETTING).query(String.class).optional()
                .orElseGet(() -> {
                    byte[] bytes = new byte[32];
                    new SecureRandom().nextBytes(bytes);
                    String generated = Base64.getEncoder().encodeToString(bytes);
                    jdbc.sql("INSERT INTO app_setting (name, setting) VALUES (:name, :setting)")
                            .param("name", SETTING).param("setting", generated).update();
                    return generated;
                }));
    }
}

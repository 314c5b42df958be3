package com.example.foldline.sites;

import java.nio.charset.StandardCharsets;
import java.security.MessageDigest;
import java.security.NoSuchAlgorithmException;
import java.security.SecureRandom;
import java.time.Clock;
import java.time.Instant;
import java.util.Base64;
import java.util.HexFormat;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.concurrent.ConcurrentHashMap;

import org.springframework.stereotype.Service;
import org.springframework.transaction.annotation.Transactional;

import com.example.foldline.system.NotFoundException;

/**
 * The sites module's API: sites, their settings and their ingest keys.
 * Ingest keys are random 32-byte secrets; only their SHA-256 hash is stored (a fast hash suffices for
 * high-entropy secrets, unlike passwords).
 */
@Service
public class Sites {

    static final String KEY_PREFIX = "flk_";
    private static final long KEY_CACHE_MILLIS = 30_000;

    private final SiteRepository sites;
    private final IngestKeyRepository keys;
    private final Clock clock;
    private final SecureRandom random = new SecureRandom();
    /** hash of a presented key → (site, time checked); avoids a database read per ingest request. */
    private final Map<String, CachedKey> keyCache = new ConcurrentHashMap<>();
    private final Map<Long, Site> siteCache = new ConcurrentHashMap<>();

    Sites(SiteRepository sites, IngestKeyRepository keys, Clock clock) {
        this.sites = sites;
        this.keys = keys;
        this.clock = clock;
    }

    @Transactional
    public Site create(SiteSettings settings) {
        SiteSettings s = settings.validated();
        long id = sites.insert(s.name(), s.domain(), s.timezone(), s.currency(), s.sessionTimeoutMinutes(),
                s.engagedSeconds(), s.retentionDays(), clock.instant());
        return require(id);
    }

    @Transactional
    public Site update(long siteId, SiteSettings settings) {
        require(siteId);
        SiteSettings s = settings.validated();
        sites.update(siteId, s.name(), s.domain(), s.timezone(), s.currency(), s.sessionTimeoutMinutes(),
                s.engagedSeconds(), s.retentionDays());
        siteCache.remove(siteId);
        return require(siteId);
    }

    public Optional<Site> find(long siteId) {
        Site cached = siteCache.get(siteId);
        if (cached != null) {
            return Optional.of(cached);
        }
        Optional<Site> site = sites.findById(siteId);
        site.ifPresent(s -> siteCache.put(siteId, s));
        return site;
    }

    public Site require(long siteId) {
        return find(siteId).orElseThrow(() -> new NotFoundException("no site with id " + siteId));
    }

    public List<Site> all() {
        return sites.findAll();
    }

    public boolean isEmpty() {
        return sites.count() == 0;
    }

    /** Creates a key for the site; the returned secret is not stored and cannot be shown again. */
    @Transactional
    public NewIngestKey createIngestKey(long siteId, String label) {
        require(siteId);
        byte[] secret = new byte[32];
        random.nextBytes(secret);
        String key = KEY_PREFIX + Base64.getUrlEncoder().withoutPadding().encodeToString(secret);
        Instant now = clock.instant();
        String prefix = key.substring(0, 10);
        long id = keys.insert(siteId, sha256(key), prefix, label, now);
        return new NewIngestKey(id, siteId, key, prefix, label, now);
    }

    @Transactional
    public void revokeIngestKey(long siteId, long keyId) {
        Optional<String> hash = keys.hashOf(siteId, keyId);
        if (hash.isEmpty()) {
            throw new NotFoundException("no ingest key " + keyId + " on site " + siteId);
        }
        keys.revoke(siteId, keyId, clock.instant());
        keyCache.remove(hash.get());
    }

    public List<IngestKey> ingestKeys(long siteId) {
        require(siteId);
        return keys.findBySite(siteId);
    }

    /** True when the presented key is active and belongs to this site. */
    public boolean acceptsIngestKey(long siteId, String presentedKey) {
        if (presentedKey == null || !presentedKey.startsWith(KEY_PREFIX) || presentedKey.length() > 100) {
            return false;
        }
        String hash = sha256(presentedKey);
        long now = clock.millis();
        CachedKey cached = keyCache.get(hash);
        if (cached == null || now - cached.checkedAt() > KEY_CACHE_MILLIS) {
            cached = new CachedKey(keys.activeSiteForHash(hash).orElse(-1L), now);
            keyCache.put(hash, cached);
        }
        return cached.siteId() == siteId;
    }

    static String sha256(String text) {
        try {
            byte[] digest = MessageDigest.getInstance("SHA-256").digest(text.getBytes(StandardCharsets.UTF_8));
            return HexFormat.of().formatHex(digest);
        } catch (NoSuchAlgorithmException e) {
            throw new IllegalStateException("SHA-256 is part of every Java runtime", e);
        }
    }

    private record CachedKey(long siteId, long checkedAt) {
    }
}

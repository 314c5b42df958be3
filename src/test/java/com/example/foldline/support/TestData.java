package com.example.foldline.support;

import java.time.Instant;
import java.util.concurrent.atomic.AtomicLong;

import com.example.foldline.sites.NewIngestKey;
import com.example.foldline.sites.Site;
import com.example.foldline.sites.SiteSettings;
import com.example.foldline.sites.Sites;

/** Small helpers to make sites, keys and event lines in tests. */
public final class TestData {

    private static final AtomicLong COUNTER = new AtomicLong(System.nanoTime() % 1_000_000);

    private TestData() {
    }

    public record SiteWithKey(Site site, String key) {
    }

    public static SiteWithKey site(Sites sites, String timezone) {
        long n = COUNTER.incrementAndGet();
        Site site = sites.create(new SiteSettings("Test site " + n, "site" + n + ".example", timezone, "EUR",
                null, null, null));
        NewIngestKey key = sites.createIngestKey(site.id(), "test");
        return new SiteWithKey(site, key.key());
    }

    public static String unique(String prefix) {
        return prefix + "-" + COUNTER.incrementAndGet();
    }

    public static String pageview(String id, Instant ts, String visitor, String path, int ads) {
        return """
                {"type":"pageview","id":"%s","ts":"%s","visitor":"%s","path":"%s","ads":%d,"device":"phone",\
                "source":"search","country":"PT","browser":"Lumen"}""".formatted(id, ts, visitor, path, ads);
    }
}

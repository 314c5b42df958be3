package com.example.foldline.privacy;

import java.time.Clock;
import java.time.Duration;
import java.util.ArrayList;
import java.util.List;

import org.slf4j.Logger;
import org.slf4j.LoggerFactory;
import org.springframework.scheduling.annotation.Scheduled;
import org.springframework.stereotype.Service;

import com.example.foldline.sessions.VisitorData;
import com.example.foldline.sites.Site;
import com.example.foldline.sites.Sites;

/** Deletes raw events and sessions older than each site's retention period, daily and on demand. */
@Service
public class Retention {

    private static final Logger log = LoggerFactory.getLogger(Retention.class);

    /** What one site's purge removed. */
    public record Purged(long siteId, int retentionDays, VisitorData.Deleted deleted) {
    }

    private final Sites sites;
    private final VisitorData data;
    private final Clock clock;

    Retention(Sites sites, VisitorData data, Clock clock) {
        this.sites = sites;
        this.data = data;
        this.clock = clock;
    }

    @Scheduled(cron = "${foldline.privacy.retention-cron:0 30 3 * * *}")
    void daily() {
        try {
            purgeAll().forEach(p -> log.info("retention on site {}: {}", p.siteId(), p.deleted()));
        } catch (RuntimeException e) {
            log.error("retention run failed; it runs again tomorrow or on demand", e);
        }
    }

    public List<Purged> purgeAll() {
        List<Purged> purged = new ArrayList<>();
        for (Site site : sites.all()) {
            purged.add(new Purged(site.id(), site.retentionDays(),
                    data.purgeBefore(site.id(), clock.instant().minus(Duration.ofDays(site.retentionDays())))));
        }
        return purged;
    }
}

package com.example.foldline.sessions;

import java.time.Clock;
import java.time.Duration;
import java.time.Instant;
import java.util.ArrayList;
import java.util.Comparator;
import java.util.HashMap;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

import org.slf4j.Logger;
import org.slf4j.LoggerFactory;
import org.springframework.scheduling.annotation.Scheduled;
import org.springframework.stereotype.Service;
import org.springframework.transaction.support.TransactionTemplate;

import com.example.foldline.sites.Site;
import com.example.foldline.sites.Sites;

/**
 * Turns stored pageviews into sessions and keeps the rollups in step (docs/metrics.md, "Sessions").
 * <p>
 * Work arrives as ingest batches: each committed ingest request leaves one row, and its events carry its id. For
 * each visitor touched,
 * the sessions that could be affected (those ending within the timeout of the earliest changed pageview, and all
 * later ones) are rebuilt from the stored pageviews; their old rollup contributions are subtracted and the new ones
 * added. So a late pageview, a page-end after its session closed, or an impression before its pageview all end up
 * in the right session, and the rollups always equal an aggregation of the stored sessions.
 */
@Service
public class Sessionizer {

    private static final Logger log = LoggerFactory.getLogger(Sessionizer.class);
    private static final int BATCHES_PER_RUN = 20;
    private static final int VISITOR_CHUNK = 1_000;

    private final SessionRepository repository;
    private final RollupWriter rollups;
    private final Sites sites;
    private final TransactionTemplate tx;
    private final Clock clock;

    private final boolean scheduled;

    Sessionizer(SessionRepository repository, RollupWriter rollups, Sites sites, TransactionTemplate tx, Clock clock,
                @org.springframework.beans.factory.annotation.Value("${foldline.sessions.enabled:true}") boolean scheduled) {
        this.scheduled = scheduled;
        this.repository = repository;
        this.rollups = rollups;
        this.sites = sites;
        this.tx = tx;
        this.clock = clock;
    }

    /** What one run did. */
    public record Report(long siteId, long batches, long sessionsWritten, long sessionsClosed, long importsRolledUp) {
    }

    @Scheduled(fixedDelayString = "${foldline.sessions.interval:PT5S}", initialDelayString = "PT10S")
    void scheduled() {
        if (!scheduled) {
            return;
        }
        try {
            runAll();
        } catch (RuntimeException e) {
            log.error("sessionizer run failed; it will be retried", e);
        }
    }

    /** Processes every site with pending work. */
    public List<Report> runAll() {
        List<Report> reports = new ArrayList<>();
        for (long siteId : repository.siteIds()) {
            reports.add(run(siteId));
        }
        return reports;
    }

    /** Processes all pending work of one site: new events, imported sessions, and sessions gone idle. */
    public Report run(long siteId) {
        Site site = sites.require(siteId);
        long inbox = 0;
        long written = 0;
        while (true) {
            long[] batch = tx.execute(status -> processBatches(site));
            if (batch[0] == 0) {
                break;
            }
            inbox += batch[0];
            written += batch[1];
        }
        long imported = 0;
        while (true) {
            Integer n = tx.execute(status -> rollUpImports(site));
            if (n == 0) {
                break;
            }
            imported += n;
        }
        long closed = 0;
        while (true) {
            Integer n = tx.execute(status -> closeIdle(site));
            if (n == 0) {
                break;
            }
            closed += n;
        }
        return new Report(siteId, inbox, written, closed, imported);
    }

    private Instant closeBefore(Site site) {
        Instant now = clock.instant();
        Instant newest = repository.newestEventTime(site.id()).orElse(now);
        return (newest.isAfter(now) ? newest : now).minus(Duration.ofMinutes(site.sessionTimeoutMinutes()));
    }

    private long[] processBatches(Site site) {
        repository.lockSite(site.id());
        List<Long> batches = repository.batches(site.id(), BATCHES_PER_RUN);
        if (batches.isEmpty()) {
            return new long[]{0, 0};
        }
        repository.newestOf(site.id(), batches).ifPresent(ts -> repository.raiseNewestEventTime(site.id(), ts));
        long written = rebuildVisitors(site, repository.changedVisitors(site.id(), batches));
        repository.deleteBatches(site.id(), batches);
        return new long[]{batches.size(), written};
    }

    /** Rebuilds every session of the site from its pageviews (the rollups must have been cleared). */
    long rebuildAll(long siteId) {
        Site site = sites.require(siteId);
        Map<String, Instant> visitors = tx.execute(status -> {
            repository.lockSite(siteId);
            return repository.allVisitors(siteId);
        });
        long written = 0;
        List<String> all = new ArrayList<>(visitors.keySet());
        for (List<String> chunk : SessionRepository.chunks(all, 20 * VISITOR_CHUNK)) {
            Map<String, Instant> part = new HashMap<>();
            chunk.forEach(v -> part.put(v, visitors.get(v)));
            written += tx.execute(status -> {
                repository.lockSite(siteId);
                return rebuildVisitors(site, part);
            });
        }
        return written;
    }

    private long rebuildVisitors(Site site, Map<String, Instant> earliest) {
        if (earliest.isEmpty()) {
            return 0;
        }
        Duration timeout = Duration.ofMinutes(site.sessionTimeoutMinutes());
        Instant closeBefore = closeBefore(site);
        Contributions contributions = new Contributions();
        long written = 0;
        List<String> visitors = new ArrayList<>(earliest.keySet());
        for (List<String> chunk : SessionRepository.chunks(visitors, VISITOR_CHUNK)) {
            written += rebuild(site, chunk, earliest, timeout, closeBefore, contributions);
        }
        rollups.apply(site.id(), contributions);
        return written;
    }

    private long rebuild(Site site, List<String> visitors, Map<String, Instant> earliest, Duration timeout,
                         Instant closeBefore, Contributions contributions) {
        Instant chunkMin = visitors.stream().map(earliest::get).min(Comparator.naturalOrder()).orElseThrow();
        Map<String, List<SessionFact>> old = new HashMap<>();
        for (SessionFact s : repository.tagSessions(site.id(), visitors, chunkMin.minus(timeout))) {
            if (!s.end().isBefore(earliest.get(s.visitor()).minus(timeout))) {
                old.computeIfAbsent(s.visitor(), v -> new ArrayList<>()).add(s);
            }
        }
        Map<String, Instant> windowStart = new HashMap<>();
        Instant from = chunkMin;
        for (String v : visitors) {
            Instant start = earliest.get(v);
            for (SessionFact s : old.getOrDefault(v, List.of())) {
                start = min(start, s.start());
            }
            windowStart.put(v, start);
            from = min(from, start);
        }
        Map<String, List<PageviewRow>> byVisitor = new LinkedHashMap<>();
        for (PageviewRow p : repository.pageviews(site.id(), visitors, from)) {
            if (!p.ts().isBefore(windowStart.get(p.visitor()))) {
                byVisitor.computeIfAbsent(p.visitor(), v -> new ArrayList<>()).add(p);
            }
        }
        List<String> deleted = new ArrayList<>();
        List<SessionFact> inserted = new ArrayList<>();
        for (String v : visitors) {
            List<SessionFact> before = old.getOrDefault(v, List.of());
            List<SessionFact> after = SessionBuilder.build(site, byVisitor.getOrDefault(v, List.of()), closeBefore);
            if (before.equals(after)) {
                continue;
            }
            for (SessionFact s : before) {
                contributions.add(s, -1);
                deleted.add(s.id());
            }
            for (SessionFact s : after) {
                contributions.add(s, +1);
                inserted.add(s);
            }
        }
        repository.deleteTagSessions(site.id(), deleted);
        repository.insert(inserted, clock.instant());
        return inserted.size();
    }

    private int rollUpImports(Site site) {
        repository.lockSite(site.id());
        List<SessionFact> pending = repository.notRolledUp(site.id(), 5_000);
        if (pending.isEmpty()) {
            return 0;
        }
        Contributions contributions = new Contributions();
        List<SessionFact> done = new ArrayList<>(pending.size());
        for (SessionFact s : pending) {
            SessionFact withPages = ImportedPages.withPages(s);
            contributions.add(withPages, +1);
            done.add(withPages);
        }
        rollups.apply(site.id(), contributions);
        repository.markRolledUp(site.id(), done);
        return pending.size();
    }

    private int closeIdle(Site site) {
        repository.lockSite(site.id());
        List<SessionFact> idle = repository.openSessionsEndingBefore(site.id(), closeBefore(site), 5_000);
        if (idle.isEmpty()) {
            return 0;
        }
        Contributions contributions = new Contributions();
        for (SessionFact s : idle) {
            contributions.add(s.withClosed(true), +1);
        }
        rollups.apply(site.id(), contributions);
        repository.markClosed(site.id(), idle);
        return idle.size();
    }

    private static Instant min(Instant a, Instant b) {
        return a.isBefore(b) ? a : b;
    }
}

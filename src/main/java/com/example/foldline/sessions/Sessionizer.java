package com.example.foldline.sessions;

import java.time.Clock;
import java.time.Duration;
import java.time.Instant;
import java.util.ArrayList;
import java.util.Comparator;
import java.util.HashMap;
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
    /** Most ingest batches per transaction (tag requests carry a few events each, imports thousands). */
    private static final int BATCHES_PER_RUN = 2_000;
    /** A transaction takes batches until it has read about this many new pageviews. */
    private static final int PAGEVIEWS_PER_RUN = 100_000;
    /** Imported sessions rolled up per transaction. */
    private static final int IMPORTS_PER_RUN = 20_000;

    private final SessionRepository repository;
    private final RollupWriter rollups;
    private final WeeklyViews weeks;
    private final Sites sites;
    private final TransactionTemplate tx;
    private final Clock clock;

    private final boolean scheduled;

    Sessionizer(SessionRepository repository, RollupWriter rollups, WeeklyViews weeks, Sites sites,
                TransactionTemplate tx, Clock clock,
                @org.springframework.beans.factory.annotation.Value("${foldline.sessions.enabled:true}") boolean scheduled) {
        this.scheduled = scheduled;
        this.repository = repository;
        this.rollups = rollups;
        this.weeks = weeks;
        this.sites = sites;
        this.tx = tx;
        this.clock = clock;
    }

    /** What one run did. */
    public record Report(long siteId, long batches, long sessionsWritten, long sessionsClosed, long importsRolledUp,
                         int weeksBuilt) {
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

    /**
     * Processes all pending work of one site: new events, imported sessions, sessions gone idle, and the weekly
     * views of weeks that are over ({@link WeeklyViews}).
     */
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
            Integer n;
            try {
                n = tx.execute(status -> rollUpImports(site, false));
            } catch (ConcurrentImport e) {
                n = tx.execute(status -> rollUpImports(site, true));
            }
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
        return new Report(siteId, inbox, written, closed, imported, weeks.build(site));
    }

    private Instant closeBefore(Site site) {
        Instant now = clock.instant();
        Instant newest = repository.newestEventTime(site.id()).orElse(now);
        return (newest.isAfter(now) ? newest : now).minus(Duration.ofMinutes(site.sessionTimeoutMinutes()));
    }

    /**
     * One transaction: the oldest pending batches, up to about {@link #PAGEVIEWS_PER_RUN} new pageviews. Their
     * pageviews are read once through the batch index and grouped by visitor in memory; stored state is looked up
     * only per visitor, by key (see {@link #rebuild}).
     */
    private long[] processBatches(Site site) {
        repository.lockSite(site.id());
        List<SessionRepository.Batch> pending = repository.batches(site.id(), BATCHES_PER_RUN);
        if (pending.isEmpty()) {
            return new long[]{0, 0};
        }
        List<Long> taken = new ArrayList<>();
        Instant newest = null;
        Map<String, List<PageviewRow>> fresh = new HashMap<>();
        Map<String, Instant> earliest = new HashMap<>();
        int read = 0;
        for (SessionRepository.Batch batch : pending) {
            if (read >= PAGEVIEWS_PER_RUN) {
                break;
            }
            taken.add(batch.id());
            if (batch.newest() != null && (newest == null || batch.newest().isAfter(newest))) {
                newest = batch.newest();
            }
            int[] count = {0};
            repository.batchPageviews(site.id(), batch.id(), p -> {
                fresh.computeIfAbsent(p.visitor(), v -> new ArrayList<>(4)).add(p);
                earliest.merge(p.visitor(), p.ts(), Sessionizer::min);
                count[0]++;
            });
            read += count[0];
            repository.extrasVisitors(site.id(), batch.id()).forEach((v, ts) -> earliest.merge(v, ts, Sessionizer::min));
        }
        if (newest != null) {
            repository.raiseNewestEventTime(site.id(), newest);
        }
        long written = rebuildVisitors(site, earliest, fresh);
        repository.deleteBatches(site.id(), taken);
        return new long[]{taken.size(), written};
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
        for (List<String> chunk : SessionRepository.chunks(all, 20 * SessionRepository.LOOKUP)) {
            Map<String, Instant> part = new HashMap<>();
            chunk.forEach(v -> part.put(v, visitors.get(v)));
            written += tx.execute(status -> {
                repository.lockSite(siteId);
                return rebuildVisitors(site, part, Map.of());
            });
        }
        return written;
    }

    /**
     * @param earliest for each visitor to rebuild, the earliest pageview time that changed
     * @param fresh    the pageviews of the batches being processed, by visitor (empty for a rebuild)
     */
    private long rebuildVisitors(Site site, Map<String, Instant> earliest, Map<String, List<PageviewRow>> fresh) {
        if (earliest.isEmpty()) {
            return 0;
        }
        Duration timeout = Duration.ofMinutes(site.sessionTimeoutMinutes());
        Instant closeBefore = closeBefore(site);
        Contributions contributions = new Contributions(rollups.weeksBuiltThrough(site.id()));
        long written = 0;
        List<String> visitors = new ArrayList<>(earliest.keySet());
        for (List<String> chunk : SessionRepository.chunks(visitors, SessionRepository.LOOKUP)) {
            written += rebuild(site, chunk, earliest, fresh, timeout, closeBefore, contributions);
        }
        rollups.apply(site.id(), contributions);
        return written;
    }

    /**
     * Rebuilds the visitors' sessions that could change: those ending within the timeout before the visitor's
     * earliest changed pageview, and all later ones. Every pageview already sessionized lies in one of the visitor's
     * stored sessions, and sessions of one visitor do not overlap, so a visitor with no stored session in that window
     * has no stored pageview in it either: their sessions are built from the batch's pageviews alone. Only visitors
     * with a session in the window (or with no new pageview: a late page-end or impression, or a rebuild) have their
     * stored pageviews read, by key. Pageviews of batches not yet processed may be left out here; their own batch
     * rebuilds the visitor again, and contributions go in as differences, so the end state is the same.
     */
    private long rebuild(Site site, List<String> visitors, Map<String, Instant> earliest,
                         Map<String, List<PageviewRow>> fresh, Duration timeout, Instant closeBefore,
                         Contributions contributions) {
        Instant chunkMin = visitors.stream().map(earliest::get).min(Comparator.naturalOrder()).orElseThrow();
        Map<String, List<SessionFact>> old = new HashMap<>();
        for (SessionFact s : repository.tagSessions(site.id(), visitors, chunkMin.minus(timeout))) {
            if (!s.end().isBefore(earliest.get(s.visitor()).minus(timeout))) {
                old.computeIfAbsent(s.visitor(), v -> new ArrayList<>()).add(s);
            }
        }
        Map<String, Instant> windowStart = new HashMap<>();
        List<String> stored = new ArrayList<>();
        Instant from = null;
        for (String v : visitors) {
            List<SessionFact> before = old.get(v);
            if (before == null && fresh.containsKey(v)) {
                continue;
            }
            Instant start = earliest.get(v);
            for (SessionFact s : before == null ? List.<SessionFact>of() : before) {
                start = min(start, s.start());
            }
            windowStart.put(v, start);
            stored.add(v);
            from = from == null ? start : min(from, start);
        }
        Map<String, List<PageviewRow>> byVisitor = new HashMap<>();
        List<PageviewRow> rows = new ArrayList<>();
        for (String v : visitors) {
            if (!windowStart.containsKey(v)) {
                rows.addAll(fresh.get(v));
            }
        }
        if (!stored.isEmpty()) {
            for (PageviewRow p : repository.visitorPageviews(site.id(), stored, from)) {
                if (!p.ts().isBefore(windowStart.get(p.visitor()))) {
                    rows.add(p);
                }
            }
        }
        for (PageviewRow p : repository.withExtras(site.id(), rows)) {
            byVisitor.computeIfAbsent(p.visitor(), v -> new ArrayList<>()).add(p);
        }
        List<String> deleted = new ArrayList<>();
        List<SessionFact> inserted = new ArrayList<>();
        for (String v : visitors) {
            List<SessionFact> before = old.getOrDefault(v, List.of());
            if (before.size() > 1) {
                before.sort(SESSION_ORDER);
            }
            List<PageviewRow> pages = byVisitor.getOrDefault(v, List.of());
            if (pages.size() > 1) {
                pages.sort(PAGE_ORDER);
            }
            List<SessionFact> after = SessionBuilder.build(site, pages, closeBefore);
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

    private static final Comparator<PageviewRow> PAGE_ORDER =
            Comparator.comparing(PageviewRow::ts).thenComparing(PageviewRow::id);
    private static final Comparator<SessionFact> SESSION_ORDER =
            Comparator.comparing(SessionFact::start).thenComparing(SessionFact::id);

    /**
     * Adds the contributions of the next {@link #IMPORTS_PER_RUN} imported sessions (in day order, so that they
     * aggregate into few cells) and marks them with one ranged UPDATE, or one by one when {@code oneByOne} (after an
     * import committed rows into the range while this ran; the first attempt is then rolled back).
     */
    private int rollUpImports(Site site, boolean oneByOne) {
        repository.lockSite(site.id());
        List<SessionFact> pending = repository.notRolledUp(site.id(), IMPORTS_PER_RUN);
        if (pending.isEmpty()) {
            return 0;
        }
        Contributions contributions = new Contributions(rollups.weeksBuiltThrough(site.id()));
        for (SessionFact s : pending) {
            contributions.add(ImportedPages.withPages(s), +1);
        }
        if (oneByOne) {
            repository.markRolledUpOneByOne(site.id(), pending);
        } else if (!repository.markRolledUp(site.id(), pending)) {
            throw new ConcurrentImport();
        }
        rollups.apply(site.id(), contributions);
        return pending.size();
    }

    /** Rolls a ranged mark back: the range held rows committed after they were read. */
    private static final class ConcurrentImport extends RuntimeException {
        ConcurrentImport() {
            super("imported sessions were committed into the range being rolled up", null, false, false);
        }
    }

    private int closeIdle(Site site) {
        repository.lockSite(site.id());
        List<SessionFact> idle = repository.openSessionsEndingBefore(site.id(), closeBefore(site), 5_000);
        if (idle.isEmpty()) {
            return 0;
        }
        Contributions contributions = new Contributions(rollups.weeksBuiltThrough(site.id()));
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

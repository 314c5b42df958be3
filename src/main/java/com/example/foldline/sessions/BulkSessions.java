package com.example.foldline.sessions;

import java.time.Clock;
import java.time.ZonedDateTime;
import java.util.ArrayList;
import java.util.List;

import org.springframework.stereotype.Service;
import org.springframework.transaction.support.TransactionTemplate;

import com.example.foldline.sites.Site;

/**
 * Stores finished sessions in bulk (origin {@code import}) and adds their rollup contributions in the same
 * transaction. Used by the demo simulator and for page-level history; idempotent per session id.
 */
@Service
public class BulkSessions {

    private final SessionRepository repository;
    private final RollupWriter rollups;
    private final TransactionTemplate tx;
    private final Clock clock;

    BulkSessions(SessionRepository repository, RollupWriter rollups, TransactionTemplate tx, Clock clock) {
        this.repository = repository;
        this.rollups = rollups;
        this.tx = tx;
        this.clock = clock;
    }

    /** Stores the sessions (one transaction) with their contributions to every view; returns how many were new. */
    public int store(Site site, List<SessionInput> inputs) {
        return store(site, inputs, Cuboid.LATTICE);
    }

    /**
     * Stores the sessions with their contributions to the views of lattices up to {@code lattice} only; the newer
     * views must have been left to {@link RollupFill#defer}. Returns how many sessions were new.
     */
    public int store(Site site, List<SessionInput> inputs, int lattice) {
        List<SessionFact> facts = new ArrayList<>(inputs.size());
        for (SessionInput in : inputs) {
            facts.add(fact(site, in));
        }
        return tx.execute(status -> {
            repository.lockSite(site.id());
            List<SessionFact> fresh = repository.insertImported(facts, clock.instant());
            Contributions contributions = lattice >= Cuboid.LATTICE
                    ? new Contributions(rollups.weeksBuiltThrough(site.id()))
                    : new Contributions(Cuboid.SESSION.stream().filter(c -> c.lattice() <= lattice).toList(),
                    Cuboid.PAGE.stream().filter(c -> c.lattice() <= lattice).toList());
            fresh.forEach(s -> contributions.add(s, +1));
            rollups.apply(site.id(), contributions);
            return fresh.size();
        });
    }

    static SessionFact fact(Site site, SessionInput in) {
        if (in.pages().isEmpty()) {
            throw new IllegalArgumentException("session " + in.id() + " has no pages");
        }
        long engaged = 0;
        long revenue = 0;
        int impressions = 0;
        int viewable = 0;
        int clicks = 0;
        long later = 0;
        List<PageStat> pages = new ArrayList<>(in.pages().size());
        for (int i = 0; i < in.pages().size(); i++) {
            SessionInput.Page p = in.pages().get(i);
            engaged += p.engagedMs() == null ? 0 : p.engagedMs();
            revenue += p.revenueMicros();
            impressions += p.impressions();
            viewable += p.viewable();
            clicks += p.clicks();
            if (i > 0) {
                later += p.ads();
            }
            pages.add(new PageStat(p.ads(), p.engagedMs(), p.revenueMicros(), p.impressions(), p.viewable(),
                    p.clicks()));
        }
        int n = pages.size();
        ZonedDateTime local = in.start().atZone(site.timezone());
        return new SessionFact(site.id(), in.id(), "import", in.visitor(), null, in.start(), in.end(),
                local.toLocalDate(), local.getHour(), n, SessionBuilder.isBounce(site, n, engaged), engaged,
                in.entryPath(), in.pages().get(0).ads(), n > 1 ? (double) later / (n - 1) : null, in.source(),
                in.device(), in.browser(), in.os(), in.country(), in.region(), in.variant(), revenue, impressions,
                viewable, clicks, true, pages);
    }
}

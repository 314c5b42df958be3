package com.example.foldline.sessions;

import java.time.Clock;
import java.time.LocalDate;

import org.springframework.stereotype.Service;
import org.springframework.transaction.support.TransactionTemplate;

import com.example.foldline.sites.Site;

/**
 * Builds the weekly twins of the rollup views ({@link Cuboid#weekly()}, docs/architecture.md) a week at a time, once
 * the week is over in the site's time zone: each twin cell is the sum of its daily view's cells of that week, added up
 * by the database in one statement per table. Table {@code rollup_week} records the Monday of the last built week;
 * from then on every change to a session in a built week goes to the twins as well ({@link Contributions}), so a
 * built week stays equal to its days, and questions read twins only for built weeks ({@link Rollups}).
 *
 * <p>This defers the twins' cost for the live week: while a week is under way its sessions update the daily views
 * only, and the sessionizer writes no more cells than without twins.
 */
@Service
public class WeeklyViews {

    private final RollupWriter writer;
    private final SessionRepository sessions;
    private final TransactionTemplate tx;
    private final Clock clock;

    WeeklyViews(RollupWriter writer, SessionRepository sessions, TransactionTemplate tx, Clock clock) {
        this.writer = writer;
        this.sessions = sessions;
        this.tx = tx;
        this.clock = clock;
    }

    /** The Monday of the last week the site's twins hold, or null when none is built. */
    LocalDate builtThrough(long siteId) {
        return writer.weeksBuiltThrough(siteId);
    }

    /**
     * Builds every week that is over (its Sunday before today, local) and not built yet, oldest first, one
     * transaction a week under the site's sessionizer lock. Returns how many weeks were built.
     */
    public int build(Site site) {
        LocalDate lastMonday = Cuboid.monday(LocalDate.now(clock.withZone(site.timezone()))).minusDays(7);
        int built = 0;
        while (true) {
            Boolean done = tx.execute(status -> {
                if (!sessions.lockSite(site.id())) {
                    return true;
                }
                LocalDate through = writer.weeksBuiltThrough(site.id());
                LocalDate next;
                if (through != null) {
                    next = through.plusDays(7);
                } else {
                    LocalDate first = writer.firstDay(site.id());
                    if (first == null) {
                        return true; // no rollups yet: a first history load writes daily views only
                    }
                    next = Cuboid.monday(first);
                }
                if (next.isAfter(lastMonday)) {
                    return true;
                }
                writer.buildWeek(site.id(), next);
                writer.weeksBuiltThrough(site.id(), next);
                return false;
            });
            if (Boolean.TRUE.equals(done)) {
                return built;
            }
            built++;
        }
    }

    /** Drops the site's twins (after its daily views were refilled or rebuilt); the next {@link #build} redoes them. */
    void forget(long siteId) {
        writer.forgetWeeks(siteId);
    }
}

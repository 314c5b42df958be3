package com.example.foldline.demo;

import java.time.Clock;
import java.time.LocalDate;
import java.time.ZoneId;
import java.util.ArrayList;
import java.util.List;

import org.slf4j.Logger;
import org.slf4j.LoggerFactory;
import org.springframework.stereotype.Service;

import com.example.foldline.accounts.Accounts;
import com.example.foldline.accounts.SiteAccess;
import com.example.foldline.accounts.SiteRole;
import com.example.foldline.sessions.BulkSessions;
import com.example.foldline.sessions.Cuboid;
import com.example.foldline.sessions.RollupFill;
import com.example.foldline.sessions.SessionInput;
import com.example.foldline.sites.Site;
import com.example.foldline.sites.SiteSettings;
import com.example.foldline.sites.Sites;
import com.example.foldline.views.Views;

/** Creates the invented publisher's sites and fills them with simulated history (docs/demo.md). */
@Service
public class DemoPublisher {

    private static final Logger log = LoggerFactory.getLogger(DemoPublisher.class);
    public static final String DEMO_USER = "demo";
    public static final String DEMO_PASSWORD = "demo-password";

    private final Sites sites;
    private final Accounts accounts;
    private final BulkSessions bulk;
    private final Clock clock;
    private final SiteAccess access;
    private final Views views;
    private final RollupFill fill;

    DemoPublisher(Sites sites, Accounts accounts, BulkSessions bulk, Clock clock, SiteAccess access, Views views,
                  RollupFill fill) {
        this.fill = fill;
        this.sites = sites;
        this.accounts = accounts;
        this.bulk = bulk;
        this.clock = clock;
        this.access = access;
        this.views = views;
    }

    /** What was created. */
    /**
     * Sessions stored per transaction at most, give or take a day: a week of the news site at scale 101 (10 million
     * sessions on that site) did not fit in a 512 MB heap.
     */
    static final int SESSIONS_PER_STORE = 50_000;

    public record Seeded(List<Site> sites, long sessions, long millis) {
    }

    /** Creates the three sites (and the demo login) and simulates {@code days} days of traffic. */
    public Seeded seed(long seed, int days, double scale) {
        return seed(seed, days, scale, false);
    }

    /**
     * As {@link #seed(long, int, double)}; with {@code quickStart}, the rollup views of the first lattice are written
     * at once and the newer views are left to the background fill ({@link RollupFill}), which starts when the
     * application is ready. The first start is then quicker; answers read the older views until the fill is done.
     */
    public Seeded seed(long seed, int days, double scale, boolean quickStart) {
        long started = System.nanoTime();
        long demoUser = accounts.find(DEMO_USER).orElseGet(() -> accounts.create(DEMO_USER, DEMO_PASSWORD, false)).id();
        List<Site> created = new ArrayList<>();
        long total = 0;
        for (DemoScenario.SiteSpec spec : DemoScenario.SITES) {
            Site site = sites.create(new SiteSettings(spec.name(), spec.domain(), spec.timezone(), spec.currency(),
                    null, null, null));
            sites.createIngestKey(site.id(), "demo tag");
            access.grantUser(site.id(), DEMO_USER, SiteRole.EDITOR);
            created.add(site);
            for (int lattice = 2; quickStart && lattice <= Cuboid.LATTICE; lattice++) {
                fill.defer(site.id(), lattice);
            }
            LocalDate last = LocalDate.now(clock.withZone(ZoneId.of(spec.timezone()))).minusDays(1);
            DemoSimulator simulator = new DemoSimulator(spec, seed, scale, last);
            List<SessionInput> week = new ArrayList<>();
            for (LocalDate day = last.minusDays(days - 1L); !day.isAfter(last); day = day.plusDays(1)) {
                week.addAll(simulator.day(day));
                // a week per transaction: fewer commits, each one a full write of the embedded database's pages;
                // at large scales a day per transaction, so that the heap holds at most a day of sessions
                if (week.size() >= SESSIONS_PER_STORE || day.getDayOfWeek() == java.time.DayOfWeek.SUNDAY
                        || day.equals(last)) {
                    total += bulk.store(site, week, quickStart ? 1 : Cuboid.LATTICE);
                    week = new ArrayList<>();
                }
            }
        }
        for (Site site : created) {
            views.saveAs(site.id(), demoUser, "Phone readers from search: ad density", "density",
                    "device=phone&source=search", true);
            views.saveAs(site.id(), demoUser, "Desktop readers: ad density, last 90 days", "density",
                    "device=desktop&range=90d", true);
            views.saveAs(site.id(), demoUser, "Revenue by country", "geography", "sort=sessionRpm", true);
        }
        long millis = (System.nanoTime() - started) / 1_000_000;
        log.info("Demo publisher seeded: {} sites, {} sessions in {} ms (log in as '{}' / '{}')", created.size(), total,
                millis, DEMO_USER, DEMO_PASSWORD);
        return new Seeded(created, total, millis);
    }
}

package com.example.foldline.sessions;

import java.time.Duration;
import java.time.Instant;
import java.time.ZonedDateTime;
import java.util.ArrayList;
import java.util.List;
import java.util.Objects;

import com.example.foldline.sites.Site;

/**
 * Cuts one visitor's pageviews into sessions (docs/metrics.md, "Sessions"): a new session starts after more than the
 * site's timeout (default 30 minutes, common practice) without a pageview, or when the client's session id changes.
 */
final class SessionBuilder {

    private SessionBuilder() {
    }

    /**
     * @param pageviews  one visitor's pageviews in time order
     * @param closeBefore sessions whose last pageview is before this instant are closed
     */
    static List<SessionFact> build(Site site, List<PageviewRow> pageviews, Instant closeBefore) {
        List<SessionFact> sessions = new ArrayList<>();
        Duration timeout = Duration.ofMinutes(site.sessionTimeoutMinutes());
        int from = 0;
        for (int i = 1; i <= pageviews.size(); i++) {
            boolean cut = i == pageviews.size();
            if (!cut) {
                PageviewRow prev = pageviews.get(i - 1);
                PageviewRow next = pageviews.get(i);
                cut = Duration.between(prev.ts(), next.ts()).compareTo(timeout) > 0
                        || (prev.clientSession() != null && next.clientSession() != null
                        && !Objects.equals(prev.clientSession(), next.clientSession()));
            }
            if (cut && i > from) {
                sessions.add(session(site, pageviews.subList(from, i), closeBefore));
                from = i;
            }
        }
        return sessions;
    }

    private static SessionFact session(Site site, List<PageviewRow> pages, Instant closeBefore) {
        PageviewRow entry = pages.get(0);
        PageviewRow last = pages.get(pages.size() - 1);
        long engaged = 0;
        long revenue = 0;
        int impressions = 0;
        int viewable = 0;
        int clicks = 0;
        long laterAds = 0;
        String clientSession = null;
        List<PageStat> stats = new ArrayList<>(pages.size());
        for (int i = 0; i < pages.size(); i++) {
            PageviewRow p = pages.get(i);
            engaged += p.engagedMs() == null ? 0 : p.engagedMs();
            revenue += p.revenueMicros();
            impressions += p.impressions();
            viewable += p.viewable();
            clicks += p.clicks();
            if (i > 0) {
                laterAds += p.ads();
            }
            if (clientSession == null) {
                clientSession = p.clientSession();
            }
            stats.add(new PageStat(p.ads(), p.engagedMs(), p.revenueMicros(), p.impressions(), p.viewable(),
                    p.clicks()));
        }
        int n = pages.size();
        ZonedDateTime local = entry.ts().atZone(site.timezone());
        return new SessionFact(site.id(), entry.id(), "tag", entry.visitor(), clientSession, entry.ts(), last.ts(),
                local.toLocalDate(), local.getHour(), n, isBounce(site, n, engaged), engaged, entry.path(),
                entry.ads(), n > 1 ? (double) laterAds / (n - 1) : null, entry.source(), entry.device(),
                entry.browser(), entry.os(), entry.country(), entry.region(), entry.variant(), revenue, impressions,
                viewable, clicks, last.ts().isBefore(closeBefore), stats);
    }

    /** Bounce: exactly one pageview, unless the site counts a single page with enough engaged time as engaged. */
    static boolean isBounce(Site site, int pageviews, long engagedMs) {
        if (pageviews != 1) {
            return false;
        }
        return site.engagedSeconds() == null || engagedMs < site.engagedSeconds() * 1000L;
    }
}

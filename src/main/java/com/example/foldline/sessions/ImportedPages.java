package com.example.foldline.sessions;

import java.util.ArrayList;
import java.util.List;

/**
 * An imported session has totals but no pages. For the page-level rollups it is spread over its pages: the entry
 * page carries {@code entryAds}, later pages the rounded mean {@code laterAds}; engaged time, revenue, impressions,
 * viewable impressions and clicks are split evenly (remainders on the entry page). docs/metrics.md states this
 * approximation.
 */
final class ImportedPages {

    private ImportedPages() {
    }

    static SessionFact withPages(SessionFact s) {
        if (!s.pages().isEmpty()) {
            return s;
        }
        int n = s.pageviews();
        int laterAds = s.laterAds() == null ? s.entryAds() : (int) Math.round(s.laterAds());
        List<PageStat> pages = new ArrayList<>(n);
        for (int i = 0; i < n; i++) {
            boolean entry = i == 0;
            pages.add(new PageStat(entry ? s.entryAds() : laterAds,
                    share(s.engagedMs(), n, entry),
                    share(s.revenueMicros(), n, entry),
                    (int) share(s.impressions(), n, entry),
                    (int) share(s.viewableImpressions(), n, entry),
                    (int) share(s.clicks(), n, entry)));
        }
        return new SessionFact(s.siteId(), s.id(), s.origin(), s.visitor(), s.clientSession(), s.start(), s.end(),
                s.localDay(), s.localHour(), s.pageviews(), s.bounce(), s.engagedMs(), s.entryPath(), s.entryAds(),
                s.laterAds(), s.source(), s.device(), s.browser(), s.os(), s.country(), s.region(), s.variant(),
                s.revenueMicros(), s.impressions(), s.viewableImpressions(), s.clicks(), s.closed(), pages);
    }

    private static long share(long total, int n, boolean entry) {
        return total / n + (entry ? total % n : 0);
    }
}

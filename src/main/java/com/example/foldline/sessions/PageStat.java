package com.example.foldline.sessions;

import java.util.ArrayList;
import java.util.List;

/**
 * What one page of a session contributed: ads shown, engaged time and ad results. Kept with the session (column
 * {@code page_detail}) so that page-level rollups can be subtracted exactly when a session is rebuilt or deleted.
 */
record PageStat(int ads, Long engagedMs, long revenueMicros, int impressions, int viewable, int clicks) {

    int engagedBucket() {
        return EngagedBuckets.of(engagedMs);
    }

    static String encode(List<PageStat> pages) {
        StringBuilder sb = new StringBuilder(pages.size() * 16);
        for (PageStat p : pages) {
            if (!sb.isEmpty()) {
                sb.append(';');
            }
            sb.append(p.ads).append(',').append(p.engagedMs == null ? "" : p.engagedMs).append(',')
                    .append(p.revenueMicros).append(',').append(p.impressions).append(',').append(p.viewable)
                    .append(',').append(p.clicks);
        }
        return sb.toString();
    }

    static List<PageStat> decode(String text) {
        List<PageStat> pages = new ArrayList<>();
        if (text == null || text.isEmpty()) {
            return pages;
        }
        for (String page : text.split(";")) {
            String[] f = page.split(",", -1);
            pages.add(new PageStat(Integer.parseInt(f[0]), f[1].isEmpty() ? null : Long.parseLong(f[1]),
                    Long.parseLong(f[2]), Integer.parseInt(f[3]), Integer.parseInt(f[4]), Integer.parseInt(f[5])));
        }
        return pages;
    }
}

package com.example.foldline.sessions;

import java.util.List;

/** Engaged-time buckets for pageviews: 0–5 s, 5–10, 10–20, 20–30, 30–60, 60–120, 120+; 7 means not measured. */
public final class EngagedBuckets {

    public static final List<String> LABELS = List.of("0-5 s", "5-10 s", "10-20 s", "20-30 s", "30-60 s", "60-120 s",
            "120+ s");
    /** Lower bounds in milliseconds. */
    public static final long[] LOWER_MS = {0, 5_000, 10_000, 20_000, 30_000, 60_000, 120_000};
    public static final int UNKNOWN = 7;

    private EngagedBuckets() {
    }

    public static int of(Long engagedMs) {
        if (engagedMs == null) {
            return UNKNOWN;
        }
        for (int i = LOWER_MS.length - 1; i >= 0; i--) {
            if (engagedMs >= LOWER_MS[i]) {
                return i;
            }
        }
        return 0;
    }
}

package com.example.foldline.sessions;

/**
 * A dimension a rollup can group by. Segment dimensions filter; the others are the axes of particular answers.
 * {@code column} is the column name in the rollup tables and in {@code session_fact} (where it exists there).
 */
public enum Dim {
    DEVICE("device", true),
    SOURCE("source", true),
    BROWSER("browser", true),
    VARIANT("variant", true),
    COUNTRY("country", true),
    REGION("region", true),
    HOUR("local_hour", false),
    ENTRY_ADS("entry_ads", false),
    PAGES("pages", false),
    ENTRY_PATH("entry_path", false),
    /** page level: ads on the page */
    ADS("ads", false),
    /** page level: 0 entry page, 1 later page */
    POSITION("page_position", false),
    /** page level: engaged-time bucket, see {@link EngagedBuckets} */
    ENGAGED_BUCKET("engaged_bucket", false);

    private final String column;
    private final boolean segment;

    Dim(String column, boolean segment) {
        this.column = column;
        this.segment = segment;
    }

    public String column() {
        return column;
    }

    public boolean isSegment() {
        return segment;
    }

    /** Numeric dimensions use -1 for "not grouped"; text dimensions use ''. */
    public boolean isNumeric() {
        return this == HOUR || this == ENTRY_ADS || this == PAGES || this == ADS || this == POSITION
                || this == ENGAGED_BUCKET;
    }
}

-- Sessions: built on the server from pageviews (origin 'tag') or imported whole (origin 'import').
CREATE TABLE session_fact (
    site_id              BIGINT                   NOT NULL,
    id                   VARCHAR(80)              NOT NULL,
    visitor              VARCHAR(32)              NOT NULL,
    client_session       VARCHAR(64),
    start_ts             TIMESTAMP WITH TIME ZONE NOT NULL,
    end_ts               TIMESTAMP WITH TIME ZONE NOT NULL,
    local_day            DATE                     NOT NULL,
    local_hour           SMALLINT                 NOT NULL,
    pageviews            INT                      NOT NULL,
    bounce               BOOLEAN                  NOT NULL,
    engaged_ms           BIGINT                   NOT NULL,
    entry_path           VARCHAR(2048)            NOT NULL,
    entry_ads            SMALLINT                 NOT NULL,
    later_ads            DOUBLE PRECISION,
    source               VARCHAR(16)              NOT NULL,
    device               VARCHAR(16)              NOT NULL,
    browser              VARCHAR(64),
    os                   VARCHAR(64),
    country              VARCHAR(2),
    region               VARCHAR(6),
    variant              VARCHAR(64),
    revenue_micros       BIGINT                   NOT NULL,
    impressions          INT                      NOT NULL,
    viewable_impressions INT                      NOT NULL,
    clicks               INT                      NOT NULL,
    page_detail          TEXT                     NOT NULL,
    origin               VARCHAR(8)               NOT NULL,
    rolled_up            BOOLEAN                  NOT NULL DEFAULT FALSE,
    closed               BOOLEAN                  NOT NULL,
    updated_at           TIMESTAMP WITH TIME ZONE NOT NULL,
    PRIMARY KEY (site_id, origin, id)
);
CREATE INDEX session_fact_day_idx ON session_fact (site_id, local_day);
CREATE INDEX session_fact_visitor_idx ON session_fact (site_id, visitor, start_ts);
CREATE INDEX session_fact_open_idx ON session_fact (site_id, closed, end_ts);
CREATE INDEX session_fact_rollup_idx ON session_fact (site_id, rolled_up);

-- The newest event time the sessionizer has seen per site (sessions close against it as well as wall time).
CREATE TABLE sessionizer_state (
    site_id   BIGINT PRIMARY KEY,
    newest_ts TIMESTAMP WITH TIME ZONE NOT NULL
);

-- Pre-aggregated session measures: one row per (cuboid, day, values of the cuboid's dimensions). Dimensions that a
-- cuboid does not group by hold '' (text) or -1 (numbers). See docs/architecture.md.
CREATE TABLE rollup_session (
    site_id              BIGINT           NOT NULL,
    cuboid               SMALLINT         NOT NULL,
    local_day            DATE             NOT NULL,
    local_hour           SMALLINT         NOT NULL,
    device               VARCHAR(16)      NOT NULL,
    source               VARCHAR(16)      NOT NULL,
    browser              VARCHAR(64)      NOT NULL,
    variant              VARCHAR(64)      NOT NULL,
    country              VARCHAR(2)       NOT NULL,
    region               VARCHAR(6)       NOT NULL,
    entry_ads            SMALLINT         NOT NULL,
    pages                SMALLINT         NOT NULL,
    entry_path           VARCHAR(512)     NOT NULL,
    sessions             BIGINT           NOT NULL,
    bounces              BIGINT           NOT NULL,
    pageviews            BIGINT           NOT NULL,
    pageviews_sq         DOUBLE PRECISION NOT NULL,
    engaged_ms           BIGINT           NOT NULL,
    engaged_sq           DOUBLE PRECISION NOT NULL,
    revenue_micros       BIGINT           NOT NULL,
    revenue_sq           DOUBLE PRECISION NOT NULL,
    entry_ads_sum        BIGINT           NOT NULL,
    impressions          BIGINT           NOT NULL,
    viewable_impressions BIGINT           NOT NULL,
    clicks               BIGINT           NOT NULL,
    PRIMARY KEY (site_id, cuboid, local_day, local_hour, device, source, browser, variant, country, region, entry_ads, pages,
                 entry_path)
);

-- Pre-aggregated page measures, by ads on the page, position (0 entry, 1 later) and engaged-time bucket.
CREATE TABLE rollup_page (
    site_id              BIGINT           NOT NULL,
    cuboid               SMALLINT         NOT NULL,
    local_day            DATE             NOT NULL,
    device               VARCHAR(16)      NOT NULL,
    source               VARCHAR(16)      NOT NULL,
    browser              VARCHAR(64)      NOT NULL,
    variant              VARCHAR(64)      NOT NULL,
    country              VARCHAR(2)       NOT NULL,
    region               VARCHAR(6)       NOT NULL,
    ads                  SMALLINT         NOT NULL,
    page_position        SMALLINT         NOT NULL,
    engaged_bucket       SMALLINT         NOT NULL,
    pageviews            BIGINT           NOT NULL,
    exits                BIGINT           NOT NULL,
    engaged_ms           BIGINT           NOT NULL,
    revenue_micros       BIGINT           NOT NULL,
    revenue_sq           DOUBLE PRECISION NOT NULL,
    impressions          BIGINT           NOT NULL,
    viewable_impressions BIGINT           NOT NULL,
    clicks               BIGINT           NOT NULL,
    PRIMARY KEY (site_id, cuboid, local_day, device, source, browser, variant, country, region, ads, page_position,
                 engaged_bucket)
);

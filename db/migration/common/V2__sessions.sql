-- Sessions: built on the server from pageviews (origin 'tag') or imported whole (origin 'import').
CREATE TABLE session_fact (
    site_id              BIGINT                   NOT NULL,
    id                   VARCHAR(80)              NOT NULL,
    visitor              VARCHAR(32)              NOT NULL,
    client_session       VARCHAR(64),
    start_ts             TIMESTAMP WITH TIME ZONE NOT NULL,
    end_ts               TIMESTAMP WITH TIME ZONE NOT NULL,
    local_day            DATE                     NOT NULL,
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
    origin               VARCHAR(8)               NOT NULL,
    closed               BOOLEAN                  NOT NULL,
    updated_at           TIMESTAMP WITH TIME ZONE NOT NULL,
    PRIMARY KEY (site_id, origin, id)
);
CREATE INDEX session_fact_day_idx ON session_fact (site_id, local_day);
CREATE INDEX session_fact_visitor_idx ON session_fact (site_id, visitor, start_ts);

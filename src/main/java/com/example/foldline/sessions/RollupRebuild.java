package com.example.foldline.sessions;

import org.springframework.jdbc.core.JdbcTemplate;
import org.springframework.stereotype.Service;
import org.springframework.transaction.support.TransactionTemplate;

/**
 * Rebuilds a site's sessions and rollups from its raw events: removes built sessions and all rollup rows, queues
 * every visitor of the site for the sessionizer, marks imported sessions as not yet rolled up, and runs it.
 */
@Service
public class RollupRebuild {

    private final JdbcTemplate jdbc;
    private final RollupWriter rollups;
    private final SessionRepository sessions;
    private final Sessionizer sessionizer;
    private final TransactionTemplate tx;
    private final RollupFill fills;

    RollupRebuild(JdbcTemplate jdbc, RollupWriter rollups, SessionRepository sessions, Sessionizer sessionizer,
                  TransactionTemplate tx, RollupFill fills) {
        this.fills = fills;
        this.jdbc = jdbc;
        this.rollups = rollups;
        this.sessions = sessions;
        this.sessionizer = sessionizer;
        this.tx = tx;
    }

    public Sessionizer.Report rebuild(long siteId) {
        tx.executeWithoutResult(status -> {
            sessions.lockSite(siteId);
            rollups.clear(siteId);
            fills.forget(siteId); // every view is rebuilt from the same raw events
            jdbc.update("DELETE FROM session_fact WHERE site_id = ? AND origin = 'tag'", siteId);
            jdbc.update("UPDATE session_fact SET rolled_up = FALSE WHERE site_id = ?", siteId);
            jdbc.update("DELETE FROM ingest_batch WHERE site_id = ?", siteId);
        });
        sessionizer.rebuildAll(siteId);
        return sessionizer.run(siteId);
    }
}

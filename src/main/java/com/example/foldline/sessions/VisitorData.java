package com.example.foldline.sessions;

import java.sql.Timestamp;
import java.time.Instant;
import java.util.List;

import org.springframework.jdbc.core.JdbcTemplate;
import org.springframework.stereotype.Service;
import org.springframework.transaction.support.TransactionTemplate;

/**
 * Removes reader data: one visitor's events and sessions (their contributions are taken out of the rollups, so
 * the numbers no longer include them), or everything older than a site's retention (raw events and sessions go;
 * the rollups, which hold only aggregates, keep the history).
 */
@Service
public class VisitorData {

    /** What a deletion removed. */
    public record Deleted(long sessions, long pageviews, long impressions, long pageEnds) {
    }

    private final JdbcTemplate jdbc;
    private final SessionRepository sessions;
    private final RollupWriter rollups;
    private final TransactionTemplate tx;

    VisitorData(JdbcTemplate jdbc, SessionRepository sessions, RollupWriter rollups, TransactionTemplate tx) {
        this.jdbc = jdbc;
        this.sessions = sessions;
        this.rollups = rollups;
        this.tx = tx;
    }

    /** Deletes everything stored about the visitor with this pseudonym on the site. */
    public Deleted deleteVisitor(long siteId, String pseudonym) {
        return tx.execute(status -> {
            sessions.lockSite(siteId);
            List<SessionFact> facts = sessions.visitorSessions(siteId, pseudonym);
            Contributions contributions = new Contributions(rollups.weeksBuiltThrough(siteId));
            facts.forEach(s -> contributions.add(s.origin().equals("import") ? ImportedPages.withPages(s) : s, -1));
            rollups.apply(siteId, contributions);
            int pageEnds = jdbc.update("""
                    DELETE FROM page_end WHERE site_id = ? AND pageview_id IN
                      (SELECT id FROM pageview WHERE site_id = ? AND visitor = ?)""", siteId, siteId, pseudonym);
            int impressions = jdbc.update("""
                    DELETE FROM impression WHERE site_id = ? AND pageview_id IN
                      (SELECT id FROM pageview WHERE site_id = ? AND visitor = ?)""", siteId, siteId, pseudonym);
            int pageviews = jdbc.update("DELETE FROM pageview WHERE site_id = ? AND visitor = ?", siteId, pseudonym);
            int deleted = jdbc.update("DELETE FROM session_fact WHERE site_id = ? AND visitor = ?", siteId, pseudonym);
            return new Deleted(deleted, pageviews, impressions, pageEnds);
        });
    }

    /** Deletes raw events and sessions that started before {@code cutoff}. */
    public Deleted purgeBefore(long siteId, Instant cutoff) {
        return tx.execute(status -> {
            Timestamp t = Timestamp.from(cutoff);
            int pageEnds = jdbc.update("DELETE FROM page_end WHERE site_id = ? AND received_at < ?", siteId, t);
            int impressions = jdbc.update("DELETE FROM impression WHERE site_id = ? AND received_at < ?", siteId, t);
            int pageviews = jdbc.update("DELETE FROM pageview WHERE site_id = ? AND ts < ?", siteId, t);
            int deleted = jdbc.update("DELETE FROM session_fact WHERE site_id = ? AND start_ts < ? AND closed = TRUE",
                    siteId, t);
            return new Deleted(deleted, pageviews, impressions, pageEnds);
        });
    }
}

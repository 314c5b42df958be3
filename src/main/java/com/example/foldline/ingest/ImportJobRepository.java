package com.example.foldline.ingest;

import java.sql.PreparedStatement;
import java.sql.ResultSet;
import java.sql.SQLException;
import java.sql.Timestamp;
import java.sql.Types;
import java.time.Instant;
import java.util.List;
import java.util.Optional;

import org.springframework.jdbc.core.JdbcTemplate;
import org.springframework.jdbc.core.SqlParameterValue;
import org.springframework.jdbc.support.GeneratedKeyHolder;
import org.springframework.stereotype.Repository;

/** The import_job table: jobs, their claim by a worker, and their progress. */
@Repository
class ImportJobRepository {

    private static final String COLUMNS = """
            id, site_id, state, format, origin, file_name, source_path, mapping, created_by, bytes_total, bytes_read,
            lines_read, stored, duplicates, rejected, rejection_bytes, cancel_requested, message, created_at,
            started_at, finished_at, estimated_finish""";

    private final JdbcTemplate jdbc;

    ImportJobRepository(JdbcTemplate jdbc) {
        this.jdbc = jdbc;
    }

    /** A job to be created in state queued. */
    record NewJob(long siteId, String format, String origin, String fileName, String sourcePath, String mapping,
                  String createdBy, long bytesTotal, Instant createdAt) {
    }

    long insert(NewJob j) {
        GeneratedKeyHolder keys = new GeneratedKeyHolder();
        jdbc.update(c -> {
            PreparedStatement ps = c.prepareStatement("""
                    INSERT INTO import_job (site_id, state, format, origin, file_name, source_path, mapping,
                                            created_by, bytes_total, created_at)
                    VALUES (?, 'queued', ?, ?, ?, ?, ?, ?, ?, ?)""", new String[]{"id"});
            ps.setLong(1, j.siteId());
            ps.setString(2, j.format());
            ps.setString(3, j.origin());
            ps.setString(4, j.fileName());
            ps.setString(5, j.sourcePath());
            ps.setString(6, j.mapping());
            ps.setString(7, j.createdBy());
            ps.setLong(8, j.bytesTotal());
            ps.setTimestamp(9, Timestamp.from(j.createdAt()));
            return ps;
        }, keys);
        return keys.getKey().longValue();
    }

    Optional<ImportJob> find(long siteId, long id) {
        return jdbc.query("SELECT " + COLUMNS + " FROM import_job WHERE site_id = ? AND id = ?",
                ImportJobRepository::job, siteId, id).stream().findFirst();
    }

    /** The site's jobs, newest first. */
    List<ImportJob> list(long siteId, int limit) {
        return jdbc.query("SELECT " + COLUMNS + " FROM import_job WHERE site_id = ? ORDER BY id DESC LIMIT ?",
                ImportJobRepository::job, siteId, limit);
    }

    /** Queued jobs, oldest first, of sites that have no job being read (one job at a time per site). */
    List<ImportJob> claimable(int limit) {
        return jdbc.query("SELECT " + COLUMNS + """
                         FROM import_job j
                        WHERE j.state = 'queued' AND NOT EXISTS (
                              SELECT 1 FROM import_job r WHERE r.site_id = j.site_id AND r.state = 'reading')
                        ORDER BY j.id LIMIT ?""", ImportJobRepository::job, limit);
    }

    /** Moves a queued job to reading; false when another worker (or a cancel) got there first. */
    boolean claim(long siteId, long id, Instant now) {
        Timestamp t = Timestamp.from(now);
        return jdbc.update("""
                UPDATE import_job SET state = 'reading', started_at = COALESCE(started_at, ?), heartbeat_at = ?
                WHERE site_id = ? AND id = ? AND state = 'queued'""", t, t, siteId, id) == 1;
    }

    /**
     * Records one commit's progress; runs in the commit's transaction. A job queued again while its worker was only
     * slow is marked reading again. Returns whether a cancel was requested.
     */
    boolean progress(long siteId, long id, long bytesRead, long linesRead, long stored, long duplicates, long rejected,
                     long rejectionBytes, Instant estimatedFinish, Instant now) {
        jdbc.update("""
                        UPDATE import_job SET state = CASE WHEN state = 'queued' THEN 'reading' ELSE state END,
                                              bytes_read = ?, lines_read = ?, stored = stored + ?,
                                              duplicates = duplicates + ?, rejected = rejected + ?, rejection_bytes = ?,
                                              estimated_finish = ?, heartbeat_at = ?
                        WHERE site_id = ? AND id = ?""", bytesRead, linesRead, stored, duplicates, rejected,
                rejectionBytes, new SqlParameterValue(Types.TIMESTAMP, estimatedFinish == null ? null
                        : Timestamp.from(estimatedFinish)), Timestamp.from(now),
                siteId, id);
        return Boolean.TRUE.equals(jdbc.queryForObject(
                "SELECT cancel_requested FROM import_job WHERE site_id = ? AND id = ?", Boolean.class, siteId, id));
    }

    /** Ends a job that is queued or reading; a finished job stays as it is. */
    void finish(long siteId, long id, String state, String message, Instant now) {
        jdbc.update("""
                UPDATE import_job SET state = ?, message = ?, finished_at = ?, estimated_finish = NULL
                WHERE site_id = ? AND id = ? AND state IN ('queued', 'reading')""", state,
                message == null ? null : truncate(message, 2000), Timestamp.from(now), siteId, id);
    }

    /** Cancels a queued job at once; returns false when the job is not queued. */
    boolean cancelQueued(long siteId, long id, Instant now) {
        return jdbc.update("""
                UPDATE import_job SET state = 'cancelled', cancel_requested = TRUE, finished_at = ?,
                                      message = 'cancelled before it started'
                WHERE site_id = ? AND id = ? AND state = 'queued'""", Timestamp.from(now), siteId, id) == 1;
    }

    /** Asks the worker reading a job to stop at the next line; returns false when the job is not being read. */
    boolean requestCancel(long siteId, long id) {
        return jdbc.update("""
                UPDATE import_job SET cancel_requested = TRUE WHERE site_id = ? AND id = ? AND state = 'reading'""",
                siteId, id) == 1;
    }

    /**
     * Jobs left in reading by a worker that stopped (no commit since {@code staleBefore}): those with a cancel request
     * become cancelled, the others queued again, to resume from their last commit. Returns how many were requeued.
     */
    int recoverStale(Instant staleBefore, Instant now) {
        Timestamp stale = Timestamp.from(staleBefore);
        jdbc.update("""
                UPDATE import_job SET state = 'cancelled', finished_at = ?, estimated_finish = NULL
                WHERE state = 'reading' AND cancel_requested AND heartbeat_at < ?""", Timestamp.from(now), stale);
        return jdbc.update("""
                UPDATE import_job SET state = 'queued', estimated_finish = NULL
                WHERE state = 'reading' AND heartbeat_at < ?""", stale);
    }

    private static String truncate(String s, int max) {
        return s.length() <= max ? s : s.substring(0, max - 1) + "…";
    }

    private static ImportJob job(ResultSet rs, int row) throws SQLException {
        return new ImportJob(rs.getLong("id"), rs.getLong("site_id"), rs.getString("state"), rs.getString("format"),
                rs.getString("origin"), rs.getString("file_name"), rs.getString("source_path"),
                rs.getString("mapping"), rs.getString("created_by"), rs.getLong("bytes_total"),
                rs.getLong("bytes_read"), rs.getLong("lines_read"), rs.getLong("stored"), rs.getLong("duplicates"),
                rs.getLong("rejected"), rs.getLong("rejection_bytes"), rs.getBoolean("cancel_requested"),
                rs.getString("message"), instant(rs, "created_at"), instant(rs, "started_at"),
                instant(rs, "finished_at"), instant(rs, "estimated_finish"));
    }

    private static Instant instant(ResultSet rs, String column) throws SQLException {
        Timestamp ts = rs.getTimestamp(column);
        return ts == null ? null : ts.toInstant();
    }
}

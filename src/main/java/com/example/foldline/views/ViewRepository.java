package com.example.foldline.views;

import java.sql.ResultSet;
import java.sql.SQLException;
import java.sql.Timestamp;
import java.time.Instant;
import java.util.List;
import java.util.Optional;

import org.springframework.jdbc.core.simple.JdbcClient;
import org.springframework.stereotype.Repository;

@Repository
class ViewRepository {

    private static final String SELECT = """
            SELECT v.id, v.site_id, v.owner_id, u.username, v.slug, v.name, v.screen, v.view_state, v.shared, v.pinned,
                   v.created_at, v.last_opened_at, v.deleted_at
            FROM saved_view v JOIN app_user u ON u.id = v.owner_id""";

    private final JdbcClient jdbc;

    ViewRepository(JdbcClient jdbc) {
        this.jdbc = jdbc;
    }

    void insert(long siteId, long ownerId, String slug, String name, String screen, String state, boolean shared,
                Instant now) {
        jdbc.sql("""
                        INSERT INTO saved_view (site_id, owner_id, slug, name, screen, view_state, shared, created_at)
                        VALUES (:site, :owner, :slug, :name, :screen, :state, :shared, :now)""")
                .param("site", siteId).param("owner", ownerId).param("slug", slug).param("name", name)
                .param("screen", screen).param("state", state).param("shared", shared)
                .param("now", Timestamp.from(now)).update();
    }

    Optional<SavedView> bySlug(String slug) {
        return jdbc.sql(SELECT + " WHERE v.slug = :slug").param("slug", slug).query(ViewRepository::map).optional();
    }

    Optional<SavedView> byId(long siteId, long id) {
        return jdbc.sql(SELECT + " WHERE v.site_id = :site AND v.id = :id").param("site", siteId).param("id", id)
                .query(ViewRepository::map).optional();
    }

    /** Live views of a site visible to a user: shared ones and the user's own; pinned first. */
    List<SavedView> visible(long siteId, long userId) {
        return jdbc.sql(SELECT + """
                         WHERE v.site_id = :site AND v.deleted_at IS NULL AND (v.shared = TRUE OR v.owner_id = :user)
                        ORDER BY v.pinned DESC, v.name""")
                .param("site", siteId).param("user", userId).query(ViewRepository::map).list();
    }

    void opened(long id, Instant now) {
        jdbc.sql("UPDATE saved_view SET last_opened_at = :now WHERE id = :id").param("now", Timestamp.from(now))
                .param("id", id).update();
    }

    void pin(long id, boolean pinned) {
        jdbc.sql("UPDATE saved_view SET pinned = :pinned WHERE id = :id").param("pinned", pinned).param("id", id)
                .update();
    }

    void delete(long id, Instant now) {
        jdbc.sql("UPDATE saved_view SET deleted_at = :now WHERE id = :id").param("now", Timestamp.from(now))
                .param("id", id).update();
    }

    private static SavedView map(ResultSet rs, int row) throws SQLException {
        return new SavedView(rs.getLong(1), rs.getLong(2), rs.getLong(3), rs.getString(4), rs.getString(5),
                rs.getString(6), rs.getString(7), rs.getString(8), rs.getBoolean(9), rs.getBoolean(10),
                ts(rs.getTimestamp(11)), ts(rs.getTimestamp(12)), ts(rs.getTimestamp(13)),
                SavedView.linkOf(rs.getString(5)));
    }

    private static Instant ts(Timestamp t) {
        return t == null ? null : t.toInstant();
    }
}

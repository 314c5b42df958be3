package com.example.foldline.annotations;

import java.sql.Date;
import java.sql.ResultSet;
import java.sql.SQLException;
import java.sql.Timestamp;
import java.time.Instant;
import java.time.LocalDate;
import java.util.List;
import java.util.Optional;

import org.springframework.jdbc.core.simple.JdbcClient;
import org.springframework.jdbc.support.GeneratedKeyHolder;
import org.springframework.stereotype.Repository;

@Repository
class AnnotationRepository {

    private static final String COLUMNS = "id, site_id, annotated_on, note, created_by, created_at";

    private final JdbcClient jdbc;

    AnnotationRepository(JdbcClient jdbc) {
        this.jdbc = jdbc;
    }

    long insert(long siteId, LocalDate date, String text, String createdBy, Instant now) {
        GeneratedKeyHolder keys = new GeneratedKeyHolder();
        jdbc.sql("""
                        INSERT INTO annotation (site_id, annotated_on, note, created_by, created_at)
                        VALUES (:site, :date, :note, :by, :now)""")
                .param("site", siteId).param("date", Date.valueOf(date)).param("note", text).param("by", createdBy)
                .param("now", Timestamp.from(now))
                .update(keys, "id");
        return keys.getKey().longValue();
    }

    /** The site's annotations from {@code from} to {@code to} inclusive, by date then id. */
    List<Annotation> findBetween(long siteId, LocalDate from, LocalDate to) {
        return jdbc.sql("SELECT " + COLUMNS + """
                         FROM annotation
                        WHERE site_id = :site AND annotated_on BETWEEN :from AND :to
                        ORDER BY annotated_on, id""")
                .param("site", siteId).param("from", Date.valueOf(from)).param("to", Date.valueOf(to))
                .query(AnnotationRepository::map).list();
    }

    Optional<Annotation> find(long siteId, long id) {
        return jdbc.sql("SELECT " + COLUMNS + " FROM annotation WHERE site_id = :site AND id = :id")
                .param("site", siteId).param("id", id).query(AnnotationRepository::map).optional();
    }

    /** Deletes one annotation of the site; false when the site has no annotation with that id. */
    boolean delete(long siteId, long id) {
        return jdbc.sql("DELETE FROM annotation WHERE site_id = :site AND id = :id")
                .param("site", siteId).param("id", id).update() > 0;
    }

    private static Annotation map(ResultSet rs, int row) throws SQLException {
        return new Annotation(rs.getLong("id"), rs.getLong("site_id"), rs.getDate("annotated_on").toLocalDate(),
                rs.getString("note"), rs.getString("created_by"), rs.getTimestamp("created_at").toInstant());
    }
}

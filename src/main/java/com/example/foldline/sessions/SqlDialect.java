package com.example.foldline.sessions;

import org.springframework.jdbc.core.JdbcTemplate;
import org.springframework.stereotype.Component;

/**
 * Which database the sessions package writes to, for the few statements whose fastest form differs: PostgreSQL gets
 * key look-ups as {@code = ANY(array)}, multi-row inserts and {@code ON CONFLICT DO UPDATE} upserts; embedded H2 gets
 * {@code VALUES} joins and single-row batches (docs/benchmarks.md, "Sessionizer").
 */
@Component
class SqlDialect {

    private final JdbcTemplate jdbc;
    private volatile Boolean postgres;

    SqlDialect(JdbcTemplate jdbc) {
        this.jdbc = jdbc;
    }

    boolean postgres() {
        Boolean p = postgres;
        if (p == null) {
            String product = jdbc.execute((java.sql.Connection c) -> c.getMetaData().getDatabaseProductName());
            p = "PostgreSQL".equals(product);
            postgres = p;
        }
        return p;
    }
}

package com.example.foldline.demo;

import java.io.PrintStream;
import java.util.List;

import org.springframework.jdbc.core.JdbcTemplate;
import org.springframework.stereotype.Component;
import org.springframework.transaction.support.TransactionTemplate;

import com.example.foldline.sites.Site;
import com.example.foldline.sites.Sites;

/**
 * {@code java -jar foldline.jar demo [--scale X] [--days N] [--seed S] [--replace]}: seeds the demo publisher into
 * the configured database at any scale (scale 1 ≈ 2,250 sessions a day; 10M sessions over 90 days ≈ scale 50).
 * Refuses a database that already has sites unless {@code --replace}, which deletes only the demo sites' data.
 */
@Component
public class DemoCommand {

    private static final List<String> TABLES = List.of("rollup_session", "rollup_page", "session_fact",
            "ingest_batch", "sessionizer_state", "impression", "page_end", "pageview", "ingest_key");

    private final DemoPublisher publisher;
    private final Sites sites;
    private final JdbcTemplate jdbc;
    private final TransactionTemplate tx;

    DemoCommand(DemoPublisher publisher, Sites sites, JdbcTemplate jdbc, TransactionTemplate tx) {
        this.publisher = publisher;
        this.sites = sites;
        this.jdbc = jdbc;
        this.tx = tx;
    }

    public int run(String[] args, PrintStream out, PrintStream err) {
        double scale = 1;
        int days = 60;
        long seed = 20261202;
        boolean replace = false;
        for (int i = 0; i < args.length; i++) {
            switch (args[i]) {
                case "--scale" -> scale = Double.parseDouble(args[++i]);
                case "--days" -> days = Integer.parseInt(args[++i]);
                case "--seed" -> seed = Long.parseLong(args[++i]);
                case "--replace" -> replace = true;
                default -> {
                    err.println("usage: demo [--scale X] [--days N] [--seed S] [--replace]");
                    return 2;
                }
            }
        }
        List<String> demoDomains = DemoScenario.SITES.stream().map(DemoScenario.SiteSpec::domain).toList();
        List<Site> existing = sites.all();
        if (!existing.isEmpty()) {
            boolean onlyDemo = existing.stream().allMatch(s -> demoDomains.contains(s.domain()));
            if (!replace || !onlyDemo) {
                err.println("the database already has sites; demo data goes only into an empty database, or with "
                        + "--replace into one that holds nothing but the demo sites");
                return 1;
            }
            tx.executeWithoutResult(status -> existing.forEach(s -> {
                for (String table : TABLES) {
                    jdbc.update("DELETE FROM " + table + " WHERE site_id = ?", s.id());
                }
                jdbc.update("DELETE FROM site WHERE id = ?", s.id());
            }));
        }
        DemoPublisher.Seeded seeded = publisher.seed(seed, days, scale);
        out.printf("seeded %d sites, %d sessions in %.1f s%n", seeded.sites().size(), seeded.sessions(),
                seeded.millis() / 1000.0);
        return 0;
    }
}

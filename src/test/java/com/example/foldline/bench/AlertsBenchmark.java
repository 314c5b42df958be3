package com.example.foldline.bench;

import java.nio.file.Files;
import java.nio.file.Path;
import java.sql.Date;
import java.time.Instant;
import java.time.LocalDate;
import java.time.ZoneId;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Map;
import java.util.SplittableRandom;

import javax.sql.DataSource;

import org.springframework.boot.builder.SpringApplicationBuilder;
import org.springframework.context.ConfigurableApplicationContext;
import org.springframework.jdbc.core.JdbcTemplate;

import com.example.foldline.FoldlineApplication;
import com.example.foldline.alerts.AlertEvaluator;
import com.example.foldline.alerts.AlertRules;
import com.example.foldline.alerts.EvaluationReport;
import com.example.foldline.alerts.RuleRequest;
import com.example.foldline.sessions.Dim;
import com.example.foldline.sessions.Rollups;
import com.example.foldline.sessions.SegmentFilter;
import com.example.foldline.sites.Site;
import com.example.foldline.sites.SiteSettings;
import com.example.foldline.sites.Sites;

/**
 * Issue #7 benchmark (a command, not a test; docs/benchmarks.md, "Alerts"): evaluation time of N alert rules
 * (default 1,000) against the hourly rollups, and in the same run a reference: one plain hourly rollup query of 8
 * days, as the metrics API makes. The rollup rows are generated directly (the evaluator reads only rollups): S sites
 * × D days × 24 hours, each hour split into 4 devices × 7 sources × 2 variants (view 21) and 25 countries (view 22)
 * plus the hour total (view 20), ~600 sessions per site-hour on average with a daily rhythm (≈ 10 M sessions at
 * the defaults 20 sites × 35 days).
 * Each timed run moves the clock one hour on, so every rule has exactly one new window to judge.
 *
 * <p>{@code --rules N --sites S --days D --runs R --sessions-per-hour H}; {@code --no-keep} reads every baseline day
 * on every run; {@code --pg} uses PostgreSQL at BENCH_PG_URL (default
 * jdbc:postgresql://127.0.0.1:5432/foldline_alerts_bench, user/password foldline, a database of its own) instead of
 * an H2 file under target/.
 */
public final class AlertsBenchmark {

    private static final String[] DEVICES = {"phone", "desktop", "tablet", "other"};
    private static final String[] SOURCES = {"search", "social", "direct", "referral", "email", "paid", "other"};
    private static final String[] VARIANTS = {"A", "B"};
    private static final String[] COUNTRIES = {"DE", "FR", "PT", "ES", "IT", "NL", "BE", "AT", "CH", "PL", "SE", "DK",
            "NO", "FI", "IE", "GB", "US", "CA", "BR", "MX", "AU", "JP", "IN", "ZA", "CZ"};
    private static final ZoneId ZONE = ZoneId.of("Europe/Berlin");

    private AlertsBenchmark() {
    }

    public static void main(String[] args) throws Exception {
        int rules = (int) arg(args, "rules", 1000);
        int siteCount = (int) arg(args, "sites", 20);
        int days = (int) arg(args, "days", 35);
        int runs = (int) arg(args, "runs", 21);
        int perHour = (int) arg(args, "sessions-per-hour", 440);
        boolean pg = Arrays.asList(args).contains("--pg");
        boolean keep = !Arrays.asList(args).contains("--no-keep");
        String url;
        if (pg) {
            url = System.getenv().getOrDefault("BENCH_PG_URL", "jdbc:postgresql://127.0.0.1:5432/foldline_alerts_bench");
        } else {
            Path dir = Path.of("target", "bench-alerts");
            if (Files.exists(dir)) {
                try (var files = Files.walk(dir)) {
                    files.sorted(java.util.Comparator.reverseOrder()).forEach(p -> p.toFile().delete());
                }
            }
            url = "jdbc:h2:file:./target/bench-alerts/db;MODE=PostgreSQL;DATABASE_TO_LOWER=TRUE;"
                    + "CASE_INSENSITIVE_IDENTIFIERS=TRUE;DEFAULT_NULL_ORDERING=HIGH;NON_KEYWORDS=VALUE,KEY;"
                    + "OPTIMIZE_REUSE_RESULTS=0;WRITE_DELAY=0";
        }
        // command-line arguments: they take precedence over application.yml (default properties would not)
        try (ConfigurableApplicationContext context = new SpringApplicationBuilder(FoldlineApplication.class)
                .run("--server.port=0", "--spring.datasource.url=" + url,
                        "--spring.datasource.username=" + (pg ? "foldline" : "sa"),
                        "--spring.datasource.password=" + (pg ? "foldline" : ""),
                        "--foldline.alerts.scheduler-enabled=false", "--foldline.demo.enabled=false",
                        "--foldline.alerts.rollup-cache-ttl=" + (keep ? "PT1H" : "PT0S"),
                        "--logging.level.root=WARN")) {
            run(context, pg, keep, rules, siteCount, days, runs, perHour);
        }
        System.exit(0);
    }

    private static void run(ConfigurableApplicationContext context, boolean pg, boolean keep, int ruleCount,
                            int siteCount, int days, int runs, int perHour) {
        Sites sites = context.getBean(Sites.class);
        AlertRules alertRules = context.getBean(AlertRules.class);
        AlertEvaluator evaluator = context.getBean(AlertEvaluator.class);
        Rollups rollups = context.getBean(Rollups.class);
        JdbcTemplate jdbc = new JdbcTemplate(context.getBean(DataSource.class));
        LocalDate last = LocalDate.of(2026, 11, 30);
        LocalDate first = last.minusDays(days - 1);

        // the benchmark database is its own (recreate it between runs, docs/benchmarks.md); rules of an earlier
        // run would be judged too
        jdbc.update("DELETE FROM alert_rule");
        long t0 = System.nanoTime();
        List<Site> made = new ArrayList<>();
        long sessions = 0;
        long rows = 0;
        for (int s = 0; s < siteCount; s++) {
            Site site = sites.create(new SiteSettings("Bench site " + s, "bench" + s + "-" + System.nanoTime()
                    + ".example", ZONE.getId(), "EUR", null, null, 3660));
            made.add(site);
            long[] counts = seed(jdbc, site.id(), first, last, perHour, new SplittableRandom(s));
            sessions += counts[0];
            rows += counts[1];
        }
        double seedSeconds = (System.nanoTime() - t0) / 1e9;

        List<RuleRequest> shapes = shapes();
        for (int i = 0; i < ruleCount; i++) {
            Site site = made.get(i % siteCount);
            alertRules.create(site.id(), shapes.get((i / siteCount) % shapes.size()));
        }

        // the clock starts 14 days before the last day, so trailing and weekly baselines lie inside the data
        Instant start = last.minusDays(14).atTime(8, 0).atZone(ZONE).toInstant().plusSeconds(45 * 60);
        // run 0 starts cold (nothing kept); runs 1..R are the steady state of an evaluator running every hour
        double[] evalMs = new double[runs];
        double coldMs = 0;
        EvaluationReport report = null;
        EvaluationReport coldReport = null;
        for (int r = 0; r <= runs; r++) {
            long t = System.nanoTime();
            report = evaluator.evaluateAll(start.plusSeconds(3600L * r));
            double ms = (System.nanoTime() - t) / 1e6;
            if (report.windows() != ruleCount || report.failed() != 0) {
                throw new IllegalStateException("run " + r + " judged " + report.windows() + " windows: " + report);
            }
            if (r == 0) {
                coldMs = ms;
                coldReport = report;
            } else {
                evalMs[r - 1] = ms;
            }
        }
        // reference: one plain hourly rollup query of 8 days, with varied sites, segments and days
        int refCount = 200;
        double[] refMs = new double[refCount];
        List<Map<Dim, List<String>>> segments = List.of(Map.of(), Map.of(Dim.DEVICE, List.of("phone")),
                Map.of(Dim.DEVICE, List.of("desktop")), Map.of(Dim.SOURCE, List.of("search")),
                Map.of(Dim.SOURCE, List.of("social")), Map.of(Dim.COUNTRY, List.of("DE")),
                Map.of(Dim.VARIANT, List.of("B")), Map.of(Dim.DEVICE, List.of("phone"), Dim.SOURCE, List.of("search")));
        SplittableRandom pick = new SplittableRandom(7);
        for (int i = 0; i < refCount; i++) {
            Site site = made.get(pick.nextInt(siteCount));
            LocalDate to = last.minusDays(pick.nextInt(days - 8));
            SegmentFilter filter = new SegmentFilter(to.minusDays(7), to, segments.get(pick.nextInt(segments.size())));
            long t = System.nanoTime();
            rollups.sessions(site.id(), filter, List.of(Dim.HOUR), true);
            refMs[i] = (System.nanoTime() - t) / 1e6;
        }
        Arrays.sort(evalMs);
        Arrays.sort(refMs);
        System.out.printf("database: %s%n", pg ? "PostgreSQL" : "H2 file (fresh, not compacted)");
        System.out.printf("data: %d sites x %d days x 24 h, %,d sessions in %,d rollup rows (seeded in %.1f s)%n",
                siteCount, days, sessions, rows, seedSeconds);
        System.out.printf("rules: %d (%d shapes: metrics, segments, 1/3/24 h windows, trailing-day and weekly "
                + "baselines, thresholds)%n", ruleCount, shapes.size());
        System.out.printf("settled days kept between runs: %s%n", keep ? "yes (rollup-cache-ttl PT1H)" : "no (PT0S)");
        System.out.printf("evaluateAll, first run (cold): %.1f ms, %d rollup queries taking %d ms%n", coldMs,
                coldReport.queries(), coldReport.readMillis());
        System.out.printf("evaluateAll, %d further hourly runs, one new window per rule: median %.1f ms, p95 %.1f ms, "
                + "min %.1f ms (%.3f ms per rule at the median); last run: %d rollup queries taking %d ms%n", runs,
                percentile(evalMs, 0.5), percentile(evalMs, 0.95), evalMs[0],
                percentile(evalMs, 0.5) / ruleCount, report.queries(), report.readMillis());
        System.out.printf("reference, one hourly rollup query of 8 days (%d calls): median %.2f ms, p95 %.2f ms%n",
                refCount, percentile(refMs, 0.5), percentile(refMs, 0.95));
    }

    /** Rule shapes, combined with sites so that most rules of a site read their own rollups. */
    private static List<RuleRequest> shapes() {
        List<Map<String, List<String>>> segments = List.of(Map.of(), Map.of("device", List.of("phone")),
                Map.of("device", List.of("desktop")), Map.of("source", List.of("search")),
                Map.of("source", List.of("social")), Map.of("country", List.of("DE")),
                Map.of("country", List.of("FR", "PT")), Map.of("device", List.of("phone"), "source", List.of("search")),
                Map.of("variant", List.of("B")), Map.of("device", List.of("tablet"), "variant", List.of("A")));
        List<RuleRequest> out = new ArrayList<>();
        String[] windows = {"PT1H", "PT3H", "PT24H"};
        int i = 0;
        for (Map<String, List<String>> segment : segments) {
            for (String window : windows) {
                i++;
                String metric = switch (i % 7) {
                    case 3 -> "pagesPerSession";
                    case 5 -> "sessionRpm";
                    case 6 -> "viewabilityRate";
                    default -> "bounceRate";
                };
                boolean weekly = i % 2 == 0;
                RuleRequest.Condition c = i % 5 == 4 && metric.equals("bounceRate")
                        ? new RuleRequest.Condition("above", 0.6, null, null, null, null)
                        : new RuleRequest.Condition("jump", null, null, metric.equals("bounceRate")
                        || metric.equals("viewabilityRate") ? 5.0 : 10.0, weekly ? "sameHourOfWeek" : "trailingDays",
                        weekly ? 2 : 7);
                out.add(new RuleRequest("Bench " + i, metric, segment, window, c,
                        new RuleRequest.Guard(100, 0.95, null), null, null, null, null, true));
            }
        }
        return out;
    }

    /** Writes the hourly rollup rows of one site; returns {sessions, rows}. */
    private static long[] seed(JdbcTemplate jdbc, long siteId, LocalDate first, LocalDate last, int perHour,
                               SplittableRandom random) {
        String sql = """
                INSERT INTO rollup_session (site_id, cuboid, local_day, local_hour, device, source, browser, variant,
                       country, region, entry_ads, pages, entry_path, sessions, bounces, pageviews, pageviews_sq,
                       engaged_ms, engaged_sq, revenue_micros, revenue_sq, entry_ads_sum, impressions,
                       viewable_impressions, clicks)
                VALUES (?, ?, ?, ?, ?, ?, '', ?, ?, '', -1, -1, '', ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)""";
        List<Object[]> batch = new ArrayList<>();
        long sessions = 0;
        long rows = 0;
        for (LocalDate day = first; !day.isAfter(last); day = day.plusDays(1)) {
            for (int hour = 0; hour < 24; hour++) {
                double daily = 0.5 + 0.5 * Math.sin(Math.PI * (hour - 3) / 24.0);
                int total = (int) Math.round(perHour * 2 * daily * daily + 20);
                double bounce = 0.38 + 0.06 * Math.cos(Math.PI * hour / 12.0);
                long[] sum = new long[9];
                for (String d : DEVICES) {
                    for (String s : SOURCES) {
                        for (String v : VARIANTS) {
                            int n = (int) Math.round(total * weight(d, s, v) * (0.8 + 0.4 * random.nextDouble()));
                            long[] m = measures(n, bounce, random);
                            batch.add(row(siteId, 21, day, hour, d, s, v, "", m));
                            for (int k = 0; k < m.length; k++) {
                                sum[k] += m[k];
                            }
                        }
                    }
                }
                batch.add(row(siteId, 20, day, hour, "", "", "", "", sum));
                for (int c = 0; c < COUNTRIES.length; c++) {
                    int n = (int) Math.round(sum[0] * (c == 0 ? 0.3 : 0.7 / (COUNTRIES.length - 1)));
                    batch.add(row(siteId, 22, day, hour, "", "", "", COUNTRIES[c], measures(n, bounce, random)));
                }
                sessions += sum[0];
                if (batch.size() >= 5_000) {
                    jdbc.batchUpdate(sql, batch);
                    rows += batch.size();
                    batch.clear();
                }
            }
        }
        jdbc.batchUpdate(sql, batch);
        rows += batch.size();
        return new long[]{sessions, rows};
    }

    private static double weight(String device, String source, String variant) {
        double d = switch (device) {
            case "phone" -> 0.6;
            case "desktop" -> 0.3;
            case "tablet" -> 0.08;
            default -> 0.02;
        };
        double s = source.equals("search") ? 0.4 : source.equals("social") ? 0.2 : source.equals("direct") ? 0.2
                : 0.2 / 4;
        return d * s * 0.5;
    }

    /** sessions, bounces, pageviews, pageviews², engaged ms, revenue micros, revenue², impressions, viewable. */
    private static long[] measures(int n, double bounce, SplittableRandom random) {
        long bounces = Math.round(n * (bounce + 0.02 * (random.nextDouble() - 0.5)));
        long pageviews = Math.round(n * 1.9);
        long impressions = pageviews * 3;
        return new long[]{n, bounces, pageviews, Math.round(pageviews * 4.2), n * 41_000L, n * 1_800L,
                n * 9_000_000L, impressions, Math.round(impressions * 0.62)};
    }

    private static Object[] row(long siteId, int cuboid, LocalDate day, int hour, String device, String source,
                                String variant, String country, long[] m) {
        return new Object[]{siteId, cuboid, Date.valueOf(day), hour, device, source, variant, country, m[0], m[1],
                m[2], (double) m[3], m[4], (double) m[4] * 30_000, m[5], (double) m[6], m[0] * 3, m[7], m[8],
                m[7] / 100};
    }

    private static double percentile(double[] sorted, double p) {
        int i = (int) Math.ceil(p * sorted.length) - 1;
        return sorted[Math.max(0, Math.min(sorted.length - 1, i))];
    }

    private static long arg(String[] args, String name, long fallback) {
        for (int i = 0; i + 1 < args.length; i++) {
            if (args[i].equals("--" + name)) {
                return Long.parseLong(args[i + 1]);
            }
        }
        return fallback;
    }
}

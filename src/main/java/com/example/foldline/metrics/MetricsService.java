package com.example.foldline.metrics;

import java.time.LocalDate;
import java.time.LocalDateTime;
import java.time.temporal.ChronoUnit;
import java.util.ArrayList;
import java.util.Comparator;
import java.util.HashMap;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Set;
import java.util.TreeMap;

import org.springframework.stereotype.Service;

import com.example.foldline.sessions.Dim;
import com.example.foldline.sessions.EngagedBuckets;
import com.example.foldline.sessions.Group;
import com.example.foldline.sessions.PageTotals;
import com.example.foldline.sessions.Rollups;
import com.example.foldline.sessions.SegmentFilter;
import com.example.foldline.sessions.SessionTotals;
import com.example.foldline.stats.ProportionInterval;
import com.example.foldline.stats.Proportions;
import com.example.foldline.system.BadRequestException;

/** Computes the metric answers from the rollups. Every formula is defined in docs/metrics.md. */
@Service
public class MetricsService {

    /** Below this many sessions in the whole segment, answers say the data is thin. */
    public static final long MIN_SESSIONS = 200;

    private final Rollups rollups;
    private final KneeAnalysis knees;

    MetricsService(Rollups rollups, KneeAnalysis knees) {
        this.rollups = rollups;
        this.knees = knees;
    }

    Answers.Scope scope(MetricRequest r, Rollups.Plan plan) {
        Map<String, List<String>> filters = new TreeMap<>();
        MetricRequest.DIMENSIONS.forEach((name, dim) -> {
            List<String> v = r.filter().values().get(dim);
            if (v != null) {
                filters.put(name, v);
            }
        });
        return new Answers.Scope(r.site().id(), r.site().currency(), r.site().timezone().getId(), r.filter().from(),
                r.filter().to(), filters, plan.describe());
    }

    public SessionTotals totals(long siteId, SegmentFilter filter) {
        return rollups.sessions(siteId, filter, List.of(), false).total();
    }

    public Answers.OverviewAnswer overview(MetricRequest r) {
        Rollups.SessionAnswer now = rollups.sessions(r.site().id(), r.filter(), List.of(), false);
        Answers.Comparison comparison = null;
        if (r.compare()) {
            SegmentFilter prev = r.previous();
            SessionTotals before = rollups.sessions(r.site().id(), prev, List.of(), false).total();
            comparison = new Answers.Comparison(prev.from(), prev.to(), Overview.of(before),
                    Comparisons.compare(now.total(), before));
        }
        return new Answers.OverviewAnswer(scope(r, now.plan()), Overview.of(now.total()), comparison);
    }

    public Answers.DensityAnswer density(MetricRequest r) {
        String model = MetricRequest.choice(r, "model", "logistic", Set.of("logistic", "linear"));
        Rollups.SessionAnswer answer = rollups.sessions(r.site().id(), r.filter(), List.of(Dim.ENTRY_ADS), false);
        List<Answers.DensityPoint> points = new ArrayList<>();
        for (Group<SessionTotals> g : answer.groups()) {
            SessionTotals t = g.totals();
            ProportionInterval ci = Proportions.wilson(t.bounces(), t.sessions(), 0.05);
            double rpm = Metric.SESSION_RPM.value(t);
            points.add(new Answers.DensityPoint(g.number(Dim.ENTRY_ADS), t.sessions(), t.bounces(),
                    Money.finite(Metric.BOUNCE_RATE.value(t)), ci.lower(), ci.upper(),
                    Money.finite(Metric.PAGES_PER_SESSION.value(t)), Money.finite(rpm), Money.decimal(rpm)));
        }
        long sessions = answer.total().sessions();
        FitSummary fit = knees.densityFit(points, model);
        CapAdvice recommendation = sessions >= MIN_SESSIONS ? knees.recommendation(r, answer.total()) : null;
        return new Answers.DensityAnswer(scope(r, answer.plan()), points, sessions,
                "Wilson score interval (1927), 95%", fit, recommendation, thin(sessions));
    }

    public Answers.DepthAnswer depth(MetricRequest r) {
        Rollups.SessionAnswer answer = rollups.sessions(r.site().id(), r.filter(), List.of(Dim.PAGES), false);
        long total = answer.total().sessions();
        Map<Integer, SessionTotals> byPages = new HashMap<>();
        answer.groups().forEach(g -> byPages.put(g.number(Dim.PAGES), g.totals()));
        List<Answers.DepthPoint> points = new ArrayList<>();
        Double previous = null;
        for (int pages = 1; pages <= 11; pages++) {
            SessionTotals t = byPages.get(pages);
            if (t == null) {
                previous = null;
                continue;
            }
            double perSession = (double) t.revenueMicros() / t.sessions();
            // boxed on both branches: a bare double branch would unbox the null of a gap (NullPointerException)
            Double marginal = pages == 1 ? Double.valueOf(perSession)
                    : previous == null ? null : Double.valueOf(perSession - previous);
            points.add(new Answers.DepthPoint(pages, pages == 11 ? "11+" : Integer.toString(pages), t.sessions(),
                    total == 0 ? null : (double) t.sessions() / total, perSession, Money.decimal(perSession),
                    marginal, marginal == null ? null : Money.decimal(marginal)));
            previous = pages == 11 ? null : perSession;
        }
        List<Answers.DepthPoint> curve = points.stream().filter(p -> p.pages() <= 10
                && p.sessions() >= KneeAnalysis.MIN_POINT_SESSIONS).toList();
        KneeReport fit = total < MIN_SESSIONS || curve.size() < 4 ? null : KneeAnalysis.curve(
                curve.stream().mapToDouble(Answers.DepthPoint::pages).toArray(),
                curve.stream().mapToDouble(Answers.DepthPoint::revenuePerSessionMicros).toArray(),
                curve.stream().mapToDouble(Answers.DepthPoint::sessions).toArray(), "revenue micros per page");
        return new Answers.DepthAnswer(scope(r, answer.plan()), points, total, fit, thin(total));
    }

    public Answers.EngagementAnswer engagement(MetricRequest r) {
        Rollups.PageAnswer answer = rollups.pages(r.site().id(), r.filter(), List.of(Dim.ENGAGED_BUCKET), false);
        List<Answers.EngagementPoint> points = new ArrayList<>();
        long unmeasured = 0;
        long measured = 0;
        for (Group<PageTotals> g : answer.groups()) {
            int bucket = g.number(Dim.ENGAGED_BUCKET);
            PageTotals t = g.totals();
            if (bucket == EngagedBuckets.UNKNOWN) {
                unmeasured += t.pageviews();
                continue;
            }
            measured += t.pageviews();
            double perPage = t.pageviews() == 0 ? Double.NaN : (double) t.revenueMicros() / t.pageviews();
            points.add(new Answers.EngagementPoint(bucket, EngagedBuckets.LABELS.get(bucket),
                    EngagedBuckets.LOWER_MS[bucket],
                    bucket + 1 < EngagedBuckets.LOWER_MS.length ? EngagedBuckets.LOWER_MS[bucket + 1] : null,
                    t.pageviews(), t.revenueMicros(), Money.finite(perPage), Money.decimal(perPage),
                    Money.finite(perPage * 1000), Money.decimal(perPage * 1000)));
        }
        List<Answers.EngagementPoint> curve = points.stream().filter(p -> p.pageviews() >= KneeAnalysis.MIN_POINT_SESSIONS
                && p.revenuePerPageviewMicros() != null).toList();
        KneeReport fit = measured < MIN_SESSIONS || curve.size() < 4 ? null : KneeAnalysis.curve(
                curve.stream().mapToDouble(p -> midpointSeconds(p.bucket())).toArray(),
                curve.stream().mapToDouble(Answers.EngagementPoint::revenuePerPageviewMicros).toArray(),
                curve.stream().mapToDouble(Answers.EngagementPoint::pageviews).toArray(), "revenue micros per second");
        return new Answers.EngagementAnswer(scope(r, answer.plan()), points, measured, unmeasured, fit,
                measured < MIN_SESSIONS ? "fewer than " + MIN_SESSIONS + " pageviews with engaged time in this segment"
                        : null);
    }

    public Answers.GeographyAnswer geography(MetricRequest r) {
        String by = MetricRequest.choice(r, "by", "country", Set.of("country", "region"));
        String sort = MetricRequest.choice(r, "sort", "sessions", Set.of("sessions", "pageRpm", "sessionRpm"));
        String order = MetricRequest.choice(r, "order", "desc", Set.of("asc", "desc"));
        List<Dim> groupBy = by.equals("region") ? List.of(Dim.COUNTRY, Dim.REGION) : List.of(Dim.COUNTRY);
        Rollups.SessionAnswer answer = rollups.sessions(r.site().id(), r.filter(), groupBy, false);
        SessionTotals site = answer.total();
        double sitePageRpm = Metric.PAGE_RPM.value(site);
        double siteSessionRpm = Metric.SESSION_RPM.value(site);
        List<Answers.GeoRow> rows = new ArrayList<>();
        for (Group<SessionTotals> g : answer.groups()) {
            SessionTotals t = g.totals();
            double pageRpm = Metric.PAGE_RPM.value(t);
            double sessionRpm = Metric.SESSION_RPM.value(t);
            rows.add(new Answers.GeoRow(g.text(Dim.COUNTRY), by.equals("region") ? g.text(Dim.REGION) : null,
                    t.sessions(), site.sessions() == 0 ? null : (double) t.sessions() / site.sessions(),
                    t.pageviews(), Money.finite(pageRpm), Money.decimal(pageRpm),
                    Money.finite(pageRpm / sitePageRpm), Money.finite(sessionRpm), Money.decimal(sessionRpm),
                    Money.finite(sessionRpm / siteSessionRpm)));
        }
        Comparator<Answers.GeoRow> cmp = switch (sort) {
            case "pageRpm" -> Comparator.comparing(Answers.GeoRow::pageRpmMicros,
                    Comparator.nullsFirst(Comparator.naturalOrder()));
            case "sessionRpm" -> Comparator.comparing(Answers.GeoRow::sessionRpmMicros,
                    Comparator.nullsFirst(Comparator.naturalOrder()));
            default -> Comparator.comparingLong(Answers.GeoRow::sessions);
        };
        rows.sort(order.equals("desc") ? cmp.reversed() : cmp);
        return new Answers.GeographyAnswer(scope(r, answer.plan()), by, rows, Overview.of(site));
    }

    public Answers.PagesAnswer pages(MetricRequest r) {
        String sort = MetricRequest.choice(r, "sort", "sessions", Set.of("sessions", "bounceRate", "sessionRpm"));
        String order = MetricRequest.choice(r, "order", "desc", Set.of("asc", "desc"));
        int limit = MetricRequest.intExtra(r, "limit", 20, 1, 500);
        int minSessions = MetricRequest.intExtra(r, "minSessions", sort.equals("sessions") ? 1 : 30, 1, 1_000_000);
        String q = r.extras().get("q");
        if (q != null && q.length() > 200) {
            throw new BadRequestException("q", "must be at most 200 characters");
        }
        String needle = q == null ? null : q.toLowerCase(Locale.ROOT);
        Rollups.SessionAnswer answer = rollups.sessions(r.site().id(), r.filter(), List.of(Dim.ENTRY_PATH), false);
        List<Answers.PageRow> rows = new ArrayList<>();
        for (Group<SessionTotals> g : answer.groups()) {
            String path = g.text(Dim.ENTRY_PATH);
            SessionTotals t = g.totals();
            if (t.sessions() < minSessions || (needle != null && !path.toLowerCase(Locale.ROOT).contains(needle))) {
                continue;
            }
            ProportionInterval ci = Proportions.wilson(t.bounces(), t.sessions(), 0.05);
            double rpm = Metric.SESSION_RPM.value(t);
            rows.add(new Answers.PageRow(path, t.sessions(), t.bounces(), Money.finite(Metric.BOUNCE_RATE.value(t)),
                    ci.lower(), ci.upper(), Money.finite(Metric.PAGES_PER_SESSION.value(t)), Money.finite(rpm),
                    Money.decimal(rpm), (double) t.entryAdsSum() / t.sessions()));
        }
        Comparator<Answers.PageRow> cmp = switch (sort) {
            case "bounceRate" -> Comparator.comparing(Answers.PageRow::bounceRate);
            case "sessionRpm" -> Comparator.comparing(Answers.PageRow::sessionRpmMicros);
            default -> Comparator.comparingLong(Answers.PageRow::sessions);
        };
        cmp = order.equals("desc") ? cmp.reversed() : cmp;
        rows.sort(cmp.thenComparing(Answers.PageRow::path));
        long matching = rows.size();
        return new Answers.PagesAnswer(scope(r, answer.plan()), sort, order, limit, q, matching,
                rows.subList(0, Math.min(limit, rows.size())));
    }

    public Answers.SeriesAnswer timeseries(MetricRequest r) {
        String name = r.extra("metric", "sessions");
        Metric metric = Metric.byName(name).orElseThrow(() -> new BadRequestException("metric",
                "unknown metric '" + name + "'; one of " + String.join(", ",
                        java.util.Arrays.stream(Metric.values()).map(Metric::apiName).toList())));
        long days = ChronoUnit.DAYS.between(r.filter().from(), r.filter().to()) + 1;
        String grain = MetricRequest.choice(r, "grain", "day", Set.of("day", "hour"));
        if (grain.equals("hour") && days > 7) {
            throw new BadRequestException("grain", "hourly series are available for ranges up to 7 days, this one has "
                    + days);
        }
        Rollups.SessionAnswer answer = series(r.site().id(), r.filter(), grain);
        List<Answers.SeriesPoint> points = points(answer, r.filter(), grain, metric);
        List<Answers.SeriesPoint> previous = null;
        if (r.compare()) {
            SegmentFilter prev = r.previous();
            previous = points(series(r.site().id(), prev, grain), prev, grain, metric);
        }
        return new Answers.SeriesAnswer(scope(r, answer.plan()), metric.apiName(), grain, points, previous);
    }

    private Rollups.SessionAnswer series(long siteId, SegmentFilter filter, String grain) {
        return rollups.sessions(siteId, filter, grain.equals("hour") ? List.of(Dim.HOUR) : List.of(), true);
    }

    private static List<Answers.SeriesPoint> points(Rollups.SessionAnswer answer, SegmentFilter filter, String grain,
                                                    Metric metric) {
        Map<String, SessionTotals> byTime = new LinkedHashMap<>();
        for (Group<SessionTotals> g : answer.groups()) {
            String at = grain.equals("hour") ? LocalDateTime.of(g.day(), java.time.LocalTime.of(g.number(Dim.HOUR), 0))
                    .toString() : g.day().toString();
            byTime.put(at, g.totals());
        }
        List<Answers.SeriesPoint> points = new ArrayList<>();
        for (LocalDate d = filter.from(); !d.isAfter(filter.to()); d = d.plusDays(1)) {
            if (grain.equals("hour")) {
                for (int h = 0; h < 24; h++) {
                    String at = LocalDateTime.of(d, java.time.LocalTime.of(h, 0)).toString();
                    points.add(point(at, byTime.getOrDefault(at, SessionTotals.ZERO), metric));
                }
            } else {
                points.add(point(d.toString(), byTime.getOrDefault(d.toString(), SessionTotals.ZERO), metric));
            }
        }
        return points;
    }

    private static Answers.SeriesPoint point(String at, SessionTotals t, Metric metric) {
        return new Answers.SeriesPoint(at, Money.finite(metric.value(t)), metric.numerator(t), metric.denominator(t));
    }

    /** A bucket's representative engaged time in seconds (the 120+ bucket is placed at 180 s). */
    static double midpointSeconds(int bucket) {
        long lower = EngagedBuckets.LOWER_MS[bucket];
        long upper = bucket + 1 < EngagedBuckets.LOWER_MS.length ? EngagedBuckets.LOWER_MS[bucket + 1] : 240_000;
        return (lower + upper) / 2000.0;
    }

    static String thin(long sessions) {
        return sessions < MIN_SESSIONS ? "fewer than " + MIN_SESSIONS + " sessions in this segment (" + sessions + ")"
                : null;
    }
}

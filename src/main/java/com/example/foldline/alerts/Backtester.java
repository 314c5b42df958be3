package com.example.foldline.alerts;

import java.time.Clock;
import java.time.Duration;
import java.time.LocalDateTime;
import java.time.temporal.ChronoUnit;
import java.util.ArrayList;
import java.util.List;

import org.springframework.stereotype.Service;

import com.example.foldline.alerts.AlertRule.Notice;
import com.example.foldline.sites.Site;
import com.example.foldline.sites.Sites;
import com.example.foldline.system.BadRequestException;

/**
 * Replays a rule over history with the evaluator's own code ({@link RuleRun}, {@link WindowEvaluator},
 * {@link AlertRule#judge}), stepping the window end hour by hour as the live evaluator does when it runs every hour
 * (docs/alerts.md, "Back-testing"). Nothing is stored or sent.
 */
@Service
class Backtester {

    static final int DEFAULT_DAYS = 30;
    static final int MAX_DAYS = 92;

    private final AlertData data;
    private final Sites sites;
    private final AlertProperties properties;
    private final Clock clock;

    Backtester(AlertData data, Sites sites, AlertProperties properties, Clock clock) {
        this.data = data;
        this.sites = sites;
        this.properties = properties;
        this.clock = clock;
    }

    BacktestResult run(long siteId, BacktestRequest request) {
        Site site = sites.require(siteId);
        if (request == null) {
            throw new BadRequestException("rule", "a rule is required");
        }
        RuleDefinition d = RuleDefinition.from(request.rule());
        Duration settle = Duration.ofMinutes(site.sessionTimeoutMinutes()).plus(properties.settleMargin());
        LocalDateTime latest = Windows.latestEnd(clock.instant(), site.timezone(), settle);
        LocalDateTime from;
        LocalDateTime to;
        if (request.from() == null && request.to() == null) {
            to = latest;
            from = latest.minusDays(DEFAULT_DAYS);
        } else {
            to = request.to() == null ? latest : min(request.to().plusDays(1).atStartOfDay(), latest);
            from = request.from() == null ? to.minusDays(DEFAULT_DAYS) : request.from().atStartOfDay();
            if (request.from() != null && request.to() != null && request.from().isAfter(request.to())) {
                throw new BadRequestException("from", "must not be after to (" + request.to() + ")");
            }
        }
        if (!from.isBefore(to)) {
            throw new BadRequestException("from", "the range holds no complete hour");
        }
        if (ChronoUnit.HOURS.between(from, to) > MAX_DAYS * 24L) {
            throw new BadRequestException("from", "a back-test covers at most " + MAX_DAYS + " days");
        }
        List<LocalDateTime> ends = Windows.range(from, to);
        HourlySeries series = data.hourly(siteId, d.segment(), Windows.firstDay(d, ends.get(0)),
                Windows.lastDay(ends.get(ends.size() - 1)));
        RuleRun run = RuleRun.of(AlertRule.draft(siteId, d), ends, series);
        return result(site, d, request.rule(), from, to, run, series);
    }

    private static BacktestResult result(Site site, RuleDefinition d, RuleRequest request, LocalDateTime from,
                                         LocalDateTime to, RuleRun run, HourlySeries series) {
        int raised = 0;
        int quiet = 0;
        int cleared = 0;
        List<BacktestResult.Change> changes = new ArrayList<>();
        for (Transition t : run.transitions()) {
            if (t.from() == RuleState.CALM && t.to() == RuleState.RAISED) {
                if (t.notice() == Notice.RAISED) {
                    raised++;
                } else {
                    quiet++;
                }
            }
            if (t.notice() == Notice.CLEARED) {
                cleared++;
            }
            Evaluation e = t.evaluation();
            changes.add(new BacktestResult.Change(t.windowEnd(), Windows.instant(t.windowEnd(), site.timezone()),
                    t.from(), t.to(), t.notice() == null ? null : t.notice().name(), t.reason(), e.observed(),
                    e.baseline(), e.sessions(), e.test() == null ? null : e.test().pValue()));
        }
        List<BacktestResult.Point> points = run.evaluations().stream()
                .map(e -> new BacktestResult.Point(e.windowEnd(), e.observed(), e.baseline(), e.sessions(),
                        e.verdict()))
                .toList();
        boolean enabled = request.enabled() == null || request.enabled();
        return new BacktestResult(d.toRequest(List.of(), List.of(), enabled), d.describe(), from, to,
                site.timezone().getId(), run.evaluations().size(), raised, quiet, cleared, changes, points,
                series.readFrom());
    }

    private static LocalDateTime min(LocalDateTime a, LocalDateTime b) {
        return a.isBefore(b) ? a : b;
    }
}

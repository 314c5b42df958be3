package com.example.foldline.alerts;

import java.time.Clock;
import java.time.Duration;
import java.time.Instant;
import java.time.LocalDateTime;
import java.util.List;
import java.util.Optional;

import org.slf4j.Logger;
import org.slf4j.LoggerFactory;
import org.springframework.scheduling.annotation.Scheduled;
import org.springframework.stereotype.Service;
import org.springframework.transaction.support.TransactionTemplate;

import com.example.foldline.sites.Site;
import com.example.foldline.sites.Sites;

/**
 * Evaluates every enabled rule on its due windows (docs/alerts.md, "Evaluation"). Each rule is judged in its own
 * transaction that first locks the rule's row ({@code SELECT … FOR UPDATE SKIP LOCKED}): with several instances on
 * one PostgreSQL, only one judges a rule at a time and the others skip it; the lock holder re-reads the rule's last
 * judged window inside the lock, so a window is judged once. After downtime the windows missed since then (at most
 * {@code max-catch-up}) are judged in order; notifications carry an idempotency key (rule, window end, kind) as a
 * second guard against duplicates.
 */
@Service
public class AlertEvaluator {

    private static final Logger log = LoggerFactory.getLogger(AlertEvaluator.class);

    private final RuleRepository rules;
    private final AlertData data;
    private final Notifier notifier;
    private final Sites sites;
    private final TransactionTemplate tx;
    private final AlertProperties properties;
    private final Clock clock;

    AlertEvaluator(RuleRepository rules, AlertData data, Notifier notifier, Sites sites, TransactionTemplate tx,
                   AlertProperties properties, Clock clock) {
        this.rules = rules;
        this.data = data;
        this.notifier = notifier;
        this.sites = sites;
        this.tx = tx;
        this.properties = properties;
        this.clock = clock;
    }

    @Scheduled(fixedDelayString = "${foldline.alerts.interval:PT1M}", initialDelayString = "PT30S")
    void scheduled() {
        if (!properties.schedulerEnabled()) {
            return;
        }
        try {
            evaluateAll(clock.instant());
        } catch (RuntimeException e) {
            log.error("alert evaluation run failed; it will be retried", e);
        }
    }

    /** Judges every enabled rule's windows that are complete at {@code now} and not judged yet. */
    public EvaluationReport evaluateAll(Instant now) {
        AlertData.Reads reads = data.reads();
        List<Long> ids = rules.enabledIds();
        int skipped = 0;
        int windows = 0;
        int transitions = 0;
        int notifications = 0;
        int failed = 0;
        for (long id : ids) {
            try {
                int[] r = tx.execute(status -> evaluate(id, now, reads));
                if (r == null) {
                    skipped++;
                } else {
                    windows += r[0];
                    transitions += r[1];
                    notifications += r[2];
                }
            } catch (RuntimeException e) {
                failed++;
                log.error("evaluating alert rule {} failed; it will be retried on the next run", id, e);
            }
        }
        return new EvaluationReport(ids.size(), skipped, windows, transitions, notifications, failed, reads.queries());
    }

    /** Runs inside the rule's transaction; null when the rule is locked by another evaluator. */
    private int[] evaluate(long id, Instant now, AlertData.Reads reads) {
        Optional<RuleRepository.Stored> locked = rules.lockForEvaluation(id);
        if (locked.isEmpty()) {
            return null;
        }
        AlertRule rule = locked.get().rule();
        Site site = sites.require(rule.siteId());
        Duration settle = Duration.ofMinutes(site.sessionTimeoutMinutes()).plus(properties.settleMargin());
        LocalDateTime latest = Windows.latestEnd(now, site.timezone(), settle);
        List<LocalDateTime> ends = Windows.due(rule.status().lastWindowEnd(), latest,
                properties.maxCatchUp().toHours());
        if (ends.isEmpty()) {
            return new int[]{0, 0, 0};
        }
        RuleDefinition d = rule.definition();
        HourlySeries series = reads.hourly(site.id(), d.segment(), Windows.firstDay(d, ends.get(0)),
                Windows.lastDay(ends.get(ends.size() - 1)));
        RuleRun run = RuleRun.of(rule, ends, series);
        int created = 0;
        for (Transition t : run.transitions()) {
            if (notifier.record(site, rule, t, now)) {
                created++;
            }
        }
        List<Evaluation> evaluations = run.evaluations();
        rules.saveStatus(run.rule(), evaluations.get(evaluations.size() - 1), now, now);
        return new int[]{ends.size(), run.transitions().size(), created};
    }
}

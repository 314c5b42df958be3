package com.example.foldline.alerts;

import java.time.Clock;
import java.time.Duration;
import java.time.Instant;
import java.time.LocalDateTime;
import java.util.ArrayList;
import java.util.List;

import org.slf4j.Logger;
import org.slf4j.LoggerFactory;
import org.springframework.dao.DataAccessException;
import org.springframework.scheduling.annotation.Scheduled;
import org.springframework.stereotype.Service;
import org.springframework.transaction.support.TransactionTemplate;

import com.example.foldline.sites.Site;
import com.example.foldline.sites.Sites;

/**
 * Evaluates every enabled rule on its due windows (docs/alerts.md, "Evaluation"). Rules are judged in transactions
 * of up to {@value #CHUNK} that first lock the rules' rows ({@code SELECT … FOR UPDATE SKIP LOCKED}): with several
 * instances on one PostgreSQL, only one judges a rule at a time and the others skip it; the lock holder re-reads the
 * rule's last judged window inside the lock, so a window is judged once. After downtime the windows missed since
 * then (at most {@code max-catch-up}) are judged in order; notifications carry an idempotency key (rule, window end,
 * kind) as a second guard against duplicates.
 */
@Service
public class AlertEvaluator {

    private static final Logger log = LoggerFactory.getLogger(AlertEvaluator.class);
    /** Rules judged per transaction: each is still locked on its own row; fewer commits make a run cheaper. */
    static final int CHUNK = 50;

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
        AlertData.Reads reads = data.reads(now);
        // plan from an unlocked snapshot: rules with nothing due are not touched at all (most runs, as windows move
        // hourly and runs are every minute), and rules of one site and segment share one rollup read
        List<RuleRepository.Stored> snapshot = rules.enabledSnapshot();
        List<Long> due = new ArrayList<>();
        for (RuleRepository.Stored stored : snapshot) {
            AlertRule rule = stored.rule();
            List<LocalDateTime> ends = dueWindows(rule, sites.require(rule.siteId()), now);
            if (!ends.isEmpty()) {
                RuleDefinition d = rule.definition();
                reads.plan(rule.siteId(), d.segment(), Windows.firstDay(d, ends.get(0)),
                        Windows.lastDay(ends.get(ends.size() - 1)));
                due.add(rule.id());
            }
        }
        Tally tally = new Tally();
        for (int i = 0; i < due.size(); i += CHUNK) {
            List<Long> chunk = due.subList(i, Math.min(due.size(), i + CHUNK));
            try {
                tally.add(tx.execute(status -> evaluate(chunk, now, reads)));
            } catch (DataAccessException e) {
                // a database error rolls the whole chunk back: judge its rules one by one, so one bad rule stays
                // alone and the others go on
                log.warn("alert rules {} failed together; judging them one by one", chunk, e);
                for (long id : chunk) {
                    try {
                        tally.add(tx.execute(status -> evaluate(List.of(id), now, reads)));
                    } catch (RuntimeException single) {
                        tally.failed++;
                        log.error("evaluating alert rule {} failed; it will be retried on the next run", id, single);
                    }
                }
            }
        }
        return new EvaluationReport(snapshot.size(), tally.skipped, tally.windows, tally.transitions,
                tally.notifications, tally.failed, reads.queries(), reads.readMillis());
    }

    /** Counts of one run. */
    private static final class Tally {
        int skipped;
        int windows;
        int transitions;
        int notifications;
        int failed;

        void add(Tally t) {
            skipped += t.skipped;
            windows += t.windows;
            transitions += t.transitions;
            notifications += t.notifications;
            failed += t.failed;
        }
    }

    private List<LocalDateTime> dueWindows(AlertRule rule, Site site, Instant now) {
        Duration settle = Duration.ofMinutes(site.sessionTimeoutMinutes()).plus(properties.settleMargin());
        LocalDateTime latest = Windows.latestEnd(now, site.timezone(), settle);
        return Windows.due(rule.status().lastWindowEnd(), latest, properties.maxCatchUp().toHours());
    }

    /**
     * Runs inside one transaction: locks those of {@code ids} that no other evaluator holds (SKIP LOCKED: the others
     * are counted as skipped, their holder is judging them), computes each locked rule's due windows again from its
     * locked row (so a window another instance judged meanwhile is not judged twice), judges them, records the
     * transitions and saves the states. A rule whose judging fails in code is logged and left for the next run.
     */
    private Tally evaluate(List<Long> ids, Instant now, AlertData.Reads reads) {
        Tally tally = new Tally();
        List<RuleRepository.Stored> locked = rules.lockForEvaluation(ids);
        tally.skipped = ids.size() - locked.size();
        List<AlertRule> judged = new ArrayList<>();
        List<Evaluation> newest = new ArrayList<>();
        for (RuleRepository.Stored stored : locked) {
            AlertRule rule = stored.rule();
            Site site = sites.require(rule.siteId());
            List<LocalDateTime> ends = dueWindows(rule, site, now);
            if (ends.isEmpty()) {
                continue;
            }
            RuleRun run;
            try {
                RuleDefinition d = rule.definition();
                HourlySeries series = reads.hourly(site.id(), site.timezone(), d.segment(),
                        Windows.firstDay(d, ends.get(0)), Windows.lastDay(ends.get(ends.size() - 1)));
                run = RuleRun.of(rule, ends, series);
            } catch (DataAccessException e) {
                throw e;
            } catch (RuntimeException e) {
                tally.failed++;
                log.error("evaluating alert rule {} failed; it will be retried on the next run", rule.id(), e);
                continue;
            }
            for (Transition t : run.transitions()) {
                if (notifier.record(site, rule, t, now)) {
                    tally.notifications++;
                }
            }
            judged.add(run.rule());
            newest.add(run.evaluations().get(run.evaluations().size() - 1));
            tally.windows += ends.size();
            tally.transitions += run.transitions().size();
        }
        rules.saveStatuses(judged, newest, now);
        return tally;
    }
}

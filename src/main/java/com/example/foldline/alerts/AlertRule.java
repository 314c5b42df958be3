package com.example.foldline.alerts;

import java.time.Duration;
import java.time.Instant;
import java.time.LocalDateTime;
import java.util.List;

import com.example.foldline.alerts.Evaluation.Verdict;

/**
 * The alert rule aggregate: its definition and where it stands. State changes happen only here, through
 * {@link #judge}, {@link #pause} and {@link #resume}, each returning the next rule and the {@link Transition} (if any)
 * that the evaluator records and notifies. Immutable, so a back-test can replay it without a database.
 *
 * @param status       the evolving part
 * @param mutedUntil   notifications created before this instant are kept in the app but not sent out
 */
record AlertRule(long id, long siteId, RuleDefinition definition, List<Long> webhookIds, List<String> emails,
                 boolean enabled, Status status, Instant mutedUntil) {

    /**
     * @param state           see {@link RuleState}
     * @param stateSince      window end at which the state began (null before the first)
     * @param lastWindowEnd   the newest window judged (catch-up resumes after it)
     * @param lastBreachEnd   end of the newest window in breach during the current episode
     * @param lastRaiseNotice window end of the newest raise that was notified (for the cool-down)
     * @param episodeNotified whether the current episode's raise was notified (so its recovery is, too)
     */
    record Status(RuleState state, LocalDateTime stateSince, LocalDateTime lastWindowEnd, LocalDateTime lastBreachEnd,
                  LocalDateTime lastRaiseNotice, boolean episodeNotified) {

        static final Status INITIAL = new Status(RuleState.CALM, null, null, null, null, false);
    }

    /** The kinds of message a transition sends. */
    enum Notice {
        RAISED, CLEARED
    }

    /** The next rule, and the state change (null when the state stays). */
    record Step(AlertRule rule, Transition transition) {
    }

    /** A rule that exists only in memory, as the back-test uses. */
    static AlertRule draft(long siteId, RuleDefinition definition) {
        return new AlertRule(0, siteId, definition, List.of(), List.of(), true, Status.INITIAL, null);
    }

    boolean mutedAt(Instant now) {
        return mutedUntil != null && now.isBefore(mutedUntil);
    }

    /**
     * Applies one window's evaluation:
     * CALM + breach → RAISED (notified unless a notified raise lies less than the cool-down before);
     * RAISED/EASING + breach → RAISED (a relapse from EASING sends nothing);
     * RAISED/EASING + normal → CALM once "clears after" has passed since the last breach (recovery notified when the
     * raise was), else EASING; thin or unconfirmed windows change nothing.
     */
    Step judge(Evaluation e) {
        if (status.state() == RuleState.PAUSED) {
            throw new IllegalStateException("rule " + id + " is paused and must not be evaluated");
        }
        LocalDateTime end = e.windowEnd();
        Status s = status;
        Status judged = new Status(s.state(), s.stateSince(), end, s.lastBreachEnd(), s.lastRaiseNotice(),
                s.episodeNotified());
        Verdict v = e.verdict();
        switch (s.state()) {
            case CALM -> {
                if (v == Verdict.BREACH) {
                    boolean coolingDown = s.lastRaiseNotice() != null
                            && Duration.between(s.lastRaiseNotice(), end).compareTo(definition.cooldown()) < 0;
                    Status next = new Status(RuleState.RAISED, end, end, end,
                            coolingDown ? s.lastRaiseNotice() : end, !coolingDown);
                    return change(next, e, coolingDown ? null : Notice.RAISED, coolingDown
                            ? "in breach; no notice: the last one went out at " + s.lastRaiseNotice()
                            + ", within the cool-down of " + definition.cooldown() : "in breach");
                }
            }
            case RAISED, EASING -> {
                if (v == Verdict.BREACH) {
                    Status next = new Status(RuleState.RAISED, s.state() == RuleState.RAISED ? s.stateSince() : end,
                            end, end, s.lastRaiseNotice(), s.episodeNotified());
                    return s.state() == RuleState.RAISED ? new Step(with(next), null)
                            : change(next, e, null, "in breach again before clearing");
                }
                if (v == Verdict.NORMAL) {
                    Duration away = Duration.between(s.lastBreachEnd(), end);
                    if (away.compareTo(definition.clearsAfter()) >= 0) {
                        Status next = new Status(RuleState.CALM, end, end, null, s.lastRaiseNotice(), false);
                        return change(next, e, s.episodeNotified() ? Notice.CLEARED : null,
                                "condition gone for " + away + (s.episodeNotified() ? ""
                                        : "; no notice, as the raise was not notified"));
                    }
                    if (s.state() == RuleState.RAISED) {
                        Status next = new Status(RuleState.EASING, end, end, s.lastBreachEnd(), s.lastRaiseNotice(),
                                s.episodeNotified());
                        return change(next, e, null, "condition gone; clears after " + definition.clearsAfter());
                    }
                }
            }
            default -> throw new IllegalStateException("unexpected state " + s.state());
        }
        return new Step(with(judged), null);
    }

    /** Switches the rule off; an open episode ends without a recovery notice. */
    Step pause() {
        if (status.state() == RuleState.PAUSED) {
            return new Step(this, null);
        }
        Status next = new Status(RuleState.PAUSED, status.lastWindowEnd(), status.lastWindowEnd(), null,
                status.lastRaiseNotice(), false);
        Transition t = new Transition(id, siteId, status.state(), RuleState.PAUSED, null, "paused", null, null);
        return new Step(new AlertRule(id, siteId, definition, webhookIds, emails, false, next, mutedUntil), t);
    }

    /** Switches the rule on again, calm, judging from the newest complete window on (no catch-up of the pause). */
    Step resume() {
        if (status.state() != RuleState.PAUSED) {
            return new Step(this, null);
        }
        Status next = new Status(RuleState.CALM, null, null, null, status.lastRaiseNotice(), false);
        Transition t = new Transition(id, siteId, RuleState.PAUSED, RuleState.CALM, null, "resumed", null, null);
        return new Step(new AlertRule(id, siteId, definition, webhookIds, emails, true, next, mutedUntil), t);
    }

    private Step change(Status next, Evaluation e, Notice notice, String reason) {
        Transition t = new Transition(id, siteId, status.state(), next.state(), e.windowEnd(), reason, notice, e);
        return new Step(with(next), t);
    }

    private AlertRule with(Status next) {
        return new AlertRule(id, siteId, definition, webhookIds, emails, enabled, next, mutedUntil);
    }
}

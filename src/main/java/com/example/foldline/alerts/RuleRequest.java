package com.example.foldline.alerts;

import java.util.List;
import java.util.Map;

/**
 * The body that creates, replaces or back-tests an alert rule (docs/alerts.md, "Rules"). Omitted fields take their
 * documented defaults; {@link RuleView#definition()} returns the same shape with every default filled in.
 *
 * @param name        shown in notifications, 1 to 200 characters
 * @param metric      bounceRate (default), pagesPerSession, sessionRpm, viewabilityRate or ctr
 * @param segment     dimension → accepted values, as in the metrics API (device, source, country, region, browser,
 *                    variant); empty for all sessions
 * @param window      ISO-8601 duration in whole hours, PT1H (default) to P7D: the span each evaluation looks at
 * @param condition   when the rule is in breach
 * @param guard       how sure a breach must be before the rule is raised
 * @param cooldown    ISO-8601 duration, PT0S to P7D (default PT6H): a new breach sooner than this after the last
 *                    notified one changes the state but sends nothing
 * @param clearsAfter ISO-8601 duration in whole hours, PT0S to P2D (default PT2H): how long the condition must have
 *                    stayed away before the rule is calm again and the recovery message goes out
 * @param webhookIds  webhooks of the same site that receive this rule's notifications
 * @param emails      addresses that receive this rule's notifications by e-mail (when SMTP is configured)
 * @param enabled     false creates the rule paused
 */
public record RuleRequest(String name, String metric, Map<String, List<String>> segment, String window,
                          Condition condition, Guard guard, String cooldown, String clearsAfter, List<Long> webhookIds,
                          List<String> emails, Boolean enabled) {

    /**
     * @param type            above, below (an absolute threshold) or jump (against a baseline)
     * @param threshold       for above/below: in the metric's unit (proportions as fractions 0–1, pages per session
     *                        in pages, session RPM in micro-units of the site's currency)
     * @param direction       for jump: up or down (default up for bounceRate, down for the others)
     * @param by              for jump: at least this many percentage points (proportions) or percent (means)
     * @param baseline        for jump: trailingDays (default: the same window on each of the previous N days) or
     *                        sameHourOfWeek (the same window one, two, … N weeks earlier)
     * @param baselinePeriods N: days (1–28, default 7) or weeks (1–8, default 4)
     */
    public record Condition(String type, Double threshold, String direction, Double by, String baseline,
                            Integer baselinePeriods) {
    }

    /**
     * @param minSessions fewer sessions than this in the window (or in the pooled baseline) is too thin to judge
     *                    (default 200)
     * @param confidence  one-sided confidence that the breach is real, above 0.5 and at most 0.9999 (default 0.95)
     * @param method      for a jump in a proportion: zTest (default) or newcombe; for a jump in a mean: welch; for
     *                    above/below: wilson (proportions) or tBound (means), chosen when omitted
     */
    public record Guard(Integer minSessions, Double confidence, String method) {
    }
}

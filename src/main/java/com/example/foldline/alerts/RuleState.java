package com.example.foldline.alerts;

/**
 * Where a rule stands (our own words; docs/alerts.md, "States").
 */
public enum RuleState {
    /** nothing to report: the last judged window was not in breach (or nothing was judged yet) */
    CALM,
    /** in breach: the raise notice went out (unless the cool-down held it back) */
    RAISED,
    /** was raised, the condition has gone away, and the rule waits for "clears after" to pass before calming */
    EASING,
    /** switched off by a person: not evaluated */
    PAUSED
}

package com.example.foldline.alerts;

import java.time.Instant;
import java.time.LocalDateTime;

/**
 * A rule as the API shows it: its definition with every default filled in (PUT it back to change the rule), a
 * sentence describing it, and where it stands.
 *
 * @param stateSince      local end of the window at which the state began
 * @param lastWindowEnd   local end of the newest window judged
 * @param mutedUntil      notifications are kept in the app but not sent out until then
 * @param lastEvaluation  the newest window's evaluation, with its values and test
 */
public record RuleView(long id, long siteId, RuleRequest definition, String description, RuleState state,
                       LocalDateTime stateSince, LocalDateTime lastWindowEnd, Instant mutedUntil,
                       Evaluation lastEvaluation, Instant lastEvaluatedAt, Instant createdAt, Instant updatedAt) {
}

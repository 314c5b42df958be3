package com.example.foldline.alerts;

import java.time.Instant;

/**
 * One logged attempt to deliver a notification to a webhook or an e-mail address.
 *
 * @param target   webhook:&lt;id&gt; or mailto:&lt;address&gt;
 * @param status   of the delivery after all attempts so far: pending, sent or failed
 * @param outcome  of this attempt: ok, error or refused
 */
public record DeliveryLogEntry(long deliveryId, long notificationId, String target, String status, int attempt,
                               Instant attemptedAt, String outcome, Integer statusCode, String error, long durationMs) {
}

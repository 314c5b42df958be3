package com.example.foldline.alerts;

import java.time.Instant;

/**
 * A site's webhook: where alert notifications are POSTed, signed with the webhook's secret (never shown here; see
 * {@link NewWebhook}).
 */
public record Webhook(long id, long siteId, String name, String url, boolean enabled, Instant createdAt) {
}

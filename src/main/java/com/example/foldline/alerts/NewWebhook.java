package com.example.foldline.alerts;

/**
 * A webhook just created (or whose secret was just replaced), with the signing secret: shown this once, so the
 * receiver can verify the Foldline-Signature header (docs/alerts.md, "Verifying a webhook").
 */
public record NewWebhook(Webhook webhook, String secret) {
}

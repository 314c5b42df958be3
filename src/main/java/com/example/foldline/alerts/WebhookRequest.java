package com.example.foldline.alerts;

/**
 * Body that creates or changes a webhook.
 *
 * @param name    1 to 200 characters
 * @param url     http(s) address the guard accepts (docs/alerts.md, "Webhook guard")
 * @param enabled false keeps it but sends nothing
 */
public record WebhookRequest(String name, String url, Boolean enabled) {
}

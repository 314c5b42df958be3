package com.example.foldline.alerts;

import java.net.URI;
import java.time.Duration;
import java.util.List;
import java.util.Locale;

import org.springframework.boot.context.properties.ConfigurationProperties;
import org.springframework.boot.context.properties.bind.DefaultValue;
import org.springframework.validation.annotation.Validated;

import jakarta.validation.Valid;
import jakarta.validation.constraints.Max;
import jakarta.validation.constraints.Min;
import jakarta.validation.constraints.NotBlank;
import jakarta.validation.constraints.NotNull;

/**
 * Alert settings (docs/alerts.md, "Settings").
 *
 * @param schedulerEnabled whether the scheduled evaluator and dispatcher run (tests call them directly)
 * @param interval         how often the evaluator looks for windows to evaluate
 * @param dispatchInterval how often pending webhook and e-mail deliveries are sent
 * @param settleMargin     added to the site's session timeout before an hour counts as complete: a window is
 *                         evaluated only when its end lies at least timeout + margin in the past, so that its
 *                         sessions have closed and reached the rollups
 * @param maxCatchUp       after downtime, windows older than this are not evaluated any more
 * @param rollupCacheTtl   how long the hourly totals of settled days (ended over a day ago) are reused between
 *                         evaluator runs; PT0S reads everything on every run
 * @param publicUrl        the address people open Foldline at, used for links in notifications
 * @param webhooks         webhook delivery and its guard against misuse
 * @param mail             e-mail delivery (needs spring.mail.host)
 * @param historyRetention state changes and notifications (with their deliveries) older than this are deleted by
 *                         a daily job; a rule's current state is kept on the rule
 */
@Validated
@ConfigurationProperties("foldline.alerts")
record AlertProperties(@DefaultValue("true") boolean schedulerEnabled,
                       @DefaultValue("PT1M") @NotNull Duration interval,
                       @DefaultValue("PT10S") @NotNull Duration dispatchInterval,
                       @DefaultValue("PT15M") @NotNull Duration settleMargin,
                       @DefaultValue("P2D") @NotNull Duration maxCatchUp,
                       @DefaultValue("PT1H") @NotNull Duration rollupCacheTtl,
                       @DefaultValue("http://localhost:8080") @NotNull URI publicUrl,
                       @DefaultValue @Valid @NotNull Webhooks webhooks,
                       @DefaultValue @Valid @NotNull Mail mail,
                       @DefaultValue("P400D") @NotNull Duration historyRetention) {

    AlertProperties {
        require(!interval.isNegative() && !interval.isZero(), "interval", interval);
        require(!dispatchInterval.isNegative() && !dispatchInterval.isZero(), "dispatch-interval", dispatchInterval);
        require(!settleMargin.isNegative(), "settle-margin", settleMargin);
        require(maxCatchUp.toHours() >= 1 && maxCatchUp.toDays() <= 31, "max-catch-up", maxCatchUp);
        require(!rollupCacheTtl.isNegative() && rollupCacheTtl.toDays() <= 1, "rollup-cache-ttl", rollupCacheTtl);
        require(historyRetention.toDays() >= 1, "history-retention", historyRetention);
        String scheme = publicUrl.getScheme() == null ? "" : publicUrl.getScheme().toLowerCase(Locale.ROOT);
        require(scheme.equals("http") || scheme.equals("https"), "public-url", publicUrl);
    }

    /**
     * @param allowedHosts         when not empty, webhooks may only point at these host names (exact, case-insensitive)
     *                             or, for entries starting with a dot, at their subdomains
     * @param allowPrivateNetworks whether targets on loopback, private, link-local or unique-local addresses are
     *                             allowed (refused by default: a webhook must not reach into the server's network)
     * @param maxAttempts          attempts per delivery before it is given up
     * @param firstRetry           delay before the second attempt; each further one doubles it
     * @param maxRetryDelay        the longest delay between two attempts
     * @param connectTimeout       TCP connect timeout
     * @param requestTimeout       time allowed for the whole request
     */
    record Webhooks(@DefaultValue List<String> allowedHosts,
                    @DefaultValue("false") boolean allowPrivateNetworks,
                    @DefaultValue("6") @Min(1) @Max(20) int maxAttempts,
                    @DefaultValue("PT30S") @NotNull Duration firstRetry,
                    @DefaultValue("PT1H") @NotNull Duration maxRetryDelay,
                    @DefaultValue("PT5S") @NotNull Duration connectTimeout,
                    @DefaultValue("PT10S") @NotNull Duration requestTimeout) {

        Webhooks {
            allowedHosts = allowedHosts.stream().map(h -> h.strip().toLowerCase(Locale.ROOT))
                    .filter(h -> !h.isEmpty()).toList();
            require(!firstRetry.isNegative(), "webhooks.first-retry", firstRetry);
            require(maxRetryDelay.compareTo(firstRetry) >= 0, "webhooks.max-retry-delay", maxRetryDelay);
            require(!connectTimeout.isNegative() && !connectTimeout.isZero(), "webhooks.connect-timeout",
                    connectTimeout);
            require(!requestTimeout.isNegative() && !requestTimeout.isZero(), "webhooks.request-timeout",
                    requestTimeout);
        }
    }

    /**
     * @param from sender address of alert e-mails
     */
    record Mail(@DefaultValue("foldline@localhost") @NotBlank String from) {
    }

    private static void require(boolean ok, String name, Object value) {
        if (!ok) {
            throw new IllegalArgumentException("foldline.alerts." + name + " is out of range: " + value);
        }
    }
}

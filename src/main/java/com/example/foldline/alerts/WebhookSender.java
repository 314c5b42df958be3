package com.example.foldline.alerts;

import java.io.IOException;
import java.net.URI;
import java.net.http.HttpClient;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import java.nio.charset.StandardCharsets;
import java.security.InvalidKeyException;
import java.security.NoSuchAlgorithmException;
import java.util.HexFormat;
import java.util.Objects;
import java.util.Optional;

import javax.crypto.Mac;
import javax.crypto.spec.SecretKeySpec;

import org.springframework.stereotype.Component;

/**
 * POSTs a notification's JSON to a webhook, signed with HMAC-SHA256 over the exact body bytes under the webhook's
 * secret: {@code Foldline-Signature: sha256=<hex>}. Redirects are never followed automatically: a 307 or 308 to the
 * same host (and port) is followed up to three times, each new address checked by the guard again; a redirect to
 * another host is refused (docs/alerts.md, "Webhooks").
 */
@Component
class WebhookSender {

    static final String SIGNATURE_HEADER = "Foldline-Signature";
    private static final int MAX_REDIRECTS = 3;

    private final WebhookGuard guard;
    private final HttpClient client;
    private final AlertProperties.Webhooks settings;

    WebhookSender(WebhookGuard guard, AlertProperties properties) {
        this.guard = guard;
        this.settings = properties.webhooks();
        this.client = HttpClient.newBuilder().connectTimeout(settings.connectTimeout())
                .followRedirects(HttpClient.Redirect.NEVER).build();
    }

    DeliveryAttempt send(String url, String secret, String body, String event, long deliveryId) {
        long started = System.nanoTime();
        URI uri;
        try {
            uri = URI.create(url);
        } catch (IllegalArgumentException e) {
            return new DeliveryAttempt(DeliveryAttempt.REFUSED, null, "not a valid address: " + url, 0);
        }
        byte[] bytes = body.getBytes(StandardCharsets.UTF_8);
        String signature = "sha256=" + sign(secret, bytes);
        Integer status = null;
        for (int hop = 0; hop <= MAX_REDIRECTS; hop++) {
            String problem = guard.problem(uri);
            if (problem != null) {
                return new DeliveryAttempt(DeliveryAttempt.REFUSED, status, problem, millisSince(started));
            }
            HttpRequest request = HttpRequest.newBuilder(uri).timeout(settings.requestTimeout())
                    .header("Content-Type", "application/json")
                    .header("User-Agent", "Foldline-Alerts/1")
                    .header(SIGNATURE_HEADER, signature)
                    .header("Foldline-Event", event)
                    .header("Foldline-Delivery", Long.toString(deliveryId))
                    .POST(HttpRequest.BodyPublishers.ofByteArray(bytes)).build();
            HttpResponse<Void> response;
            try {
                response = client.send(request, HttpResponse.BodyHandlers.discarding());
            } catch (IOException e) {
                return new DeliveryAttempt(DeliveryAttempt.ERROR, status, e.getClass().getSimpleName()
                        + (e.getMessage() == null ? "" : ": " + e.getMessage()), millisSince(started));
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
                return new DeliveryAttempt(DeliveryAttempt.ERROR, status, "interrupted", millisSince(started));
            }
            status = response.statusCode();
            if (status >= 200 && status < 300) {
                return new DeliveryAttempt(DeliveryAttempt.OK, status, null, millisSince(started));
            }
            if (status >= 300 && status < 400) {
                Optional<String> location = response.headers().firstValue("Location");
                if ((status != 307 && status != 308) || location.isEmpty()) {
                    return new DeliveryAttempt(DeliveryAttempt.ERROR, status, "redirect " + status
                            + " not followed (only 307 and 308 keep the POST); update the webhook address",
                            millisSince(started));
                }
                URI next = uri.resolve(location.get());
                if (!sameOrigin(uri, next)) {
                    return new DeliveryAttempt(DeliveryAttempt.REFUSED, status, "redirect to another host ("
                            + next.getHost() + ") refused", millisSince(started));
                }
                uri = next;
                continue;
            }
            return new DeliveryAttempt(DeliveryAttempt.ERROR, status, "HTTP " + status, millisSince(started));
        }
        return new DeliveryAttempt(DeliveryAttempt.ERROR, status, "more than " + MAX_REDIRECTS + " redirects",
                millisSince(started));
    }

    private static boolean sameOrigin(URI a, URI b) {
        return Objects.equals(WebhookGuard.host(a), WebhookGuard.host(b)) && port(a) == port(b);
    }

    private static int port(URI u) {
        return u.getPort() != -1 ? u.getPort() : "https".equalsIgnoreCase(u.getScheme()) ? 443 : 80;
    }

    /** Lower-case hex HMAC-SHA256 of {@code body} under {@code secret} (its UTF-8 bytes). */
    static String sign(String secret, byte[] body) {
        try {
            Mac mac = Mac.getInstance("HmacSHA256");
            mac.init(new SecretKeySpec(secret.getBytes(StandardCharsets.UTF_8), "HmacSHA256"));
            return HexFormat.of().formatHex(mac.doFinal(body));
        } catch (NoSuchAlgorithmException | InvalidKeyException e) {
            throw new IllegalStateException("HmacSHA256 is part of every Java runtime", e);
        }
    }

    private static long millisSince(long started) {
        return (System.nanoTime() - started) / 1_000_000;
    }
}

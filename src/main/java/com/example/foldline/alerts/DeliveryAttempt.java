package com.example.foldline.alerts;

/**
 * The result of one attempt to deliver a notification, as logged in alert_delivery_attempt.
 *
 * @param outcome    ok, error (retried with backoff) or refused (by the guard; not retried)
 * @param statusCode HTTP status of the last response, when there was one
 * @param error      what went wrong, when something did
 * @param durationMs how long the attempt took
 */
record DeliveryAttempt(String outcome, Integer statusCode, String error, long durationMs) {

    static final String OK = "ok";
    static final String ERROR = "error";
    static final String REFUSED = "refused";

    boolean ok() {
        return OK.equals(outcome);
    }
}

package com.example.foldline.accounts;

import java.time.Clock;
import java.time.Duration;
import java.time.Instant;
import java.util.Map;
import java.util.concurrent.ConcurrentHashMap;

import org.springframework.stereotype.Component;

/**
 * Slows password guessing: after {@value #MAX_FAILURES} failed logins for one user name within 15 minutes, further
 * attempts for that name are refused for 15 minutes, right password or not. Kept per instance in memory.
 */
@Component
class LoginThrottle {

    static final int MAX_FAILURES = 5;
    static final Duration WINDOW = Duration.ofMinutes(15);

    private record Failures(int count, Instant first) {
    }

    private final Map<String, Failures> failures = new ConcurrentHashMap<>();
    private final Clock clock;

    LoginThrottle(Clock clock) {
        this.clock = clock;
    }

    boolean blocked(String username) {
        Failures f = failures.get(key(username));
        if (f == null) {
            return false;
        }
        if (f.first().plus(WINDOW).isBefore(clock.instant())) {
            failures.remove(key(username));
            return false;
        }
        return f.count() >= MAX_FAILURES;
    }

    void failed(String username) {
        Instant now = clock.instant();
        failures.compute(key(username), (k, f) -> f == null || f.first().plus(WINDOW).isBefore(now)
                ? new Failures(1, now) : new Failures(f.count() + 1, f.first()));
    }

    void succeeded(String username) {
        failures.remove(key(username));
    }

    private static String key(String username) {
        return username == null ? "" : username.toLowerCase(java.util.Locale.ROOT);
    }
}

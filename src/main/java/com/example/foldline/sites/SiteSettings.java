package com.example.foldline.sites;

import java.time.DateTimeException;
import java.time.ZoneId;
import java.util.ArrayList;
import java.util.Currency;
import java.util.List;
import java.util.regex.Pattern;

import com.example.foldline.system.BadRequestException;
import com.example.foldline.system.FieldError;

/**
 * The editable settings of a site, validated as a whole so that every bad field is reported at once.
 *
 * @param sessionTimeoutMinutes idle time after which a new session starts (common practice: 30)
 * @param engagedSeconds        optional: a one-page session with at least this engaged time is not a bounce
 * @param retentionDays         raw events and sessions older than this are deleted
 */
public record SiteSettings(String name, String domain, String timezone, String currency, Integer sessionTimeoutMinutes,
                           Integer engagedSeconds, Integer retentionDays) {

    public static final int DEFAULT_SESSION_TIMEOUT_MINUTES = 30;
    public static final int DEFAULT_RETENTION_DAYS = 400;

    private static final Pattern HOST = Pattern.compile(
            "^(?=.{1,253}$)([a-z0-9]([a-z0-9-]{0,61}[a-z0-9])?)(\\.[a-z0-9]([a-z0-9-]{0,61}[a-z0-9])?)*$");

    /** Checks every field and returns the settings with defaults filled in, or throws naming each bad field. */
    public SiteSettings validated() {
        List<FieldError> errors = new ArrayList<>();
        String n = name == null ? "" : name.strip();
        if (n.isEmpty() || n.length() > 200) {
            errors.add(new FieldError("name", "must be 1 to 200 characters"));
        }
        String d = domain == null ? "" : domain.strip().toLowerCase();
        if (!HOST.matcher(d).matches()) {
            errors.add(new FieldError("domain", "must be a host name such as news.example, got '" + domain + "'"));
        }
        if (timezone == null || !isIanaZone(timezone)) {
            errors.add(new FieldError("timezone", "must be an IANA time zone such as Europe/Lisbon, got '" + timezone + "'"));
        }
        String c = currency == null ? "" : currency.strip().toUpperCase();
        if (!isCurrency(c)) {
            errors.add(new FieldError("currency", "must be an ISO 4217 code such as EUR, got '" + currency + "'"));
        }
        int timeout = sessionTimeoutMinutes == null ? DEFAULT_SESSION_TIMEOUT_MINUTES : sessionTimeoutMinutes;
        if (timeout < 1 || timeout > 1440) {
            errors.add(new FieldError("sessionTimeoutMinutes", "must be between 1 and 1440, got " + timeout));
        }
        if (engagedSeconds != null && (engagedSeconds < 1 || engagedSeconds > 3600)) {
            errors.add(new FieldError("engagedSeconds", "must be between 1 and 3600 when set, got " + engagedSeconds));
        }
        int retention = retentionDays == null ? DEFAULT_RETENTION_DAYS : retentionDays;
        if (retention < 1 || retention > 3660) {
            errors.add(new FieldError("retentionDays", "must be between 1 and 3660, got " + retention));
        }
        if (!errors.isEmpty()) {
            throw new BadRequestException(errors);
        }
        return new SiteSettings(n, d, timezone, c, timeout, engagedSeconds, retention);
    }

    private static boolean isIanaZone(String zone) {
        // Region ids only ("Europe/Lisbon", "UTC"); offsets such as "+02:00" have no DST rules and are refused.
        if (!ZoneId.getAvailableZoneIds().contains(zone)) {
            return false;
        }
        try {
            ZoneId.of(zone);
            return true;
        } catch (DateTimeException e) {
            return false;
        }
    }

    private static boolean isCurrency(String code) {
        if (code.length() != 3) {
            return false;
        }
        try {
            Currency.getInstance(code);
            return true;
        } catch (IllegalArgumentException e) {
            return false;
        }
    }
}

package com.example.foldline.accounts;

import java.util.Locale;
import java.util.Optional;

/** A role on one site; each includes the one before: viewer (reads), editor (also writes views, notes, rules), admin. */
public enum SiteRole {
    VIEWER, EDITOR, ADMIN;

    public boolean includes(SiteRole other) {
        return compareTo(other) >= 0;
    }

    public String apiName() {
        return name().toLowerCase(Locale.ROOT);
    }

    public static Optional<SiteRole> parse(String value) {
        if (value == null) {
            return Optional.empty();
        }
        try {
            return Optional.of(valueOf(value.toUpperCase(Locale.ROOT)));
        } catch (IllegalArgumentException e) {
            return Optional.empty();
        }
    }
}

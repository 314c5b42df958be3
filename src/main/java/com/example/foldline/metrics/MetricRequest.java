package com.example.foldline.metrics;

import java.time.LocalDate;
import java.time.format.DateTimeParseException;
import java.time.temporal.ChronoUnit;
import java.util.ArrayList;
import java.util.EnumMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Set;
import java.util.regex.Pattern;

import com.example.foldline.sessions.Dim;
import com.example.foldline.sessions.SegmentFilter;
import com.example.foldline.sites.Site;
import com.example.foldline.system.BadRequestException;
import com.example.foldline.system.FieldError;

/**
 * A parsed metrics question: date range in the site's time zone, segment filter, comparison, and the extra
 * parameters of a particular answer. Every parameter is checked; an unknown one is an error naming it.
 */
public record MetricRequest(Site site, SegmentFilter filter, boolean compare, Map<String, String> extras) {

    public static final int MAX_DAYS = 400;
    public static final int DEFAULT_DAYS = 28;

    /** The segment dimensions by their API name; the one list the metrics API, views and alerts share. */
    public static final Map<String, Dim> DIMENSIONS = Map.of("device", Dim.DEVICE, "source", Dim.SOURCE,
            "country", Dim.COUNTRY, "region", Dim.REGION, "browser", Dim.BROWSER, "variant", Dim.VARIANT);
    private static final Set<String> DEVICES = Set.of("desktop", "phone", "tablet", "other");
    private static final Set<String> SOURCES = Set.of("search", "social", "direct", "referral", "email", "paid", "other");
    private static final Set<String> COUNTRIES = Set.of(Locale.getISOCountries());
    private static final Pattern REGION = Pattern.compile("[A-Z]{2}-[A-Z0-9]{1,3}");

    /** The previous period of the same length, ending the day before {@code from}. */
    public SegmentFilter previous() {
        long days = ChronoUnit.DAYS.between(filter.from(), filter.to()) + 1;
        return filter.withRange(filter.from().minusDays(days), filter.from().minusDays(1));
    }

    public String extra(String name, String fallback) {
        return extras.getOrDefault(name, fallback);
    }

    /**
     * @param params  the query parameters (name → values)
     * @param extraNames parameters this answer accepts besides the segment filter
     * @param today   today in the site's time zone
     */
    static MetricRequest parse(Site site, Map<String, String[]> params, Set<String> extraNames, LocalDate today) {
        List<FieldError> errors = new ArrayList<>();
        for (String name : params.keySet()) {
            if (!name.equals("from") && !name.equals("to") && !name.equals("compare") && !DIMENSIONS.containsKey(name)
                    && !extraNames.contains(name)) {
                errors.add(new FieldError(name, "unknown parameter; accepted: from, to, "
                        + "compare, device, source, country, region, browser, variant"
                        + (extraNames.isEmpty() ? "" : ", " + String.join(", ", extraNames.stream().sorted().toList()))));
            }
        }
        LocalDate to = date(params, "to", today, errors);
        LocalDate from = date(params, "from", to == null ? today.minusDays(DEFAULT_DAYS - 1)
                : to.minusDays(DEFAULT_DAYS - 1), errors);
        if (from != null && to != null) {
            if (from.isAfter(to)) {
                errors.add(new FieldError("from", "must not be after to (" + to + ")"));
            } else if (ChronoUnit.DAYS.between(from, to) + 1 > MAX_DAYS) {
                errors.add(new FieldError("from",
                        "the range from " + from + " to " + to + " is over " + MAX_DAYS + " days"));
            }
        }
        boolean compare = false;
        String[] cmp = params.get("compare");
        if (cmp != null) {
            if (cmp.length == 1 && cmp[0].equals("previous")) {
                compare = true;
            } else if (!(cmp.length == 1 && (cmp[0].isEmpty() || cmp[0].equals("none")))) {
                errors.add(new FieldError("compare", "must be 'previous' or 'none'"));
            }
        }
        Map<Dim, List<String>> values = new EnumMap<>(Dim.class);
        DIMENSIONS.forEach((name, dim) -> {
            String[] given = params.get(name);
            if (given == null) {
                return;
            }
            List<String> accepted = new ArrayList<>();
            for (String v : given) {
                String problem = check(name, v);
                if (problem != null) {
                    errors.add(new FieldError(name, problem));
                } else {
                    accepted.add(normalise(name, v));
                }
            }
            if (!accepted.isEmpty()) {
                values.put(dim, accepted);
            }
        });
        Map<String, String> extras = new java.util.HashMap<>();
        for (String name : extraNames) {
            String[] v = params.get(name);
            if (v != null && v.length > 0) {
                extras.put(name, v[0]);
            }
        }
        if (!errors.isEmpty()) {
            throw new BadRequestException(errors);
        }
        return new MetricRequest(site, new SegmentFilter(from, to, values), compare, Map.copyOf(extras));
    }

    private static LocalDate date(Map<String, String[]> params, String name, LocalDate fallback,
                                  List<FieldError> errors) {
        String[] v = params.get(name);
        if (v == null || v.length == 0 || v[0].isEmpty()) {
            return fallback;
        }
        try {
            return LocalDate.parse(v[0]);
        } catch (DateTimeParseException e) {
            errors.add(new FieldError(name,
                    "must be a date as YYYY-MM-DD, got '" + v[0] + "'"));
            return null;
        }
    }

    /** Why a value is not acceptable for a segment dimension (null when it is); docs/metrics.md, "Filters". */
    public static String check(String name, String v) {
        if (v == null) {
            return "must not contain null";
        }
        return switch (name) {
            case "device" -> DEVICES.contains(v) ? null : "must be desktop, phone, tablet or other, got '" + v + "'";
            case "source" -> SOURCES.contains(v) ? null
                    : "must be search, social, direct, referral, email, paid or other, got '" + v + "'";
            case "country" -> COUNTRIES.contains(v.toUpperCase(Locale.ROOT)) ? null
                    : "must be an ISO 3166-1 alpha-2 code, got '" + v + "'";
            case "region" -> REGION.matcher(v.toUpperCase(Locale.ROOT)).matches() ? null
                    : "must be an ISO 3166-2 code such as PT-11, got '" + v + "'";
            default -> v.isEmpty() || v.length() > 64 ? "must be 1 to 64 characters" : null;
        };
    }

    /** The stored form of a valid value: country and region in upper case. */
    public static String normalise(String name, String v) {
        return name.equals("country") || name.equals("region") ? v.toUpperCase(Locale.ROOT) : v;
    }

    static int intExtra(MetricRequest r, String name, int fallback, int min, int max) {
        String v = r.extras().get(name);
        if (v == null) {
            return fallback;
        }
        try {
            int n = Integer.parseInt(v);
            if (n < min || n > max) {
                throw new BadRequestException(name, "must be from " + min + " to " + max + ", got " + n);
            }
            return n;
        } catch (NumberFormatException e) {
            throw new BadRequestException(name, "must be an integer, got '" + v + "'");
        }
    }

    static String choice(MetricRequest r, String name, String fallback, Set<String> allowed) {
        String v = r.extras().getOrDefault(name, fallback);
        if (!allowed.contains(v)) {
            throw new BadRequestException(name, "must be one of " + String.join(", ", allowed.stream().sorted().toList())
                    + ", got '" + v + "'");
        }
        return v;
    }
}

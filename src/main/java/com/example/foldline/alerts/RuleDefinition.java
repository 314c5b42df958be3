package com.example.foldline.alerts;

import java.time.Duration;
import java.time.format.DateTimeParseException;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Optional;
import java.util.Set;
import java.util.regex.Pattern;

import com.example.foldline.metrics.Metric;
import com.example.foldline.system.BadRequestException;
import com.example.foldline.system.FieldError;

/**
 * A validated rule: what is measured, on which sessions, over which window, and when it counts as a breach. Made only
 * by {@link #from(RuleRequest)}, which reports every bad field at once.
 */
record RuleDefinition(String name, Metric metric, Map<String, List<String>> segment, int windowHours,
                      ConditionKind condition, Double threshold, Direction direction, BaselineKind baseline,
                      int baselinePeriods, Double by, int minSessions, double confidence, GuardMethod guard,
                      Duration cooldown, Duration clearsAfter) {

    static final Set<Metric> METRICS = Set.of(Metric.BOUNCE_RATE, Metric.PAGES_PER_SESSION, Metric.SESSION_RPM,
            Metric.VIEWABILITY_RATE, Metric.CTR);
    static final int DEFAULT_MIN_SESSIONS = 200;
    static final double DEFAULT_CONFIDENCE = 0.95;
    static final Duration DEFAULT_COOLDOWN = Duration.ofHours(6);
    static final Duration DEFAULT_CLEARS_AFTER = Duration.ofHours(2);
    private static final Pattern EMAIL = Pattern.compile("^[^@\\s,;<>]{1,64}@[A-Za-z0-9.-]{1,253}\\.[A-Za-z]{2,63}$");

    enum ConditionKind {
        ABOVE, BELOW, JUMP;

        String apiName() {
            return name().toLowerCase(Locale.ROOT);
        }
    }

    enum Direction {
        UP, DOWN;

        String apiName() {
            return name().toLowerCase(Locale.ROOT);
        }
    }

    enum BaselineKind {
        TRAILING_DAYS("trailingDays", 7, 28, 1),
        SAME_HOUR_OF_WEEK("sameHourOfWeek", 4, 8, 7);

        final String apiName;
        final int defaultPeriods;
        final int maxPeriods;
        /** days between two baseline periods */
        final int stepDays;

        BaselineKind(String apiName, int defaultPeriods, int maxPeriods, int stepDays) {
            this.apiName = apiName;
            this.defaultPeriods = defaultPeriods;
            this.maxPeriods = maxPeriods;
            this.stepDays = stepDays;
        }
    }

    /** The statistical guard, named in every alert. */
    enum GuardMethod {
        Z_TEST("zTest", "one-sided pooled two-proportion z test"),
        NEWCOMBE("newcombe", "Newcombe hybrid score interval for a difference of proportions (method 10), one-sided"),
        WELCH("welch", "one-sided Welch t test on per-session values"),
        WILSON("wilson", "one-sided Wilson score bound"),
        T_BOUND("tBound", "one-sided Student t bound on the per-session mean");

        final String apiName;
        final String description;

        GuardMethod(String apiName, String description) {
            this.apiName = apiName;
            this.description = description;
        }
    }

    boolean proportion() {
        return metric.kind() == Metric.Kind.PROPORTION;
    }

    Duration window() {
        return Duration.ofHours(windowHours);
    }

    /** The definition as a request body with every default filled in (what the API shows and back-tests take). */
    RuleRequest toRequest(List<Long> webhookIds, List<String> emails, boolean enabled) {
        RuleRequest.Condition c = condition == ConditionKind.JUMP
                ? new RuleRequest.Condition("jump", null, direction.apiName(), by, baseline.apiName, baselinePeriods)
                : new RuleRequest.Condition(condition.apiName(), threshold, null, null, null, null);
        return new RuleRequest(name, metric.apiName(), segment, window().toString(), c,
                new RuleRequest.Guard(minSessions, confidence, guard.apiName), cooldown.toString(),
                clearsAfter.toString(), webhookIds, emails, enabled);
    }

    /**
     * A short sentence in people's words: "Bounce rate over the last 2 days (device: desktop, phone) above 15%", or
     * "... rises by at least 5 percentage points against the same hours on the previous 7 days".
     */
    String describe() {
        String w = windowHours % 24 == 0 ? plural(windowHours / 24, "day") : plural(windowHours, "hour");
        StringBuilder filter = new StringBuilder();
        segment.forEach((dim, values) -> filter.append(filter.isEmpty() ? " (" : "; ").append(dim).append(": ")
                .append(String.join(", ", values)));
        String subject = WORDS.getOrDefault(metric, metric.apiName()) + " over the last " + w
                + (filter.isEmpty() ? "" : filter + ")");
        return switch (condition) {
            case ABOVE -> subject + " above " + level(threshold);
            case BELOW -> subject + " below " + level(threshold);
            case JUMP -> subject + (direction == Direction.UP ? " rises" : " falls") + " by at least " + plain(by)
                    + (proportion() ? " percentage points" : " %") + " against "
                    + (baseline == BaselineKind.TRAILING_DAYS ? "the same hours on the previous " + baselinePeriods
                    + " days" : "the same hours of the week over the previous " + baselinePeriods + " weeks");
        };
    }

    private static final Map<Metric, String> WORDS = Map.of(Metric.BOUNCE_RATE, "Bounce rate",
            Metric.PAGES_PER_SESSION, "Pages per session", Metric.SESSION_RPM, "Session RPM",
            Metric.VIEWABILITY_RATE, "Viewability rate", Metric.CTR, "CTR");

    private String level(double v) {
        return proportion() ? plain(v * 100) + "%" : plain(v);
    }

    private static String plain(double v) {
        return java.math.BigDecimal.valueOf(v).round(new java.math.MathContext(6)).stripTrailingZeros()
                .toPlainString();
    }

    private static String plural(int n, String unit) {
        return n + " " + unit + (n == 1 ? "" : "s");
    }

    /** Validates a request; throws {@link BadRequestException} naming every bad field. */
    static RuleDefinition from(RuleRequest r) {
        List<FieldError> errors = new ArrayList<>();
        RuleDefinition d = from(r, errors);
        if (!errors.isEmpty()) {
            throw new BadRequestException(errors);
        }
        return d;
    }

    static List<String> emails(List<String> emails, List<FieldError> errors) {
        if (emails == null) {
            return List.of();
        }
        if (emails.size() > 20) {
            errors.add(new FieldError("emails", "at most 20 addresses"));
            return List.of();
        }
        List<String> out = new ArrayList<>();
        for (String e : emails) {
            String s = e == null ? "" : e.strip();
            if (!EMAIL.matcher(s).matches()) {
                errors.add(new FieldError("emails", "'" + e + "' is not an e-mail address"));
            } else if (!out.contains(s)) {
                out.add(s);
            }
        }
        return List.copyOf(out);
    }

    /** Validates a request, adding every problem to {@code errors}; null when there were any. */
    static RuleDefinition from(RuleRequest r, List<FieldError> errors) {
        if (r == null) {
            errors.add(new FieldError("body", "a rule is required"));
            return null;
        }
        String name = r.name() == null ? "" : r.name().strip();
        if (name.isEmpty() || name.length() > 200) {
            errors.add(new FieldError("name", "must be 1 to 200 characters"));
        }
        Metric metric = Metric.BOUNCE_RATE;
        if (r.metric() != null) {
            Optional<Metric> m = Metric.byName(r.metric()).filter(METRICS::contains);
            if (m.isEmpty()) {
                errors.add(new FieldError("metric", "must be bounceRate, pagesPerSession, sessionRpm, viewabilityRate "
                        + "or ctr, got '" + r.metric() + "'"));
            } else {
                metric = m.get();
            }
        }
        boolean proportion = metric.kind() == Metric.Kind.PROPORTION;
        Map<String, List<String>> segment = SegmentSpec.validated(r.segment(), errors);
        Duration window = duration("window", r.window(), Duration.ofHours(1), errors);
        int windowHours = 1;
        if (window != null) {
            if (window.toMinutes() % 60 != 0 || window.toHours() < 1 || window.toHours() > 168) {
                errors.add(new FieldError("window", "must be whole hours from PT1H to P7D (the rollups are hourly), "
                        + "got " + r.window()));
            } else {
                windowHours = (int) window.toHours();
            }
        }
        RuleRequest.Condition c = r.condition();
        ConditionKind kind = null;
        Double threshold = null;
        Direction direction = null;
        BaselineKind baseline = null;
        int periods = 0;
        Double by = null;
        if (c == null || c.type() == null) {
            errors.add(new FieldError("condition.type", "must be above, below or jump"));
        } else {
            kind = Arrays.stream(ConditionKind.values()).filter(k -> k.apiName().equals(c.type())).findFirst()
                    .orElse(null);
            if (kind == null) {
                errors.add(new FieldError("condition.type", "must be above, below or jump, got '" + c.type() + "'"));
            } else if (kind == ConditionKind.JUMP) {
                direction = metric == Metric.BOUNCE_RATE ? Direction.UP : Direction.DOWN;
                if (c.direction() != null) {
                    direction = Arrays.stream(Direction.values()).filter(x -> x.apiName().equals(c.direction()))
                            .findFirst().orElse(null);
                    if (direction == null) {
                        errors.add(new FieldError("condition.direction", "must be up or down, got '" + c.direction()
                                + "'"));
                    }
                }
                double max = proportion ? 100 : 1000;
                if (c.by() == null || !(c.by() > 0) || c.by() > max) {
                    errors.add(new FieldError("condition.by", "must be above 0 and at most " + (int) max
                            + (proportion ? " (percentage points)" : " (percent)") + ", got " + c.by()));
                } else {
                    by = c.by();
                }
                baseline = BaselineKind.TRAILING_DAYS;
                if (c.baseline() != null) {
                    baseline = Arrays.stream(BaselineKind.values()).filter(b -> b.apiName.equals(c.baseline()))
                            .findFirst().orElse(null);
                    if (baseline == null) {
                        errors.add(new FieldError("condition.baseline", "must be trailingDays or sameHourOfWeek, got '"
                                + c.baseline() + "'"));
                    }
                }
                if (baseline != null) {
                    periods = c.baselinePeriods() == null ? baseline.defaultPeriods : c.baselinePeriods();
                    if (periods < 1 || periods > baseline.maxPeriods) {
                        errors.add(new FieldError("condition.baselinePeriods", "must be from 1 to "
                                + baseline.maxPeriods + " for " + baseline.apiName + ", got " + periods));
                    }
                }
                if (c.threshold() != null) {
                    errors.add(new FieldError("condition.threshold", "applies to above and below only"));
                }
            } else {
                double max = proportion ? 1 : Double.MAX_VALUE;
                if (c.threshold() == null || !(c.threshold() >= 0) || c.threshold() > max) {
                    errors.add(new FieldError("condition.threshold", proportion
                            ? "must be a fraction from 0 to 1 (0.6 = 60 %), got " + c.threshold()
                            : "must be a number of at least 0, got " + c.threshold()));
                } else {
                    threshold = c.threshold();
                }
                if (c.by() != null || c.baseline() != null || c.baselinePeriods() != null || c.direction() != null) {
                    errors.add(new FieldError("condition", "by, direction, baseline and baselinePeriods apply to "
                            + "jump only"));
                }
            }
        }
        RuleRequest.Guard g = r.guard() == null ? new RuleRequest.Guard(null, null, null) : r.guard();
        int minSessions = g.minSessions() == null ? DEFAULT_MIN_SESSIONS : g.minSessions();
        if (minSessions < 1 || minSessions > 10_000_000) {
            errors.add(new FieldError("guard.minSessions", "must be from 1 to 10000000, got " + minSessions));
        }
        double confidence = g.confidence() == null ? DEFAULT_CONFIDENCE : g.confidence();
        if (!(confidence > 0.5 && confidence <= 0.9999)) {
            errors.add(new FieldError("guard.confidence", "must be above 0.5 and at most 0.9999, got " + confidence));
        }
        GuardMethod guard = defaultGuard(kind, proportion);
        if (g.method() != null) {
            GuardMethod asked = Arrays.stream(GuardMethod.values()).filter(m -> m.apiName.equals(g.method()))
                    .findFirst().orElse(null);
            List<GuardMethod> fitting = fittingGuards(kind, proportion);
            if (asked == null || !fitting.contains(asked)) {
                errors.add(new FieldError("guard.method", "must be " + String.join(" or ",
                        fitting.stream().map(m -> m.apiName).toList()) + " for this metric and condition, got '"
                        + g.method() + "'"));
            } else {
                guard = asked;
            }
        }
        Duration cooldown = duration("cooldown", r.cooldown(), DEFAULT_COOLDOWN, errors);
        if (cooldown != null && (cooldown.isNegative() || cooldown.compareTo(Duration.ofDays(7)) > 0)) {
            errors.add(new FieldError("cooldown", "must be from PT0S to P7D, got " + r.cooldown()));
        }
        Duration clearsAfter = duration("clearsAfter", r.clearsAfter(), DEFAULT_CLEARS_AFTER, errors);
        if (clearsAfter != null && (clearsAfter.isNegative() || clearsAfter.toMinutes() % 60 != 0
                || clearsAfter.compareTo(Duration.ofDays(2)) > 0)) {
            errors.add(new FieldError("clearsAfter", "must be whole hours from PT0S to P2D, got " + r.clearsAfter()));
        }
        if (!errors.isEmpty()) {
            return null;
        }
        return new RuleDefinition(name, metric, segment, windowHours, kind, threshold, direction, baseline, periods,
                by, minSessions, confidence, guard, cooldown, clearsAfter);
    }

    private static GuardMethod defaultGuard(ConditionKind kind, boolean proportion) {
        if (kind == ConditionKind.JUMP) {
            return proportion ? GuardMethod.Z_TEST : GuardMethod.WELCH;
        }
        return proportion ? GuardMethod.WILSON : GuardMethod.T_BOUND;
    }

    private static List<GuardMethod> fittingGuards(ConditionKind kind, boolean proportion) {
        if (kind == ConditionKind.JUMP) {
            return proportion ? List.of(GuardMethod.Z_TEST, GuardMethod.NEWCOMBE) : List.of(GuardMethod.WELCH);
        }
        return List.of(proportion ? GuardMethod.WILSON : GuardMethod.T_BOUND);
    }

    private static Duration duration(String field, String text, Duration fallback, List<FieldError> errors) {
        if (text == null) {
            return fallback;
        }
        try {
            return Duration.parse(text);
        } catch (DateTimeParseException e) {
            errors.add(new FieldError(field, "must be an ISO-8601 duration such as PT1H or P1D, got '" + text + "'"));
            return null;
        }
    }
}

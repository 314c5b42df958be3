package com.example.foldline.ingest;

import java.math.BigDecimal;
import java.util.ArrayList;
import java.util.Collections;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Set;

import com.example.foldline.system.BadRequestException;
import com.example.foldline.system.FieldError;

import tools.jackson.databind.JsonNode;
import tools.jackson.databind.node.JsonNodeFactory;
import tools.jackson.databind.node.ObjectNode;

/**
 * How the columns of a CSV file become the fields of one event type (docs/imports.md, "CSV"): {@code columns} maps
 * an event field to a column of the header. Each cell is turned into the JSON value the field expects, and the result
 * goes through {@link EventParser} like any other event, so CSV rows are validated exactly as NDJSON lines are.
 *
 * @param type      pageview, pageend, impression or session
 * @param columns   event field → CSV column name, in the client's order
 * @param delimiter {@code ,} (default), {@code ;}, tab or {@code |}
 */
record CsvMapping(String type, Map<String, String> columns, char delimiter) {

    /** What JSON value an event field takes. */
    enum Kind { TEXT, INTEGER, NUMBER, BOOLEAN, TIMESTAMP }

    private static final Map<String, Kind> SEGMENT = fields("source", Kind.TEXT, "device", Kind.TEXT,
            "userAgent", Kind.TEXT, "browser", Kind.TEXT, "os", Kind.TEXT, "country", Kind.TEXT, "region", Kind.TEXT,
            "variant", Kind.TEXT, "referrer", Kind.TEXT);

    /** Fields per event type, as in docs/events.md. */
    static final Map<String, Map<String, Kind>> FIELDS = Map.of(
            "pageview", with(SEGMENT, fields("id", Kind.TEXT, "ts", Kind.TIMESTAMP, "visitor", Kind.TEXT,
                    "session", Kind.TEXT, "path", Kind.TEXT, "ads", Kind.INTEGER, "engagedMs", Kind.INTEGER)),
            "pageend", fields("pageview", Kind.TEXT, "engagedMs", Kind.INTEGER, "scrollPct", Kind.INTEGER),
            "impression", fields("id", Kind.TEXT, "pageview", Kind.TEXT, "slot", Kind.TEXT, "size", Kind.TEXT,
                    "viewable", Kind.BOOLEAN, "clicked", Kind.BOOLEAN, "revenueMicros", Kind.INTEGER,
                    "cpmMicros", Kind.INTEGER),
            "session", with(SEGMENT, fields("id", Kind.TEXT, "visitor", Kind.TEXT, "session", Kind.TEXT,
                    "start", Kind.TIMESTAMP, "end", Kind.TIMESTAMP, "pageviews", Kind.INTEGER, "bounce", Kind.BOOLEAN,
                    "engagedMs", Kind.INTEGER, "entryPath", Kind.TEXT, "entryAds", Kind.INTEGER,
                    "laterAds", Kind.NUMBER, "revenueMicros", Kind.INTEGER, "impressions", Kind.INTEGER,
                    "viewableImpressions", Kind.INTEGER, "clicks", Kind.INTEGER)));

    /** Fields without which every row would be rejected. */
    static final Map<String, List<String>> REQUIRED = Map.of(
            "pageview", List.of("id", "ts", "visitor", "path", "ads"),
            "pageend", List.of("pageview", "engagedMs"),
            "impression", List.of("id", "pageview"),
            "session", List.of("id", "visitor", "start", "end", "pageviews", "entryPath", "entryAds"));

    private static final Set<Character> DELIMITERS = Set.of(',', ';', '\t', '|');
    private static final Set<String> TRUE = Set.of("true", "t", "yes", "y", "1");
    private static final Set<String> FALSE = Set.of("false", "f", "no", "n", "0");

    /** Reads and checks a mapping as the client sent it; every problem is named as {@code mapping.…}. */
    static CsvMapping of(JsonNode json) {
        if (json == null || json.isNull() || json.isMissingNode()) {
            throw new BadRequestException("mapping", "a CSV import needs a mapping: {\"type\": \"session\", "
                    + "\"columns\": {\"id\": \"session_id\", …}} (docs/imports.md)");
        }
        if (!json.isObject()) {
            throw new BadRequestException("mapping", "must be a JSON object with type and columns");
        }
        List<FieldError> errors = new ArrayList<>();
        JsonNode t = json.get("type");
        String type = t != null && t.isString() ? t.stringValue() : null;
        Map<String, Kind> known = type == null ? null : FIELDS.get(type);
        if (known == null) {
            errors.add(new FieldError("mapping.type", "must be one of pageview, pageend, impression, session, got "
                    + (t == null ? "nothing" : t.toString())));
        }
        char delimiter = ',';
        JsonNode d = json.get("delimiter");
        if (d != null && !d.isNull()) {
            String s = d.isString() ? d.stringValue() : "";
            if (s.equals("\\t") || s.equalsIgnoreCase("tab")) {
                s = "\t";
            }
            if (s.length() != 1 || !DELIMITERS.contains(s.charAt(0))) {
                errors.add(new FieldError("mapping.delimiter", "must be one of , ; | or tab, got " + d));
            } else {
                delimiter = s.charAt(0);
            }
        }
        Map<String, String> columns = new LinkedHashMap<>();
        JsonNode c = json.get("columns");
        if (c == null || !c.isObject() || c.isEmpty()) {
            errors.add(new FieldError("mapping.columns", "must map event fields to CSV columns, such as "
                    + "{\"id\": \"session_id\", \"start\": \"started_at\"}"));
        } else {
            for (Map.Entry<String, JsonNode> e : c.properties()) {
                String field = e.getKey();
                if (known != null && !known.containsKey(field)) {
                    errors.add(new FieldError("mapping.columns." + field, "'" + field + "' is not a field of a "
                            + type + " event (fields: " + String.join(", ", known.keySet()) + ")"));
                } else if (!e.getValue().isString() || e.getValue().stringValue().isBlank()) {
                    errors.add(new FieldError("mapping.columns." + field, "must name a CSV column"));
                } else {
                    columns.put(field, e.getValue().stringValue().strip());
                }
            }
            if (known != null) {
                for (String required : REQUIRED.get(type)) {
                    if (!c.has(required)) {
                        errors.add(new FieldError("mapping.columns." + required, "is required for a " + type
                                + " event"));
                    }
                }
            }
        }
        if (!errors.isEmpty()) {
            throw new BadRequestException(errors);
        }
        return new CsvMapping(type, Collections.unmodifiableMap(columns), delimiter);
    }

    /** The mapping as JSON, as stored with the job. */
    ObjectNode toJson() {
        ObjectNode n = JsonNodeFactory.instance.objectNode();
        n.put("type", type);
        ObjectNode c = n.putObject("columns");
        columns.forEach(c::put);
        n.put("delimiter", String.valueOf(delimiter));
        return n;
    }

    /** Ties the mapping to a file's header; refuses a mapped column the header lacks, or a repeated column name. */
    Bound bind(List<String> header) {
        Map<String, Integer> index = new LinkedHashMap<>();
        for (int i = 0; i < header.size(); i++) {
            String name = header.get(i).strip();
            if (!name.isEmpty() && index.putIfAbsent(name, i) != null) {
                throw new BadRequestException("file", "the header names column '" + name + "' twice");
            }
        }
        List<FieldError> errors = new ArrayList<>();
        Map<String, Kind> known = FIELDS.get(type);
        List<String> fields = new ArrayList<>();
        List<Integer> positions = new ArrayList<>();
        List<Kind> kinds = new ArrayList<>();
        columns.forEach((field, column) -> {
            Integer at = index.get(column);
            if (at == null) {
                errors.add(new FieldError("mapping.columns." + field, "column '" + column
                        + "' is not in the file's header (" + String.join(", ", index.keySet()) + ")"));
            } else {
                fields.add(field);
                positions.add(at);
                kinds.add(known.get(field));
            }
        });
        if (!errors.isEmpty()) {
            throw new BadRequestException(errors);
        }
        return new Bound(header.size(), fields, positions, kinds);
    }

    /** A mapping tied to a header: turns a record's cells into an event object. */
    final class Bound {
        private final int width;
        private final List<String> fields;
        private final List<Integer> positions;
        private final List<Kind> kinds;

        private Bound(int width, List<String> fields, List<Integer> positions, List<Kind> kinds) {
            this.width = width;
            this.fields = fields;
            this.positions = positions;
            this.kinds = kinds;
        }

        /** The event for one record; throws {@link EventParser.Rejected} when the record does not fit the header. */
        ObjectNode event(List<String> cells) {
            if (cells.size() != width) {
                throw new EventParser.Rejected("", "the line has " + cells.size() + " fields, the header has " + width);
            }
            ObjectNode n = JsonNodeFactory.instance.objectNode();
            n.put("type", type);
            for (int i = 0; i < fields.size(); i++) {
                String cell = cells.get(positions.get(i));
                if (!cell.isEmpty()) {
                    n.set(fields.get(i), value(kinds.get(i), cell));
                }
            }
            return n;
        }
    }

    /**
     * A cell as the JSON value its field expects. A cell that does not read as that kind stays a string, so the
     * parser rejects it with its usual message ("must be an integer, got …").
     */
    static JsonNode value(Kind kind, String cell) {
        JsonNodeFactory f = JsonNodeFactory.instance;
        String s = cell.strip();
        switch (kind) {
            case INTEGER -> {
                try {
                    return f.numberNode(Long.parseLong(s));
                } catch (NumberFormatException e) {
                    // warehouses often write whole numbers as 3.0
                    try {
                        BigDecimal d = new BigDecimal(s);
                        if (d.signum() == 0 || d.stripTrailingZeros().scale() <= 0) {
                            return f.numberNode(d.longValueExact());
                        }
                        return f.numberNode(d.doubleValue());
                    } catch (NumberFormatException | ArithmeticException notANumber) {
                        return f.stringNode(cell);
                    }
                }
            }
            case NUMBER -> {
                try {
                    return f.numberNode(Double.parseDouble(s));
                } catch (NumberFormatException e) {
                    return f.stringNode(cell);
                }
            }
            case BOOLEAN -> {
                String b = s.toLowerCase(Locale.ROOT);
                return TRUE.contains(b) ? f.booleanNode(true) : FALSE.contains(b) ? f.booleanNode(false)
                        : f.stringNode(cell);
            }
            case TIMESTAMP -> {
                if (!s.isEmpty() && s.chars().allMatch(Character::isDigit) && s.length() <= 15) {
                    return f.numberNode(Long.parseLong(s));
                }
                // "2026-03-01 09:30:00+01:00", as SQL tools print it, is the ISO form with a space for the T
                if (s.length() > 10 && s.charAt(10) == ' ') {
                    s = s.substring(0, 10) + 'T' + s.substring(11);
                }
                return f.stringNode(s);
            }
            default -> {
                return f.stringNode(cell);
            }
        }
    }

    private static Map<String, Kind> fields(Object... pairs) {
        Map<String, Kind> m = new LinkedHashMap<>();
        for (int i = 0; i < pairs.length; i += 2) {
            m.put((String) pairs[i], (Kind) pairs[i + 1]);
        }
        return m;
    }

    private static Map<String, Kind> with(Map<String, Kind> segment, Map<String, Kind> own) {
        Map<String, Kind> m = new LinkedHashMap<>(own);
        m.putAll(segment);
        return m;
    }
}

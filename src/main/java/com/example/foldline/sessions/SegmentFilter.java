package com.example.foldline.sessions;

import java.time.LocalDate;
import java.util.EnumMap;
import java.util.List;
import java.util.Map;
import java.util.Set;

/**
 * Which sessions a question is about: local days {@code from}..{@code to} (inclusive, site time zone) and, per
 * segment dimension, the accepted values (empty map: all sessions).
 */
public record SegmentFilter(LocalDate from, LocalDate to, Map<Dim, List<String>> values) {

    public SegmentFilter {
        values = values.isEmpty() ? Map.of() : Map.copyOf(new EnumMap<>(values));
    }

    public Set<Dim> dims() {
        return values.keySet();
    }

    public SegmentFilter withRange(LocalDate newFrom, LocalDate newTo) {
        return new SegmentFilter(newFrom, newTo, values);
    }

    public SegmentFilter with(Dim dim, List<String> accepted) {
        EnumMap<Dim, List<String>> copy = new EnumMap<>(Dim.class);
        copy.putAll(values);
        copy.put(dim, List.copyOf(accepted));
        return new SegmentFilter(from, to, copy);
    }
}

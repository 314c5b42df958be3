package com.example.foldline.sessions;

import java.time.LocalDate;
import java.util.Map;

/**
 * One row of a grouped answer: the day (when grouped by day) and the value of each grouping dimension (text
 * dimensions as String, "" for unknown; numeric ones as Integer), with the measures.
 */
public record Group<T>(LocalDate day, Map<Dim, Object> key, T totals) {

    public String text(Dim dim) {
        return (String) key.get(dim);
    }

    public int number(Dim dim) {
        return (Integer) key.get(dim);
    }
}

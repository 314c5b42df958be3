package com.example.foldline.stats;

import java.io.BufferedReader;
import java.io.IOException;
import java.io.InputStream;
import java.io.InputStreamReader;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;

/**
 * Reads the reference CSV files kept verbatim under {@code src/test/resources/reference/} (copied from the project's
 * shared check-value folder, see {@code checkvalues.md}; SHA-256 sums checked when copied).
 */
final class ReferenceCsv {

    private final List<String> header;
    private final List<String[]> rows;

    private ReferenceCsv(List<String> header, List<String[]> rows) {
        this.header = header;
        this.rows = rows;
    }

    static ReferenceCsv load(String name) {
        String path = "/reference/" + name;
        try (InputStream in = ReferenceCsv.class.getResourceAsStream(path)) {
            if (in == null) {
                throw new IllegalStateException("missing test resource " + path);
            }
            BufferedReader reader = new BufferedReader(new InputStreamReader(in, StandardCharsets.UTF_8));
            List<String> header = Arrays.stream(reader.readLine().split(",")).map(ReferenceCsv::unquote).toList();
            List<String[]> rows = new ArrayList<>();
            for (String line = reader.readLine(); line != null; line = reader.readLine()) {
                if (!line.isBlank()) {
                    rows.add(Arrays.stream(line.split(",")).map(ReferenceCsv::unquote).toArray(String[]::new));
                }
            }
            return new ReferenceCsv(header, rows);
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    double[] doubles(String column) {
        int c = index(column);
        return rows.stream().mapToDouble(r -> Double.parseDouble(r[c])).toArray();
    }

    long[] longs(String column) {
        int c = index(column);
        return rows.stream().mapToLong(r -> Long.parseLong(r[c])).toArray();
    }

    private int index(String column) {
        int c = header.indexOf(column);
        if (c < 0) {
            throw new IllegalArgumentException("no column " + column + " in " + header);
        }
        return c;
    }

    private static String unquote(String s) {
        String t = s.trim();
        return t.length() >= 2 && t.startsWith("\"") && t.endsWith("\"") ? t.substring(1, t.length() - 1) : t;
    }
}

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
 * Reads the reference CSV files in src/test/resources/reference (verbatim copies of the project's shared reference
 * data, see their SHA-256 sums there), so that tests never read outside the repository.
 */
final class ReferenceData {

    private final List<String> header;
    private final List<String[]> rows;

    private ReferenceData(List<String> header, List<String[]> rows) {
        this.header = header;
        this.rows = rows;
    }

    static ReferenceData load(String file) {
        String path = "/reference/" + file;
        try (InputStream in = ReferenceData.class.getResourceAsStream(path)) {
            if (in == null) {
                throw new IllegalStateException("missing test resource " + path);
            }
            BufferedReader reader = new BufferedReader(new InputStreamReader(in, StandardCharsets.UTF_8));
            List<String> header = Arrays.stream(reader.readLine().split(",")).map(ReferenceData::unquote).toList();
            List<String[]> rows = new ArrayList<>();
            String line;
            while ((line = reader.readLine()) != null) {
                if (!line.isBlank()) {
                    rows.add(Arrays.stream(line.split(",")).map(ReferenceData::unquote).toArray(String[]::new));
                }
            }
            return new ReferenceData(header, rows);
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    private static String unquote(String s) {
        String t = s.trim();
        return t.length() >= 2 && t.startsWith("\"") && t.endsWith("\"") ? t.substring(1, t.length() - 1) : t;
    }

    /** Keeps only the rows whose column equals the value. */
    ReferenceData where(String column, String value) {
        int c = index(column);
        return new ReferenceData(header, rows.stream().filter(r -> r[c].equals(value)).toList());
    }

    double[] column(String name) {
        int c = index(name);
        return rows.stream().mapToDouble(r -> Double.parseDouble(r[c])).toArray();
    }

    long[] longColumn(String name) {
        int c = index(name);
        return rows.stream().mapToLong(r -> Long.parseLong(r[c])).toArray();
    }

    int size() {
        return rows.size();
    }

    private int index(String name) {
        int c = header.indexOf(name);
        if (c < 0) {
            throw new IllegalArgumentException("no column " + name + " in " + header);
        }
        return c;
    }
}

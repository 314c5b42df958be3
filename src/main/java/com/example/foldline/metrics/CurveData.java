package com.example.foldline.metrics;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Locale;

import com.example.foldline.system.BadRequestException;
import com.example.foldline.system.FieldError;

/**
 * An analyst's own curve, from JSON or a CSV with named columns: x, y and optionally weights (sessions) or trials
 * (then y holds successes and the binomial model is used). Validation names the field and the reason.
 */
public record CurveData(double[] x, double[] y, double[] weights, double[] trials) {

    public static final int MAX_POINTS = 1_000_000;

    public CurveData {
        List<FieldError> errors = new ArrayList<>();
        if (x == null || x.length == 0) {
            errors.add(new FieldError("x", "is required and must not be empty"));
        }
        if (y == null || y.length == 0) {
            errors.add(new FieldError("y", "is required and must not be empty"));
        }
        if (errors.isEmpty()) {
            if (x.length != y.length) {
                errors.add(new FieldError("y", "has " + y.length + " values, x has " + x.length));
            }
            if (x.length > MAX_POINTS) {
                errors.add(new FieldError("x", "at most " + MAX_POINTS + " points, got " + x.length));
            }
            finite("x", x, errors);
            finite("y", y, errors);
            if (weights != null) {
                if (weights.length != x.length) {
                    errors.add(new FieldError("weights", "has " + weights.length + " values, x has " + x.length));
                } else {
                    for (int i = 0; i < weights.length; i++) {
                        if (!(weights[i] >= 0) || Double.isInfinite(weights[i])) {
                            errors.add(new FieldError("weights", "value " + (i + 1) + " must be a finite number >= 0, got "
                                    + weights[i]));
                            break;
                        }
                    }
                }
            }
            if (trials != null) {
                if (trials.length != x.length) {
                    errors.add(new FieldError("trials", "has " + trials.length + " values, x has " + x.length));
                } else {
                    for (int i = 0; i < trials.length; i++) {
                        if (trials[i] < 0 || trials[i] != Math.rint(trials[i]) || y[i] < 0 || y[i] != Math.rint(y[i])
                                || y[i] > trials[i]) {
                            errors.add(new FieldError("trials", "value " + (i + 1) + ": successes (y = " + y[i]
                                    + ") and trials (" + trials[i] + ") must be whole numbers with 0 <= y <= trials"));
                            break;
                        }
                    }
                }
            }
        }
        if (!errors.isEmpty()) {
            throw new BadRequestException(errors);
        }
    }

    private static void finite(String field, double[] values, List<FieldError> errors) {
        for (int i = 0; i < values.length; i++) {
            if (!Double.isFinite(values[i])) {
                errors.add(new FieldError(field, "value " + (i + 1) + " is not a finite number"));
                return;
            }
        }
    }

    /** Sorted by x (the fits do not depend on input order, the curve drawing does). */
    CurveData sorted() {
        Integer[] order = new Integer[x.length];
        for (int i = 0; i < order.length; i++) {
            order[i] = i;
        }
        Arrays.sort(order, (a, b) -> Double.compare(x[a], x[b]));
        return new CurveData(pick(x, order), pick(y, order), weights == null ? null : pick(weights, order),
                trials == null ? null : pick(trials, order));
    }

    private static double[] pick(double[] values, Integer[] order) {
        double[] out = new double[values.length];
        for (int i = 0; i < out.length; i++) {
            out[i] = values[order[i]];
        }
        return out;
    }

    /**
     * Reads a CSV with a header row (comma or semicolon separated) and picks the named columns.
     *
     * @param weightsColumn optional
     * @param trialsColumn  optional
     */
    public static CurveData fromCsv(String text, String xColumn, String yColumn, String weightsColumn,
                                    String trialsColumn) {
        String[] lines = text.replace("\r", "").split("\n");
        if (lines.length < 2) {
            throw new BadRequestException("csv", "needs a header row and at least one data row");
        }
        String separator = lines[0].contains(";") && !lines[0].contains(",") ? ";" : ",";
        List<String> header = Arrays.stream(lines[0].split(separator, -1))
                .map(h -> h.strip().replace("\"", "").toLowerCase(Locale.ROOT)).toList();
        int xi = column(header, xColumn, "x", true);
        int yi = column(header, yColumn, "y", true);
        int wi = column(header, weightsColumn, "weights", false);
        int ti = column(header, trialsColumn, "trials", false);
        List<double[]> rows = new ArrayList<>();
        for (int line = 1; line < lines.length; line++) {
            if (lines[line].isBlank()) {
                continue;
            }
            String[] cells = lines[line].split(separator, -1);
            double[] row = new double[4];
            int[] cols = {xi, yi, wi, ti};
            for (int c = 0; c < 4; c++) {
                if (cols[c] < 0) {
                    continue;
                }
                if (cols[c] >= cells.length) {
                    throw new BadRequestException("csv", "line " + (line + 1) + " has too few columns");
                }
                try {
                    row[c] = Double.parseDouble(cells[cols[c]].strip().replace("\"", ""));
                } catch (NumberFormatException e) {
                    throw new BadRequestException("csv", "line " + (line + 1) + ", column '" + header.get(cols[c])
                            + "': not a number: '" + cells[cols[c]].strip() + "'");
                }
            }
            rows.add(row);
        }
        return new CurveData(rows.stream().mapToDouble(r -> r[0]).toArray(), rows.stream().mapToDouble(r -> r[1]).toArray(),
                wi < 0 ? null : rows.stream().mapToDouble(r -> r[2]).toArray(),
                ti < 0 ? null : rows.stream().mapToDouble(r -> r[3]).toArray());
    }

    private static int column(List<String> header, String name, String field, boolean required) {
        if (name == null || name.isBlank()) {
            if (required) {
                throw new BadRequestException(field, "name the CSV column to use for " + field);
            }
            return -1;
        }
        int i = header.indexOf(name.strip().toLowerCase(Locale.ROOT));
        if (i < 0) {
            throw new BadRequestException(field, "no column '" + name + "' in the CSV header " + header);
        }
        return i;
    }
}

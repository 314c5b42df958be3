package com.example.foldline.bench;

import java.util.Arrays;

/** Entry point of the benchmark commands (docs/benchmarks.md): {@code ingest}, {@code metrics}, {@code imports}, {@code stats}. */
public final class Bench {

    private Bench() {
    }

    public static void main(String[] args) throws Exception {
        String name = args.length == 0 ? "ingest" : args[0];
        String[] rest = args.length == 0 ? new String[0] : Arrays.copyOfRange(args, 1, args.length);
        switch (name) {
            case "ingest" -> IngestBenchmark.main(rest);
            case "metrics" -> MetricsBenchmark.main(rest);
            case "imports" -> ImportBenchmark.main(rest);
            case "alerts" -> AlertsBenchmark.main(rest);
            case "stats" -> {
                com.example.foldline.stats.StatsBenchmark.main(rest);
                com.example.foldline.stats.StatsBenchmarkB.main(rest);
                com.example.foldline.stats.DensityStatsBenchmark.main(rest);
            }
            default -> throw new IllegalArgumentException("unknown benchmark " + name + " (ingest, metrics, imports, stats)");
        }
        System.exit(0);
    }

    static long arg(String[] args, String name, long fallback) {
        for (int i = 0; i + 1 < args.length; i++) {
            if (args[i].equals("--" + name)) {
                return Long.parseLong(args[i + 1]);
            }
        }
        return fallback;
    }

    static boolean flag(String[] args, String name) {
        return Arrays.asList(args).contains("--" + name);
    }

    /**
     * The JDBC URL of a PostgreSQL schema emptied for a benchmark run ({@code -Dpg.url}, default the local
     * foldline_bench database; user and password foldline): the schema is dropped and created again.
     */
    static String freshPostgresSchema(String schema) throws java.sql.SQLException {
        if (!schema.matches("[a-z_][a-z0-9_]*")) {
            throw new IllegalArgumentException("pg.schema must be a plain lower-case name");
        }
        String url = System.getProperty("pg.url", "jdbc:postgresql://127.0.0.1:5432/foldline_bench")
                + (schema.equals("public") ? "" : "?currentSchema=" + schema);
        try (java.sql.Connection c = java.sql.DriverManager.getConnection(url, "foldline", "foldline");
             java.sql.Statement s = c.createStatement()) {
            s.execute("DROP SCHEMA IF EXISTS " + schema + " CASCADE");
            s.execute("CREATE SCHEMA " + schema);
        }
        return url;
    }
}

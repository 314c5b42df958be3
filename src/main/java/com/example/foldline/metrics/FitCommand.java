package com.example.foldline.metrics;

import java.io.IOException;
import java.io.PrintStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.HashMap;
import java.util.Map;

import com.example.foldline.system.BadRequestException;

import tools.jackson.databind.SerializationFeature;
import tools.jackson.databind.json.JsonMapper;

/**
 * The command line fit: {@code java -jar foldline.jar fit --csv FILE --x COL --y COL [--weights COL]
 * [--trials COL] [--max-breakpoints K] [--knee [--sensitivity S]]}. Prints the same JSON as the fits API.
 */
public final class FitCommand {

    private FitCommand() {
    }

    public static int run(String[] args, PrintStream out, PrintStream err) {
        Map<String, String> options = new HashMap<>();
        for (int i = 0; i < args.length; i++) {
            String a = args[i];
            if (a.equals("--knee")) {
                options.put("knee", "true");
            } else if (a.startsWith("--") && i + 1 < args.length) {
                options.put(a.substring(2), args[++i]);
            } else {
                err.println("unexpected argument '" + a + "'");
                return usage(err);
            }
        }
        if (!options.containsKey("csv") || !options.containsKey("x") || !options.containsKey("y")) {
            return usage(err);
        }
        try {
            String csv = Files.readString(Path.of(options.get("csv")), StandardCharsets.UTF_8);
            CurveData data = CurveData.fromCsv(csv, options.get("x"), options.get("y"), options.get("weights"),
                    options.get("trials"));
            Object answer = options.containsKey("knee")
                    ? Fits.knee(data, Double.parseDouble(options.getOrDefault("sensitivity", "1")))
                    : Fits.segmented(data, Integer.parseInt(options.getOrDefault("max-breakpoints", "2")));
            JsonMapper mapper = JsonMapper.builder().enable(SerializationFeature.INDENT_OUTPUT).build();
            out.println(mapper.writeValueAsString(answer));
            return 0;
        } catch (BadRequestException e) {
            e.errors().forEach(f -> err.println(f.field() + ": " + f.message()));
            return 2;
        } catch (IOException e) {
            err.println("cannot read " + options.get("csv") + ": " + e.getMessage());
            return 2;
        } catch (NumberFormatException e) {
            err.println("not a number: " + e.getMessage());
            return 2;
        }
    }

    private static int usage(PrintStream err) {
        err.println("usage: fit --csv FILE --x COLUMN --y COLUMN [--weights COLUMN] [--trials COLUMN] "
                + "[--max-breakpoints 0-3] [--knee [--sensitivity S]]");
        return 2;
    }
}

package com.example.foldline.metrics;

import org.springframework.http.MediaType;
import org.springframework.web.bind.annotation.PostMapping;
import org.springframework.web.bind.annotation.RequestBody;
import org.springframework.web.bind.annotation.RequestParam;
import org.springframework.web.bind.annotation.RestController;

import io.swagger.v3.oas.annotations.Operation;
import io.swagger.v3.oas.annotations.tags.Tag;

@RestController
@Tag(name = "Fits", description = "Segmented fits and knees on curves analysts bring (docs/methods.md)")
class FitController {

    /** JSON body of a fit request. */
    record FitRequest(double[] x, double[] y, double[] weights, double[] trials, Integer maxBreakpoints,
                      Double sensitivity) {
    }

    @PostMapping(path = "/api/v1/fits/segmented", consumes = MediaType.APPLICATION_JSON_VALUE)
    @Operation(summary = "Segmented fit of your own curve",
            description = "{x, y, weights?, trials? (y = successes: binomial model), maxBreakpoints 0-3 (default 2)}")
    FitSummary segmented(@RequestBody FitRequest body) {
        return Fits.segmented(new CurveData(body.x(), body.y(), body.weights(), body.trials()),
                body.maxBreakpoints() == null ? 2 : body.maxBreakpoints());
    }

    @PostMapping(path = "/api/v1/fits/segmented", consumes = {"text/csv", MediaType.TEXT_PLAIN_VALUE})
    @Operation(summary = "Segmented fit of a CSV upload", description = "Name the columns with x, y, weights, trials")
    FitSummary segmentedCsv(@RequestBody String csv, @RequestParam("x") String x, @RequestParam("y") String y,
                            @RequestParam(required = false) String weights, @RequestParam(required = false) String trials,
                            @RequestParam(defaultValue = "2") int maxBreakpoints) {
        return Fits.segmented(CurveData.fromCsv(csv, x, y, weights, trials), maxBreakpoints);
    }

    @PostMapping(path = "/api/v1/fits/knee", consumes = MediaType.APPLICATION_JSON_VALUE)
    @Operation(summary = "Knee of a saturating curve (Kneedle) with the segmented fit as a second opinion",
            description = "{x, y, weights?, sensitivity (default 1)}")
    KneeReport knee(@RequestBody FitRequest body) {
        return Fits.knee(new CurveData(body.x(), body.y(), body.weights(), null),
                body.sensitivity() == null ? 1.0 : body.sensitivity());
    }

    @PostMapping(path = "/api/v1/fits/knee", consumes = {"text/csv", MediaType.TEXT_PLAIN_VALUE})
    KneeReport kneeCsv(@RequestBody String csv, @RequestParam("x") String x, @RequestParam("y") String y,
                       @RequestParam(required = false) String weights, @RequestParam(defaultValue = "1") double sensitivity) {
        return Fits.knee(CurveData.fromCsv(csv, x, y, weights, null), sensitivity);
    }
}

package com.example.foldline.metrics;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;
import static org.springframework.security.test.web.servlet.request.SecurityMockMvcRequestPostProcessors.httpBasic;

import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.io.PrintStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;

import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.springframework.beans.factory.annotation.Autowired;
import org.springframework.boot.test.context.SpringBootTest;
import org.springframework.boot.webmvc.test.autoconfigure.AutoConfigureMockMvc;
import org.springframework.http.HttpStatus;
import org.springframework.http.MediaType;
import org.springframework.test.context.ActiveProfiles;
import org.springframework.test.context.TestPropertySource;
import org.springframework.test.web.servlet.assertj.MockMvcTester;

import tools.jackson.databind.JsonNode;
import tools.jackson.databind.ObjectMapper;

/**
 * Issue #4: the fits API and command line on published reference data (src/test/resources/reference/checkvalues.md):
 * S1 "stagnant" (R segmented 1.6-2, confirmed by an exhaustive profile), S3 "down" (segmented logistic), K2 (kneed's
 * test suite).
 */
@SpringBootTest
@AutoConfigureMockMvc
@ActiveProfiles("test")
@TestPropertySource(properties = "foldline.ingest.max-body-bytes=65536")
class FitApiTests {

    @Autowired
    MockMvcTester mvc;
    @Autowired
    ObjectMapper json;

    static String resource(String name) throws IOException {
        return new String(FitApiTests.class.getResourceAsStream("/reference/" + name).readAllBytes(),
                StandardCharsets.UTF_8);
    }

    JsonNode post(String path, MediaType type, String body) {
        var result = mvc.post().uri(path).with(httpBasic("admin", "admin-secret")).contentType(type).content(body)
                .exchange();
        assertThat(result).hasStatusOk();
        return json.readTree(result.getResponse().getContentAsByteArray());
    }

    @Test
    void segmentedFitOfAJsonCurveFindsTheGlobalOptimum() throws IOException {
        List<String> lines = resource("stagnant.csv").lines().skip(1).toList();
        String xs = String.join(",", lines.stream().map(l -> l.split(",")[0]).toList());
        String ys = String.join(",", lines.stream().map(l -> l.split(",")[1]).toList());
        JsonNode fit = post("/api/v1/fits/segmented", MediaType.APPLICATION_JSON,
                "{\"x\":[" + xs + "],\"y\":[" + ys + "],\"maxBreakpoints\":1}");
        // checkvalues S1: psi 0.0411057840 (global LS, independent profile), SE 0.02283480677
        assertThat(fit.get("breakpointCount").asInt()).isEqualTo(1);
        assertThat(fit.get("breakpoints").get(0).get("estimate").asDouble()).isCloseTo(0.0411057840, within(1e-7));
        assertThat(fit.get("breakpoints").get(0).get("standardError").asDouble()).isCloseTo(0.02283480677, within(1e-6));
        assertThat(fit.get("residual").asDouble()).isCloseTo(0.00914019723209, within(1e-12));
        assertThat(fit.get("candidates")).hasSize(2);
        assertThat(fit.get("breakTest").get("pValue").asDouble()).isLessThan(1e-10);
    }

    @Test
    void csvUploadWithTrialsUsesTheBinomialModel() throws IOException {
        JsonNode fit = post("/api/v1/fits/segmented?x=age&y=cases&trials=births", MediaType.parseMediaType("text/csv"),
                resource("down.csv"));
        // checkvalues S3: psi 31.081150619 (R segmented), deviance 43.9386752283
        assertThat(fit.get("model").stringValue()).contains("logistic");
        assertThat(fit.get("breakpoints").get(0).get("estimate").asDouble()).isCloseTo(31.081150619, within(1e-4));
        assertThat(fit.get("residual").asDouble()).isCloseTo(43.9386752283, within(1e-6));
    }

    @Test
    void kneeOfASaturatingCurve() {
        // checkvalues K2 (kneed test suite): knee at x = 2
        JsonNode knee = post("/api/v1/fits/knee", MediaType.APPLICATION_JSON,
                "{\"x\":[0,1,2,3,4,5,6,7,8,9],\"y\":[0,60,80,85,90,95,96,97,98,99]}");
        assertThat(knee.get("kneedle").get("found").asBoolean()).isTrue();
        assertThat(knee.get("kneedle").get("knee").asDouble()).isEqualTo(2.0);
        assertThat(knee.get("segmented").get("model").stringValue()).contains("segmented");
    }

    @Test
    void badCurvesAre400NamingTheField() {
        assertThat(mvc.post().uri("/api/v1/fits/segmented").with(httpBasic("admin", "admin-secret"))
                .contentType(MediaType.APPLICATION_JSON).content("{\"x\":[1,2,3],\"y\":[1,2]}"))
                .hasStatus(HttpStatus.BAD_REQUEST).bodyJson().extractingPath("$.errors[0].field").isEqualTo("y");
        assertThat(mvc.post().uri("/api/v1/fits/segmented").with(httpBasic("admin", "admin-secret"))
                .contentType(MediaType.APPLICATION_JSON).content("{\"x\":[1,2,3],\"y\":[1,2,3],\"maxBreakpoints\":5}"))
                .hasStatus(HttpStatus.BAD_REQUEST).bodyJson().extractingPath("$.errors[0].field")
                .isEqualTo("maxBreakpoints");
        assertThat(mvc.post().uri("/api/v1/fits/segmented?x=ads&y=nope").with(httpBasic("admin", "admin-secret"))
                .contentType(MediaType.parseMediaType("text/csv")).content("ads,bounce\n1,0.2\n"))
                .hasStatus(HttpStatus.BAD_REQUEST).bodyJson().extractingPath("$.errors[0].field").isEqualTo("y");
        // thin data is an answer, not an error
        JsonNode thin = post("/api/v1/fits/segmented", MediaType.APPLICATION_JSON, "{\"x\":[1,2],\"y\":[1,2]}");
        assertThat(thin.get("notice").stringValue()).contains("no fit");
    }

    @Test
    void commandLinePrintsTheSameFit(@TempDir Path dir) throws IOException {
        Path csv = dir.resolve("stagnant.csv");
        Files.writeString(csv, resource("stagnant.csv"));
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        ByteArrayOutputStream err = new ByteArrayOutputStream();
        int status = FitCommand.run(new String[]{"--csv", csv.toString(), "--x", "x", "--y", "y",
                "--max-breakpoints", "1"}, new PrintStream(out, true, StandardCharsets.UTF_8),
                new PrintStream(err, true, StandardCharsets.UTF_8));
        assertThat(status).isZero();
        JsonNode fit = json.readTree(out.toString(StandardCharsets.UTF_8));
        assertThat(fit.get("breakpoints").get(0).get("estimate").asDouble()).isCloseTo(0.0411057840, within(1e-7));
        assertThat(FitCommand.run(new String[]{"--csv", csv.toString()}, new PrintStream(out), new PrintStream(err)))
                .isEqualTo(2);
    }
}

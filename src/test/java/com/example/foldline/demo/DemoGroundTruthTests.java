package com.example.foldline.demo;

import static org.assertj.core.api.Assertions.assertThat;

import java.time.LocalDate;
import java.util.HashMap;
import java.util.List;
import java.util.Map;

import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.TestInstance;
import org.springframework.beans.factory.annotation.Autowired;
import org.springframework.boot.test.context.SpringBootTest;
import org.springframework.test.context.ActiveProfiles;

import com.example.foldline.metrics.Answers;
import com.example.foldline.metrics.CapAdvice;
import com.example.foldline.metrics.FitSummary;
import com.example.foldline.metrics.MetricRequestFactory;
import com.example.foldline.metrics.MetricsService;
import com.example.foldline.sites.Site;
import com.example.foldline.stats.Cusum;
import com.example.foldline.stats.ProportionDifference;
import com.example.foldline.stats.Proportions;

/**
 * Issue #8: the statistics core recovers the ground truth the simulator planted (docs/demo.md) from the demo data.
 */
@SpringBootTest
@ActiveProfiles("test")
@TestInstance(TestInstance.Lifecycle.PER_CLASS)
class DemoGroundTruthTests {

    @Autowired
    DemoPublisher demo;
    @Autowired
    MetricsService metrics;
    @Autowired
    MetricRequestFactory requests;

    Map<String, Site> sites = new HashMap<>();
    DemoPublisher.Seeded seeded;

    @BeforeAll
    void seed() {
        seeded = demo.seed(7, 60, 1.0);
        seeded.sites().forEach(s -> sites.put(s.domain(), s));
    }

    private Answers.DensityAnswer density(String domain, String query) {
        Site site = sites.get(domain);
        return metrics.density(requests.request(site, "density", range(site) + "&" + query));
    }

    /** The simulated days: the 60 days up to yesterday in the site's time zone. */
    private static String range(Site site) {
        return "from=" + first(site) + "&to=" + last(site);
    }

    private static LocalDate last(Site site) {
        return LocalDate.now(site.timezone()).minusDays(1);
    }

    private static LocalDate first(Site site) {
        return last(site).minusDays(59);
    }

    @Test
    void kneesByDeviceLieInsideTheirIntervals() {
        // planted: phones tip after 4 entry-page ads, desktops after 7 (DemoScenario)
        FitSummary phone = density("saltmarsh-kitchen.example", "device=phone").fit();
        assertThat(phone.breakTest().breakFound()).isTrue();
        assertThat(phone.breakpoints().get(0).lower()).isLessThanOrEqualTo(4.0);
        assertThat(phone.breakpoints().get(0).upper()).isGreaterThanOrEqualTo(4.0);
        FitSummary desktop = density("saltmarsh-kitchen.example", "device=desktop").fit();
        assertThat(desktop.breakpoints().get(0).lower()).isLessThanOrEqualTo(7.0);
        assertThat(desktop.breakpoints().get(0).upper()).isGreaterThanOrEqualTo(7.0);
        assertThat(phone.breakpoints().get(0).estimate()).isLessThan(desktop.breakpoints().get(0).estimate());
    }

    /**
     * The value of a session (up to a constant factor) if every page carried k ads, from the ground truth in
     * docs/demo.md alone: revenue per page ∝ k/(1 + 0.06k) · E[0.15 + 0.85·view], view = max(0.05, 0.78(1 − e^(−t/7))
     * − 0.015k) with engaged time t = min(600, median·e^(0.9Z)) (median 18 s on phones, 28 s elsewhere); bounce at k
     * entry-page ads averaged over the source mix (search 40%, social 25%, direct 20%, referral 10%, email 5%), the
     * recipes site's variants (half "stacked") and, for phones on the news site, the 3 incident days of the 60; after
     * a non-bounce a geometric number of later pages with mean 1/(1 − carry-on), carry-on = 0.62 − 0.025k.
     */
    static double trueSessionValue(DemoScenario.SiteSpec spec, String device, int k) {
        double median = device.equals("phone") ? 18 : 28;
        double sum = 0;
        double weights = 0;
        for (int i = -4000; i <= 4000; i++) { // E over Z ~ N(0, 1) by the trapezoid rule on [−8, 8]
            double z = i / 500.0;
            double w = Math.exp(-z * z / 2);
            double t = Math.min(600, median * Math.exp(0.9 * z));
            sum += w * (0.15 + 0.85 * Math.max(0.05, 0.78 * (1 - Math.exp(-t / 7)) - 0.015 * k));
            weights += w;
        }
        double perPage = k / (1 + 0.06 * k) * sum / weights;
        String[] sources = {"search", "social", "direct", "referral", "email"};
        double[] share = {0.40, 0.25, 0.20, 0.10, 0.05};
        double bounce = 0;
        for (int s = 0; s < sources.length; s++) {
            double b = DemoScenario.BASE_BOUNCE.get(device) + DemoScenario.SOURCE_BOUNCE.get(sources[s])
                    + DemoScenario.BOUNCE_RISE_PER_AD * Math.max(0, k - spec.kneeByDevice().get(device));
            double stacked = b + (device.equals("phone") && sources[s].equals("social") ? -0.10
                    : device.equals("desktop") && sources[s].equals("search") ? 0.06 : 0);
            double mixed = spec.variants().isEmpty() ? clip(b) : (clip(b) + clip(stacked)) / 2;
            if (spec.key().equals("news") && device.equals("phone")) {
                mixed = (57 * mixed + 3 * clip(b + DemoScenario.INCIDENT_PHONE_BOUNCE)) / 60;
            }
            bounce += share[s] * mixed;
        }
        double carryOn = Math.max(0.05, 0.62 - 0.025 * k);
        return perPage * (1 + (1 - bounce) / (1 - carryOn));
    }

    private static double clip(double p) {
        return Math.max(0.02, Math.min(0.98, p));
    }

    @Test
    void theAdCapAdviceLandsNearTheSimulatedOptimumForEachDevice() {
        // planted (docs/demo.md): later pages carry 0–10 ads, so one cap for every page is judged on 0..10; the true
        // value peaks at 8 (9 on the gear site's desktops) and stays within 3% of its peak from 7 to 10 ads
        for (DemoScenario.SiteSpec spec : DemoScenario.SITES) {
            if (spec.key().equals("gear")) {
                continue; // 350 sessions a day: too thin per device and ad count for advice at scale 1
            }
            for (String device : List.of("phone", "desktop", "tablet")) {
                double best = 0;
                for (int k = 0; k <= 10; k++) {
                    best = Math.max(best, trueSessionValue(spec, device, k));
                }
                CapAdvice advice = density(spec.domain(), "device=" + device).recommendation();
                if (advice.cap() == null) {
                    // not enough data is an answer: allowed for the thin tablet segment only
                    assertThat(device).as(spec.domain() + " " + advice.summary()).isEqualTo("tablet");
                    continue;
                }
                assertThat(advice.cap()).as(spec.domain() + " " + device).isBetween(0, 10);
                // tablets are a tenth of the sessions (a few hundred per entry-ad count here): a looser bound
                double floor = device.equals("tablet") ? 0.90 : 0.97;
                assertThat(trueSessionValue(spec, device, advice.cap()) / best)
                        .as(spec.domain() + " " + device + ": " + advice.summary()).isGreaterThanOrEqualTo(floor);
                assertThat(advice.probabilityBest()).isBetween(0.0, 1.0);
                assertThat(advice.model()).startsWith("entry/later model at equal caps");
            }
        }
    }

    @Test
    void theLayoutIncidentIsDetectedOnItsFirstDay() {
        Site news = sites.get("harborview-daily.example");
        Answers.SeriesAnswer series = metrics.timeseries(requests.request(news, "timeseries",
                "metric=bounceRate&device=phone&" + range(news)));
        List<Answers.SeriesPoint> points = series.points();
        long[] bounces = points.stream().mapToLong(p -> (long) p.numerator()).toArray();
        long[] sessions = points.stream().mapToLong(p -> (long) p.denominator()).toArray();
        // baseline from the first 30 days, which hold no incident
        long b = 0;
        long n = 0;
        for (int i = 0; i < 30; i++) {
            b += bounces[i];
            n += sessions[i];
        }
        Cusum.Result cusum = Cusum.rates(bounces, sessions, (double) b / n, Cusum.Options.defaults());
        assertThat(cusum.firstSignal()).isPresent();
        int incidentIndex = points.size() - 1 - DemoScenario.INCIDENT_DAYS_AGO;
        assertThat(cusum.firstSignal().get().index()).isEqualTo(incidentIndex);
    }

    @Test
    void theVariantSplitIsFound() {
        // planted: "stacked" suits phone readers from social, "classic" suits desktop readers from search
        ProportionDifference phoneSocial = bounceDifference("device=phone&source=social");
        assertThat(phoneSocial.upper()).isLessThan(0);
        ProportionDifference desktopSearch = bounceDifference("device=desktop&source=search");
        assertThat(desktopSearch.lower()).isGreaterThan(0);
    }

    @Test
    void theRegionalSurgeStandsOut() {
        Site news = sites.get("harborview-daily.example");
        LocalDate surge = last(news).minusDays(DemoScenario.SURGE_DAYS_AGO);
        double surgeDay = regionShare(news, surge);
        double dayBefore = regionShare(news, surge.minusDays(1));
        assertThat(surgeDay).isGreaterThan(2 * dayBefore);
    }

    private double regionShare(Site site, LocalDate day) {
        var total = metrics.overview(requests.request(site, "overview", "from=" + day + "&to=" + day)).current();
        var wi = metrics.overview(requests.request(site, "overview", "region=" + DemoScenario.SURGE_REGION + "&from="
                + day + "&to=" + day)).current();
        return (double) wi.sessions() / total.sessions();
    }

    private ProportionDifference bounceDifference(String segment) {
        Site kitchen = sites.get("saltmarsh-kitchen.example");
        var stacked = metrics.overview(requests.request(kitchen, "overview", segment + "&variant=stacked&"
                + range(kitchen))).current();
        var classic = metrics.overview(requests.request(kitchen, "overview", segment + "&variant=classic&"
                + range(kitchen))).current();
        return Proportions.newcombeDifference(stacked.bounces(), stacked.sessions(), classic.bounces(),
                classic.sessions(), 0.05);
    }

    @Test
    void theDemoHasTheVolumeItsDocumentationStates() {
        // docs/demo.md: about 2,250 sessions a day at scale 1, over 60 days here
        assertThat(seeded.sessions()).isBetween(110_000L, 160_000L);
    }
}

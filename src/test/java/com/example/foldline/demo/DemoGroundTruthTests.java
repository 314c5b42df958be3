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

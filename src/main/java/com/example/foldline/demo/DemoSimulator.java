package com.example.foldline.demo;

import java.time.Instant;
import java.time.LocalDate;
import java.time.ZoneId;
import java.time.ZonedDateTime;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.SplittableRandom;

import com.example.foldline.sessions.SessionInput;

/**
 * Generates one site's sessions for one local day, deterministically from a seed, with the ground truth of
 * {@link DemoScenario} (docs/demo.md):
 * <ul>
 * <li>bounce flat up to a knee in entry-page ads, then rising {@link DemoScenario#BOUNCE_RISE_PER_AD} per ad, the
 * knee depending on the device;</li>
 * <li>the chance to read another page falls 2.5 points per ad on later pages;</li>
 * <li>revenue per impression falls with more ads on the page (1/(1 + 0.06 k)), viewable impressions pay fully,
 * others 15%; viewability rises with engaged time (1 − e^(−t/7 s)), so revenue per pageview climbs steeply over
 * the first 20 seconds and then flattens; countries pay differently;</li>
 * <li>layout variants on the recipes site: "stacked" suits phone readers from social (−10 points bounce), "classic"
 * suits desktop readers from search ("stacked" costs them +6 points);</li>
 * <li>on the news site a three-day layout incident lifts phone bounce by 20 points, and one day brings five times the
 * usual traffic from one region.</li>
 * </ul>
 */
final class DemoSimulator {

    private final DemoScenario.SiteSpec spec;
    private final long seed;
    private final double scale;
    private final LocalDate lastDay;

    DemoSimulator(DemoScenario.SiteSpec spec, long seed, double scale, LocalDate lastDay) {
        this.spec = spec;
        this.seed = seed;
        this.scale = scale;
        this.lastDay = lastDay;
    }

    boolean isIncidentDay(LocalDate day) {
        long ago = lastDay.toEpochDay() - day.toEpochDay();
        return spec.key().equals("news") && ago <= DemoScenario.INCIDENT_DAYS_AGO
                && ago > DemoScenario.INCIDENT_DAYS_AGO - 3;
    }

    boolean isSurgeDay(LocalDate day) {
        return spec.key().equals("news") && lastDay.toEpochDay() - day.toEpochDay() == DemoScenario.SURGE_DAYS_AGO;
    }

    List<SessionInput> day(LocalDate day) {
        SplittableRandom random = new SplittableRandom(seed * 1_000_003L + spec.key().hashCode() * 31L + day.toEpochDay());
        double weekday = switch (day.getDayOfWeek()) {
            case SATURDAY, SUNDAY -> 0.8;
            default -> 1.05;
        };
        int n = (int) Math.round(spec.sessionsPerDay() * scale * weekday * (0.9 + 0.2 * random.nextDouble()));
        List<SessionInput> sessions = new ArrayList<>(n);
        for (int i = 0; i < n; i++) {
            sessions.add(session(random, day, i, null));
        }
        if (isSurgeDay(day)) {
            int extra = (int) Math.round(spec.sessionsPerDay() * scale * 0.15 * (DemoScenario.SURGE_FACTOR - 1));
            for (int i = 0; i < extra; i++) {
                sessions.add(session(random, day, n + i, DemoScenario.SURGE_REGION));
            }
        }
        return sessions;
    }

    private SessionInput session(SplittableRandom r, LocalDate day, int index, String forcedRegion) {
        ZoneId zone = ZoneId.of(spec.timezone());
        String device = pick(r, new String[]{"phone", "desktop", "tablet"}, new double[]{0.56, 0.34, 0.10});
        String source = forcedRegion != null ? "social" : pick(r,
                new String[]{"search", "social", "direct", "referral", "email"}, new double[]{0.40, 0.25, 0.2, 0.1, 0.05});
        String country;
        String region = null;
        if (forcedRegion != null) {
            country = forcedRegion.substring(0, 2);
            region = forcedRegion;
        } else {
            country = pick(r, spec.countryShare());
            List<String> regions = spec.regions().get(country);
            if (regions != null && r.nextDouble() < 0.8) {
                region = regions.get(r.nextInt(regions.size()));
            }
        }
        String variant = spec.variants().isEmpty() ? null : spec.variants().get(r.nextInt(spec.variants().size()));
        String browser = DemoScenario.BROWSERS.get(r.nextInt(DemoScenario.BROWSERS.size()));
        String os = DemoScenario.SYSTEMS.get(r.nextInt(DemoScenario.SYSTEMS.size()));

        // entry page: its article's usual ad load, plus or minus one
        int article = zipf(r, 80);
        String section = spec.sections().get(article % spec.sections().size());
        String path = "/" + section + "/" + section.charAt(0) + "-" + (1000 + article * 7);
        int entryAds = Math.max(0, Math.min(12, (article * 5) % 13 + r.nextInt(3) - 1));

        double bounce = DemoScenario.BASE_BOUNCE.get(device) + DemoScenario.SOURCE_BOUNCE.get(source)
                + DemoScenario.BOUNCE_RISE_PER_AD * Math.max(0, entryAds - spec.kneeByDevice().get(device));
        if ("stacked".equals(variant)) {
            if (device.equals("phone") && source.equals("social")) {
                bounce -= 0.10;
            } else if (device.equals("desktop") && source.equals("search")) {
                bounce += 0.06;
            }
        }
        if (device.equals("phone") && isIncidentDay(day)) {
            bounce += DemoScenario.INCIDENT_PHONE_BOUNCE;
        }
        bounce = Math.max(0.02, Math.min(0.98, bounce));

        List<SessionInput.Page> pages = new ArrayList<>();
        double payCountry = spec.countryPay().get(country);
        pages.add(page(r, entryAds, device, payCountry));
        if (r.nextDouble() >= bounce) {
            int laterAds = r.nextInt(11);
            double carryOn = Math.max(0.05, 0.62 - 0.025 * laterAds);
            do {
                pages.add(page(r, laterAds, device, payCountry));
            } while (pages.size() < 40 && r.nextDouble() < carryOn);
        }
        ZonedDateTime start = day.atStartOfDay(zone).plusSeconds(diurnalSecond(r));
        Instant begin = start.toInstant();
        long seconds = 0;
        for (int i = 1; i < pages.size(); i++) {
            Long engaged = pages.get(i - 1).engagedMs();
            seconds += (engaged == null ? 30_000 : engaged) / 1000 + 5;
        }
        return new SessionInput("demo-" + spec.key() + "-" + day + "-" + index, "v" + r.nextLong(1_000_000_000_000L),
                begin, begin.plusSeconds(seconds), path, source, device, browser, os, country, region, variant, pages);
    }

    private SessionInput.Page page(SplittableRandom r, int ads, String device, double payCountry) {
        double medianSeconds = device.equals("phone") ? 18 : 28;
        double seconds = Math.min(600, medianSeconds * Math.exp(0.9 * gaussian(r)));
        boolean measured = r.nextDouble() > 0.08;
        double viewChance = Math.max(0.05, 0.78 * (1 - Math.exp(-seconds / 7.0)) - 0.015 * ads);
        double price = spec.cpmMicros() / 1000.0 * payCountry / (1 + 0.06 * ads);
        long revenue = 0;
        int viewable = 0;
        int clicks = 0;
        for (int i = 0; i < ads; i++) {
            boolean seen = r.nextDouble() < viewChance;
            if (seen) {
                viewable++;
                revenue += Math.round(price);
                if (r.nextDouble() < 0.004) {
                    clicks++;
                }
            } else {
                revenue += Math.round(price * 0.15);
            }
        }
        return new SessionInput.Page(ads, measured ? Math.round(seconds * 1000) : null, revenue, ads, viewable, clicks);
    }

    /** Second of the local day, following a day-shaped traffic curve (quiet at night, peaks morning and evening). */
    private static long diurnalSecond(SplittableRandom r) {
        while (true) {
            double h = r.nextDouble() * 24;
            double weight = 0.15 + Math.exp(-Math.pow((h - 8.5) / 2.5, 2)) + 0.9 * Math.exp(-Math.pow((h - 20) / 2.5, 2))
                    + 0.5 * Math.exp(-Math.pow((h - 13) / 2, 2));
            if (r.nextDouble() * 2.2 < weight) {
                return (long) (h * 3600);
            }
        }
    }

    private static int zipf(SplittableRandom r, int n) {
        // inverse of a 1/(k+1) popularity over n articles, good enough for a demo
        double u = r.nextDouble();
        return Math.min(n - 1, (int) Math.floor(Math.pow(n + 1, u) - 1));
    }

    private static double gaussian(SplittableRandom r) {
        double u = Math.max(1e-12, r.nextDouble());
        return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * r.nextDouble());
    }

    private static String pick(SplittableRandom r, String[] values, double[] weights) {
        double u = r.nextDouble();
        for (int i = 0; i < values.length; i++) {
            u -= weights[i];
            if (u < 0) {
                return values[i];
            }
        }
        return values[values.length - 1];
    }

    private static String pick(SplittableRandom r, Map<String, Double> shares) {
        double u = r.nextDouble();
        String last = null;
        for (var e : new java.util.TreeMap<>(shares).entrySet()) {
            last = e.getKey();
            u -= e.getValue();
            if (u < 0) {
                return e.getKey();
            }
        }
        return last;
    }
}

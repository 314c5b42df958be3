package com.example.foldline.demo;

import java.util.List;
import java.util.Map;

/**
 * The invented publisher "Tidewater Media" and its three sites, with the ground truth the simulator plants
 * (docs/demo.md). Every name here is invented; domains are .example (RFC 2606).
 */
final class DemoScenario {

    private DemoScenario() {
    }

    /** Ground truth of one site. */
    record SiteSpec(String key, String name, String domain, String timezone, String currency, int sessionsPerDay,
                    long cpmMicros, Map<String, Integer> kneeByDevice, Map<String, Double> countryShare,
                    Map<String, Double> countryPay, Map<String, List<String>> regions, List<String> sections,
                    List<String> variants) {
    }

    static final double BOUNCE_RISE_PER_AD = 0.045;
    static final Map<String, Double> BASE_BOUNCE = Map.of("phone", 0.42, "tablet", 0.38, "desktop", 0.32, "other", 0.4);
    static final Map<String, Double> SOURCE_BOUNCE = Map.of("search", 0.0, "social", 0.08, "direct", -0.05,
            "referral", 0.02, "email", -0.08, "paid", 0.05, "other", 0.0);
    static final List<String> BROWSERS = List.of("Lumen", "Kestrel", "Orbit");
    static final List<String> SYSTEMS = List.of("Tessera", "Pebble", "Juniper");

    /** Days before the last simulated day on which the news site's layout incident starts (lasts 3 days). */
    static final int INCIDENT_DAYS_AGO = 20;
    static final double INCIDENT_PHONE_BOUNCE = 0.20;
    /** Days before the last simulated day of the one-day regional surge on the news site. */
    static final int SURGE_DAYS_AGO = 33;
    static final String SURGE_REGION = "US-WI";
    static final int SURGE_FACTOR = 5;

    static final List<SiteSpec> SITES = List.of(
            new SiteSpec("kitchen", "Saltmarsh Kitchen", "saltmarsh-kitchen.example", "Europe/Lisbon", "EUR", 800,
                    2_400_000, Map.of("phone", 4, "tablet", 6, "desktop", 7, "other", 6),
                    Map.of("PT", 0.45, "ES", 0.2, "FR", 0.15, "DE", 0.1, "BR", 0.1),
                    Map.of("PT", 1.0, "ES", 0.9, "FR", 1.15, "DE", 1.3, "BR", 0.45),
                    Map.of("PT", List.of("PT-11", "PT-13", "PT-08"), "ES", List.of("ES-MD", "ES-CT")),
                    List.of("recipes", "baking", "seafood", "weeknight", "preserves"),
                    List.of("classic", "stacked")),
            new SiteSpec("news", "Harborview Daily", "harborview-daily.example", "America/Chicago", "USD", 1100,
                    3_100_000, Map.of("phone", 4, "tablet", 6, "desktop", 7, "other", 6),
                    Map.of("US", 0.82, "CA", 0.08, "MX", 0.05, "GB", 0.05),
                    Map.of("US", 1.0, "CA", 0.8, "MX", 0.35, "GB", 0.9),
                    Map.of("US", List.of("US-IL", "US-WI", "US-IN", "US-MI"), "CA", List.of("CA-ON")),
                    List.of("city", "schools", "weather", "sports", "opinion", "business"),
                    List.of()),
            new SiteSpec("gear", "Ridgeline Gear Notes", "ridgeline-gear.example", "Pacific/Auckland", "NZD", 350,
                    4_200_000, Map.of("phone", 5, "tablet", 7, "desktop", 8, "other", 7),
                    Map.of("NZ", 0.5, "AU", 0.25, "US", 0.15, "GB", 0.1),
                    Map.of("NZ", 1.0, "AU", 1.1, "US", 1.35, "GB", 1.0),
                    Map.of("NZ", List.of("NZ-AUK", "NZ-WGN", "NZ-CAN"), "AU", List.of("AU-NSW", "AU-VIC")),
                    List.of("tents", "boots", "packs", "stoves", "jackets"),
                    List.of()));
}

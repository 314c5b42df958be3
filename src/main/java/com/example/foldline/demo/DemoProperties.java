package com.example.foldline.demo;

import org.springframework.boot.context.properties.ConfigurationProperties;

/**
 * The demo publisher.
 *
 * @param enabled seed the demo on first start when the database has no sites (default profile only)
 * @param seed    random seed; the same seed gives the same data
 * @param days    days of history, ending yesterday in each site's time zone
 * @param scale   multiplies the sessions per day (1 gives about 4,000 sessions a day over the three sites)
 */
@ConfigurationProperties("foldline.demo")
record DemoProperties(boolean enabled, long seed, int days, double scale) {

    DemoProperties {
        if (days < 1 || days > 400) {
            throw new IllegalArgumentException("foldline.demo.days must be 1 to 400, got " + days);
        }
        if (!(scale > 0)) {
            throw new IllegalArgumentException("foldline.demo.scale must be positive, got " + scale);
        }
    }
}

package com.example.foldline.accounts;

import org.springframework.boot.context.properties.ConfigurationProperties;

/**
 * Account settings.
 *
 * @param initialPassword password of the {@code admin} user created on first start; when empty a random one is
 *                        generated and written once to the log (env FOLDLINE_ADMIN_PASSWORD)
 * @param basicAuth       whether the JSON API accepts HTTP basic authentication (scripts)
 */
@ConfigurationProperties("foldline.admin")
record AccountProperties(String initialPassword, Boolean basicAuth) {

    boolean basicAuthEnabled() {
        return basicAuth == null || basicAuth;
    }
}

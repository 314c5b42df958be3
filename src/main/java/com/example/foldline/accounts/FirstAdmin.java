package com.example.foldline.accounts;

import java.security.SecureRandom;
import java.util.Base64;

import org.slf4j.Logger;
import org.slf4j.LoggerFactory;
import org.springframework.boot.ApplicationArguments;
import org.springframework.boot.ApplicationRunner;
import org.springframework.core.annotation.Order;
import org.springframework.stereotype.Component;

/**
 * On the first start with no users, creates {@code admin} with the configured password, or a generated one that is
 * written to the log exactly once (it is never stored in clear).
 */
@Component
@Order(0)
class FirstAdmin implements ApplicationRunner {

    private static final Logger log = LoggerFactory.getLogger(FirstAdmin.class);

    private final Accounts accounts;
    private final AccountProperties properties;

    FirstAdmin(Accounts accounts, AccountProperties properties) {
        this.accounts = accounts;
        this.properties = properties;
    }

    @Override
    public void run(ApplicationArguments args) {
        if (!accounts.isEmpty()) {
            return;
        }
        String password = properties.initialPassword();
        if (password == null || password.isBlank()) {
            byte[] bytes = new byte[18];
            new SecureRandom().nextBytes(bytes);
            password = Base64.getUrlEncoder().withoutPadding().encodeToString(bytes);
            log.warn("Created user 'admin' with the generated password {} (shown once; set FOLDLINE_ADMIN_PASSWORD "
                    + "to choose it)", password);
        } else {
            log.info("Created user 'admin' with the password from FOLDLINE_ADMIN_PASSWORD");
        }
        accounts.create("admin", password, true);
    }
}

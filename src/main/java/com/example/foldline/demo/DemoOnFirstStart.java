package com.example.foldline.demo;

import org.springframework.beans.factory.annotation.Value;
import org.springframework.boot.ApplicationArguments;
import org.springframework.boot.ApplicationRunner;
import org.springframework.core.annotation.Order;
import org.springframework.stereotype.Component;

import com.example.foldline.sites.Sites;

/** Seeds the demo publisher on the first start of the embedded profile, never into a database that has sites. */
@Component
@Order(10)
class DemoOnFirstStart implements ApplicationRunner {

    private final DemoProperties properties;
    private final DemoPublisher publisher;
    private final Sites sites;

    private final String databaseUrl;

    DemoOnFirstStart(DemoProperties properties, DemoPublisher publisher, Sites sites,
                     @Value("${spring.datasource.url:}") String databaseUrl) {
        this.properties = properties;
        this.publisher = publisher;
        this.sites = sites;
        this.databaseUrl = databaseUrl;
    }

    @Override
    public void run(ApplicationArguments args) {
        // only the embedded database gets demo data; a server database is treated as production
        if (properties.enabled() && databaseUrl.startsWith("jdbc:h2:") && sites.isEmpty()) {
            // quick start: the newest rollup views are filled in the background once the application is ready
            publisher.seed(properties.seed(), properties.days(), properties.scale(), true);
        }
    }
}

package com.example.foldline;

import org.springframework.boot.SpringApplication;
import org.springframework.boot.autoconfigure.SpringBootApplication;
import org.springframework.boot.context.properties.ConfigurationPropertiesScan;
import org.springframework.scheduling.annotation.EnableScheduling;

/** Foldline: ad density against reader experience, for publishers' editorial and revenue teams. */
@SpringBootApplication
@ConfigurationPropertiesScan
@EnableScheduling
public class FoldlineApplication {

    public static void main(String[] args) {
        SpringApplication.run(FoldlineApplication.class, args);
    }
}

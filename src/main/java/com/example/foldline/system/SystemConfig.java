package com.example.foldline.system;

import java.time.Clock;

import org.springframework.context.annotation.Bean;
import org.springframework.context.annotation.Configuration;

/** Application-wide infrastructure beans: the clock every time-driven part uses, so tests can fix time. */
@Configuration(proxyBeanMethods = false)
class SystemConfig {

    @Bean
    Clock clock() {
        return Clock.systemUTC();
    }
}

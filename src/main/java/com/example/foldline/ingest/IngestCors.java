package com.example.foldline.ingest;

import java.io.IOException;
import java.net.URI;
import java.util.Locale;
import java.util.Optional;
import java.util.regex.Matcher;
import java.util.regex.Pattern;

import org.springframework.boot.web.servlet.FilterRegistrationBean;
import org.springframework.context.annotation.Bean;
import org.springframework.context.annotation.Configuration;
import org.springframework.core.Ordered;
import org.springframework.web.filter.OncePerRequestFilter;

import com.example.foldline.sites.Site;
import com.example.foldline.sites.Sites;

import jakarta.servlet.FilterChain;
import jakarta.servlet.ServletException;
import jakarta.servlet.http.HttpServletRequest;
import jakarta.servlet.http.HttpServletResponse;

/**
 * CORS for the ingest endpoint: a page on the site's own domain (or a subdomain of it) may post events with fetch
 * or sendBeacon; any other origin gets no CORS headers, so the browser refuses the call.
 */
@Configuration(proxyBeanMethods = false)
class IngestCors {

    private static final Pattern EVENTS = Pattern.compile("/api/v1/sites/([0-9]{1,18})/events");

    @Bean
    FilterRegistrationBean<OncePerRequestFilter> ingestCorsFilter(Sites sites) {
        FilterRegistrationBean<OncePerRequestFilter> registration = new FilterRegistrationBean<>(new Filter(sites));
        registration.addUrlPatterns("/api/v1/sites/*");
        registration.setOrder(Ordered.HIGHEST_PRECEDENCE + 10);
        return registration;
    }

    static boolean allowed(String origin, Site site) {
        try {
            String host = URI.create(origin).getHost();
            if (host == null) {
                return false;
            }
            host = host.toLowerCase(Locale.ROOT);
            return host.equals(site.domain()) || host.endsWith("." + site.domain());
        } catch (IllegalArgumentException e) {
            return false;
        }
    }

    private static final class Filter extends OncePerRequestFilter {
        private final Sites sites;

        Filter(Sites sites) {
            this.sites = sites;
        }

        @Override
        protected void doFilterInternal(HttpServletRequest request, HttpServletResponse response, FilterChain chain)
                throws ServletException, IOException {
            String origin = request.getHeader("Origin");
            Matcher m = EVENTS.matcher(request.getRequestURI().substring(request.getContextPath().length()));
            if (origin == null || !m.matches()) {
                chain.doFilter(request, response);
                return;
            }
            Optional<Site> site = sites.find(Long.parseLong(m.group(1)));
            boolean ok = site.isPresent() && allowed(origin, site.get());
            boolean preflight = "OPTIONS".equals(request.getMethod())
                    && request.getHeader("Access-Control-Request-Method") != null;
            response.addHeader("Vary", "Origin");
            if (ok) {
                response.setHeader("Access-Control-Allow-Origin", origin);
            }
            if (preflight) {
                if (ok) {
                    response.setHeader("Access-Control-Allow-Methods", "POST");
                    response.setHeader("Access-Control-Allow-Headers", "Authorization, Content-Type");
                    response.setHeader("Access-Control-Max-Age", "86400");
                    response.setStatus(HttpServletResponse.SC_NO_CONTENT);
                } else {
                    response.setStatus(HttpServletResponse.SC_FORBIDDEN);
                }
                return;
            }
            chain.doFilter(request, response);
        }
    }
}

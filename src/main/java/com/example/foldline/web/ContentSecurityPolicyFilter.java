package com.example.foldline.web;

import java.io.IOException;
import java.io.InputStream;
import java.nio.charset.StandardCharsets;
import java.security.MessageDigest;
import java.security.NoSuchAlgorithmException;
import java.util.ArrayList;
import java.util.Base64;
import java.util.List;
import java.util.regex.Matcher;
import java.util.regex.Pattern;

import org.springframework.core.io.ClassPathResource;
import org.springframework.stereotype.Component;
import org.springframework.web.filter.OncePerRequestFilter;

import jakarta.servlet.FilterChain;
import jakarta.servlet.ServletException;
import jakarta.servlet.http.HttpServletRequest;
import jakarta.servlet.http.HttpServletResponse;

/**
 * Sends a Content-Security-Policy with the browser UI's page: scripts only from our own origin, no inline script
 * or style. The one inline element the UI has, its import map (which browsers treat as a script), is allowed by its
 * SHA-256 hash, computed from the packaged {@code static/index.html} at start so the two never drift apart. Only the
 * UI's documents (the app and its sign-in page) get the policy, since a policy acts on documents: the API explorer
 * and pages of other origins that load the site tag bring their own rules.
 */
@Component
class ContentSecurityPolicyFilter extends OncePerRequestFilter {

    private static final Pattern IMPORT_MAP = Pattern.compile("<script type=\"importmap\">(.*?)</script>",
            Pattern.DOTALL);
    private static final List<String> APP = List.of("/", "/index.html", "/login.html");

    private final String policy;

    ContentSecurityPolicyFilter() throws IOException {
        this.policy = policy(importMapHashes());
    }

    static String policy(List<String> scriptHashes) {
        StringBuilder scripts = new StringBuilder("'self'");
        scriptHashes.forEach(h -> scripts.append(" 'sha256-").append(h).append('\''));
        return "default-src 'self'; script-src " + scripts + "; style-src 'self'; img-src 'self' data: blob:; "
                + "connect-src 'self'; font-src 'self'; object-src 'none'; base-uri 'self'; form-action 'self'; "
                + "frame-ancestors 'none'";
    }

    @Override
    protected void doFilterInternal(HttpServletRequest request, HttpServletResponse response, FilterChain chain)
            throws ServletException, IOException {
        String path = request.getRequestURI().substring(request.getContextPath().length());
        if (APP.contains(path)) {
            response.setHeader("Content-Security-Policy", policy);
        }
        chain.doFilter(request, response);
    }

    private static List<String> importMapHashes() throws IOException {
        ClassPathResource index = new ClassPathResource("static/index.html");
        List<String> hashes = new ArrayList<>();
        if (!index.exists()) {
            return hashes;
        }
        String html;
        try (InputStream in = index.getInputStream()) {
            html = new String(in.readAllBytes(), StandardCharsets.UTF_8);
        }
        Matcher m = IMPORT_MAP.matcher(html);
        while (m.find()) {
            hashes.add(sha256(m.group(1)));
        }
        return hashes;
    }

    static String sha256(String text) {
        try {
            return Base64.getEncoder().encodeToString(
                    MessageDigest.getInstance("SHA-256").digest(text.getBytes(StandardCharsets.UTF_8)));
        } catch (NoSuchAlgorithmException e) {
            throw new IllegalStateException("SHA-256 is part of every Java platform", e);
        }
    }
}

package com.example.foldline.accounts;

import org.springframework.boot.autoconfigure.condition.ConditionalOnWebApplication;
import org.springframework.context.annotation.Bean;
import org.springframework.context.annotation.Configuration;
import org.springframework.http.HttpMethod;
import org.springframework.security.config.Customizer;
import org.springframework.security.config.annotation.web.builders.HttpSecurity;
import org.springframework.security.authentication.dao.DaoAuthenticationProvider;
import org.springframework.security.core.userdetails.UserDetailsService;
import org.springframework.security.core.userdetails.UsernameNotFoundException;
import org.springframework.security.crypto.factory.PasswordEncoderFactories;
import org.springframework.security.crypto.password.PasswordEncoder;
import org.springframework.security.web.SecurityFilterChain;
import org.springframework.security.web.authentication.www.BasicAuthenticationFilter;
import org.springframework.security.web.csrf.CookieCsrfTokenRepository;
import org.springframework.security.web.csrf.CsrfTokenRequestAttributeHandler;
import org.springframework.security.web.util.matcher.RequestMatcher;

/**
 * Who may call what. The event ingest endpoint authenticates by ingest key (checked by the ingest module), the
 * rest of the API by session cookie or HTTP basic; CSRF protection applies to cookie-authenticated writes.
 */
@Configuration(proxyBeanMethods = false)
class SecurityConfig {

    /** What needs no sign-in: the sign-in page with its script, style and icon, the tag, health, API docs. */
    static final String[] PUBLIC = {"/login.html", "/js/login.js", "/css/**", "/favicon.svg", "/error",
            "/webjars/**", "/actuator/health", "/actuator/health/**", "/v3/api-docs", "/v3/api-docs/**",
            "/swagger-ui/**", "/swagger-ui.html", "/tag.js", "/schemas/**", "/favicon.ico"};

    @Bean
    @ConditionalOnWebApplication(type = ConditionalOnWebApplication.Type.SERVLET)
    SecurityFilterChain securityFilterChain(HttpSecurity http, AccountProperties properties, SiteAccess access,
                                            ApiTokens tokens, UserDetailsService users,
                                            ThrottledAuthenticationProvider passwords) throws Exception {
        http.authorizeHttpRequests(auth -> auth
                        .requestMatchers(PUBLIC).permitAll()
                        .requestMatchers("/api/v1/sites/*/events").permitAll()
                        .requestMatchers(HttpMethod.POST, "/api/v1/sites").hasRole("ADMIN")
                        .requestMatchers("/api/v1/sites/{siteId}", "/api/v1/sites/{siteId}/**")
                        .access(new SiteAuthorization(access))
                        .requestMatchers("/api/v1/admin/**").hasRole("ADMIN")
                        .anyRequest().authenticated())
                .authenticationProvider(passwords)
                .addFilterBefore(new BearerTokenFilter(tokens, users), BasicAuthenticationFilter.class)
                // our own page (frontend/app/login.html); Spring Security processes its form (username, password,
                // _csrf) at POST /login and sends failures back to /login.html?error
                .formLogin(f -> f.loginPage("/login.html").loginProcessingUrl("/login").permitAll())
                .logout(Customizer.withDefaults())
                .csrf(csrf -> csrf.requireCsrfProtectionMatcher(cookieAuthenticatedWrite())
                        // the browser UI reads the XSRF-TOKEN cookie and sends it back as the X-XSRF-TOKEN header
                        .csrfTokenRepository(CookieCsrfTokenRepository.withHttpOnlyFalse())
                        .csrfTokenRequestHandler(new CsrfTokenRequestAttributeHandler()))
                .addFilterAfter(new CsrfCookieFilter(), BasicAuthenticationFilter.class);
        if (properties.basicAuthEnabled()) {
            http.httpBasic(Customizer.withDefaults());
        }
        return http.build();
    }

    /**
     * A state-changing request that rides on a session cookie. Requests with their own credentials (basic, bearer)
     * or without any session cannot be forged cross-site, so they need no token.
     */
    private static RequestMatcher cookieAuthenticatedWrite() {
        return request -> {
            String method = request.getMethod();
            boolean safe = "GET".equals(method) || "HEAD".equals(method) || "OPTIONS".equals(method)
                    || "TRACE".equals(method);
            boolean session = request.getRequestedSessionId() != null || request.getSession(false) != null;
            if (safe || request.getHeader("Authorization") != null || !session) {
                return false;
            }
            String path = request.getRequestURI().substring(request.getContextPath().length());
            return !path.matches("/api/v1/sites/[^/]+/events");
        };
    }

    @Bean
    ThrottledAuthenticationProvider passwordAuthentication(UserDetailsService users, PasswordEncoder encoder,
                                                           LoginThrottle throttle) {
        DaoAuthenticationProvider dao = new DaoAuthenticationProvider(users);
        dao.setPasswordEncoder(encoder);
        return new ThrottledAuthenticationProvider(dao, throttle);
    }

    @Bean
    PasswordEncoder passwordEncoder() {
        return PasswordEncoderFactories.createDelegatingPasswordEncoder();
    }

    @Bean
    UserDetailsService userDetailsService(UserRepository users) {
        return username -> users.findByUsername(username).map(AccountPrincipal::of)
                .orElseThrow(() -> new UsernameNotFoundException("no such user"));
    }
}

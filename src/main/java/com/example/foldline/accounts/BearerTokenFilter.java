package com.example.foldline.accounts;

import java.io.IOException;

import org.springframework.security.authentication.UsernamePasswordAuthenticationToken;
import org.springframework.security.core.context.SecurityContext;
import org.springframework.security.core.context.SecurityContextHolder;
import org.springframework.security.core.userdetails.UserDetailsService;
import org.springframework.web.filter.OncePerRequestFilter;

import jakarta.servlet.FilterChain;
import jakarta.servlet.ServletException;
import jakarta.servlet.http.HttpServletRequest;
import jakarta.servlet.http.HttpServletResponse;

/** Authenticates {@code Authorization: Bearer flt_…} personal tokens; ingest keys ({@code flk_…}) are not users. */
class BearerTokenFilter extends OncePerRequestFilter {

    private final ApiTokens tokens;
    private final UserDetailsService users;

    BearerTokenFilter(ApiTokens tokens, UserDetailsService users) {
        this.tokens = tokens;
        this.users = users;
    }

    @Override
    protected void doFilterInternal(HttpServletRequest request, HttpServletResponse response, FilterChain chain)
            throws ServletException, IOException {
        String header = request.getHeader("Authorization");
        if (header != null && header.regionMatches(true, 0, "Bearer " + ApiTokens.PREFIX, 0, 7 + ApiTokens.PREFIX.length())) {
            String token = header.substring(7).strip();
            var username = tokens.usernameFor(token);
            if (username.isEmpty()) {
                response.setStatus(HttpServletResponse.SC_UNAUTHORIZED);
                response.setContentType("application/problem+json");
                response.getWriter().write("{\"title\":\"Unauthorized\",\"status\":401,"
                        + "\"detail\":\"unknown or revoked API token\"}");
                return;
            }
            var user = users.loadUserByUsername(username.get());
            SecurityContext context = SecurityContextHolder.createEmptyContext();
            context.setAuthentication(UsernamePasswordAuthenticationToken.authenticated(user, null,
                    user.getAuthorities()));
            SecurityContextHolder.setContext(context);
        }
        chain.doFilter(request, response);
    }
}

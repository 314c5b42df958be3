package com.example.foldline.accounts;

import java.util.function.Supplier;

import org.springframework.security.authorization.AuthorizationDecision;
import org.springframework.security.authorization.AuthorizationManager;
import org.springframework.security.authorization.AuthorizationResult;
import org.springframework.security.core.Authentication;
import org.springframework.security.web.access.intercept.RequestAuthorizationContext;

/**
 * The rule for every {@code /api/v1/sites/{siteId}…} endpoint: reading needs viewer, writing needs editor, and site
 * settings, ingest keys and members need admin on that site. New endpoints under a site are covered by default.
 */
final class SiteAuthorization implements AuthorizationManager<RequestAuthorizationContext> {

    private final SiteAccess access;

    SiteAuthorization(SiteAccess access) {
        this.access = access;
    }

    @Override
    public AuthorizationResult authorize(Supplier<? extends Authentication> authentication,
                                         RequestAuthorizationContext context) {
        String id = context.getVariables().get("siteId");
        long siteId;
        try {
            siteId = Long.parseLong(id);
        } catch (NumberFormatException | NullPointerException e) {
            return new AuthorizationDecision(false);
        }
        var request = context.getRequest();
        String path = request.getRequestURI().substring(request.getContextPath().length());
        return new AuthorizationDecision(access.allows(authentication.get(), siteId, needed(request.getMethod(), path)));
    }

    static SiteRole needed(String method, String path) {
        boolean read = method.equals("GET") || method.equals("HEAD") || method.equals("OPTIONS");
        boolean adminArea = path.contains("/ingest-keys") || path.contains("/members") || path.contains("/visitors/")
                || path.matches("/api/v1/sites/[^/]+/?");
        if (adminArea && !(read && path.matches("/api/v1/sites/[^/]+/?"))) {
            return SiteRole.ADMIN;
        }
        return read ? SiteRole.VIEWER : SiteRole.EDITOR;
    }
}

package com.example.foldline.accounts;

import org.springframework.security.authentication.AuthenticationProvider;
import org.springframework.security.authentication.BadCredentialsException;
import org.springframework.security.authentication.LockedException;
import org.springframework.security.authentication.UsernamePasswordAuthenticationToken;
import org.springframework.security.authentication.dao.DaoAuthenticationProvider;
import org.springframework.security.core.Authentication;
import org.springframework.security.core.AuthenticationException;

/** Password authentication (form and basic) with the login throttle in front. */
final class ThrottledAuthenticationProvider implements AuthenticationProvider {

    private final DaoAuthenticationProvider delegate;
    private final LoginThrottle throttle;

    ThrottledAuthenticationProvider(DaoAuthenticationProvider delegate, LoginThrottle throttle) {
        this.delegate = delegate;
        this.throttle = throttle;
    }

    @Override
    public Authentication authenticate(Authentication authentication) throws AuthenticationException {
        String username = authentication.getName();
        if (throttle.blocked(username)) {
            throw new LockedException("too many failed logins; try again in 15 minutes");
        }
        try {
            Authentication result = delegate.authenticate(authentication);
            throttle.succeeded(username);
            return result;
        } catch (BadCredentialsException e) {
            throttle.failed(username);
            throw e;
        }
    }

    @Override
    public boolean supports(Class<?> authentication) {
        return UsernamePasswordAuthenticationToken.class.isAssignableFrom(authentication);
    }
}

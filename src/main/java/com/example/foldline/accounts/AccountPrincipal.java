package com.example.foldline.accounts;

import java.util.Collection;
import java.util.List;

import org.springframework.security.core.GrantedAuthority;
import org.springframework.security.core.authority.AuthorityUtils;
import org.springframework.security.core.userdetails.UserDetails;

/** The signed-in user as Spring Security sees it, carrying the account id for role checks. */
public record AccountPrincipal(long id, String username, String passwordHash, boolean globalAdmin, boolean enabled)
        implements UserDetails {

    static AccountPrincipal of(UserAccount u) {
        return new AccountPrincipal(u.id(), u.username(), u.passwordHash(), u.globalAdmin(), u.enabled());
    }

    @Override
    public Collection<? extends GrantedAuthority> getAuthorities() {
        return globalAdmin ? AuthorityUtils.createAuthorityList("ROLE_USER", "ROLE_ADMIN")
                : List.copyOf(AuthorityUtils.createAuthorityList("ROLE_USER"));
    }

    @Override
    public String getPassword() {
        return passwordHash;
    }

    @Override
    public String getUsername() {
        return username;
    }

    @Override
    public boolean isEnabled() {
        return enabled;
    }
}

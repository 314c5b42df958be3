package com.example.foldline.accounts;

import java.util.Comparator;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.Set;
import java.util.stream.Collectors;

import org.springframework.security.core.Authentication;
import org.springframework.stereotype.Service;
import org.springframework.transaction.annotation.Transactional;

import com.example.foldline.system.BadRequestException;
import com.example.foldline.system.NotFoundException;

/**
 * Who may do what on which site: a user's role on a site is the highest of the roles granted to the user and to the
 * user's teams; a global administrator is admin everywhere.
 */
@Service
public class SiteAccess {

    /** A role on a site. */
    public record Grant(long siteId, SiteRole role) {
    }

    /** A member of a site: a user or a team and its role. */
    public record Member(String type, long id, String name, String role) {
    }

    private final AccessRepository repository;
    private final UserRepository users;

    SiteAccess(AccessRepository repository, UserRepository users) {
        this.repository = repository;
        this.users = users;
    }

    public Optional<SiteRole> roleOf(Authentication auth, long siteId) {
        if (auth == null || !(auth.getPrincipal() instanceof AccountPrincipal p)) {
            return Optional.empty();
        }
        if (p.globalAdmin()) {
            return Optional.of(SiteRole.ADMIN);
        }
        return repository.rolesOf(p.id(), siteId).stream().map(r -> SiteRole.parse(r).orElseThrow())
                .max(Comparator.naturalOrder());
    }

    public boolean allows(Authentication auth, long siteId, SiteRole needed) {
        return roleOf(auth, siteId).map(r -> r.includes(needed)).orElse(false);
    }

    /** Sites the user can see, with the role; null means every site (global administrator). */
    public Map<Long, SiteRole> visibleSites(Authentication auth) {
        if (auth == null || !(auth.getPrincipal() instanceof AccountPrincipal p)) {
            return Map.of();
        }
        if (p.globalAdmin()) {
            return null;
        }
        return repository.grantsOf(p.id()).stream()
                .collect(Collectors.toMap(Grant::siteId, Grant::role, (a, b) -> a.includes(b) ? a : b));
    }

    public Set<Long> visibleSiteIds(Authentication auth) {
        Map<Long, SiteRole> visible = visibleSites(auth);
        return visible == null ? null : visible.keySet();
    }

    public static Optional<Long> userId(Authentication auth) {
        return auth != null && auth.getPrincipal() instanceof AccountPrincipal p ? Optional.of(p.id()) : Optional.empty();
    }

    @Transactional
    public void grantUser(long siteId, String username, SiteRole role) {
        UserAccount user = users.findByUsername(username)
                .orElseThrow(() -> new BadRequestException("name", "no user '" + username + "'"));
        repository.grant(siteId, "user", user.id(), role);
    }

    @Transactional
    public void grantTeam(long siteId, String team, SiteRole role) {
        long id = repository.teamId(team).orElseThrow(() -> new BadRequestException("name", "no team '" + team + "'"));
        repository.grant(siteId, "team", id, role);
    }

    @Transactional
    public void revoke(long siteId, String type, long principalId) {
        if (!repository.revoke(siteId, type, principalId)) {
            throw new NotFoundException("no " + type + " " + principalId + " among the members of site " + siteId);
        }
    }

    public List<Member> members(long siteId) {
        return repository.members(siteId);
    }
}

package com.example.foldline.views;

import java.security.SecureRandom;
import java.time.Clock;
import java.util.ArrayList;
import java.util.List;
import java.util.Set;

import org.springframework.security.core.Authentication;
import org.springframework.stereotype.Service;
import org.springframework.transaction.annotation.Transactional;

import com.example.foldline.accounts.SiteAccess;
import com.example.foldline.accounts.SiteRole;
import com.example.foldline.system.BadRequestException;
import com.example.foldline.system.FieldError;
import com.example.foldline.system.NotFoundException;

/** Saved, shareable views and what happens when a link is opened. */
@Service
public class Views {

    static final Set<String> SCREENS = Set.of("health", "density", "depth", "engagement", "pages", "geography");
    private static final String ALPHABET = "abcdefghijkmnopqrstuvwxyz23456789";

    /** What opening a link leads to. */
    public sealed interface Opening {
        record Found(SavedView view) implements Opening {
        }

        record Deleted(SavedView view) implements Opening {
        }

        record NoAccess() implements Opening {
        }

        record Unknown() implements Opening {
        }
    }

    private final ViewRepository repository;
    private final SiteAccess access;
    private final Clock clock;
    private final SecureRandom random = new SecureRandom();

    Views(ViewRepository repository, SiteAccess access, Clock clock) {
        this.repository = repository;
        this.access = access;
        this.clock = clock;
    }

    /** Saves a view for the site (the caller needs editor; checked by the site rule). */
    @Transactional
    public SavedView save(long siteId, Authentication auth, String name, String screen, String state, boolean shared) {
        List<FieldError> errors = new ArrayList<>();
        if (name == null || name.isBlank() || name.strip().length() > 120) {
            errors.add(new FieldError("name", "must be 1 to 120 characters"));
        }
        if (!SCREENS.contains(screen)) {
            errors.add(new FieldError("screen", "must be one of " + String.join(", ", SCREENS.stream().sorted().toList())));
        }
        if (state == null || state.length() > 2000 || state.contains("\n")) {
            errors.add(new FieldError("state", "must be the screen's query string, at most 2,000 characters"));
        }
        if (!errors.isEmpty()) {
            throw new BadRequestException(errors);
        }
        return saveAs(siteId, SiteAccess.userId(auth).orElseThrow(), name.strip(), screen, state, shared);
    }

    /** Saves a view owned by a given user (the demo publisher uses this). */
    @Transactional
    public SavedView saveAs(long siteId, long owner, String name, String screen, String state, boolean shared) {
        String slug = slug();
        repository.insert(siteId, owner, slug, name.strip(), screen, state.startsWith("?") ? state.substring(1) : state,
                shared, clock.instant());
        return repository.bySlug(slug).orElseThrow();
    }

    public List<SavedView> list(long siteId, Authentication auth) {
        return repository.visible(siteId, SiteAccess.userId(auth).orElseThrow());
    }

    public SavedView get(long siteId, long viewId, Authentication auth) {
        SavedView v = repository.byId(siteId, viewId).filter(x -> x.deletedAt() == null)
                .orElseThrow(() -> new NotFoundException("no view " + viewId + " on site " + siteId));
        if (!v.shared() && v.ownerId() != SiteAccess.userId(auth).orElse(-1L)) {
            throw new NotFoundException("no view " + viewId + " on site " + siteId);
        }
        return v;
    }

    /** Pins or unpins a shared view for the site's team. */
    @Transactional
    public SavedView pin(long siteId, long viewId, boolean pinned, Authentication auth) {
        SavedView v = get(siteId, viewId, auth);
        repository.pin(v.id(), pinned);
        return repository.byId(siteId, viewId).orElseThrow();
    }

    /** Deletes a view: its owner or a site admin may; old links then say it was deleted. */
    @Transactional
    public void delete(long siteId, long viewId, Authentication auth) {
        SavedView v = get(siteId, viewId, auth);
        boolean owner = v.ownerId() == SiteAccess.userId(auth).orElse(-1L);
        if (!owner && !access.allows(auth, siteId, SiteRole.ADMIN)) {
            throw new org.springframework.security.access.AccessDeniedException("only the owner or a site admin "
                    + "may delete this view");
        }
        repository.delete(v.id(), clock.instant());
    }

    /** Resolves a link for the caller, recording when a live view was last opened. */
    @Transactional
    public Opening open(String slug, Authentication auth) {
        var found = repository.bySlug(slug);
        if (found.isEmpty()) {
            return new Opening.Unknown();
        }
        SavedView v = found.get();
        if (!access.allows(auth, v.siteId(), SiteRole.VIEWER)
                || (!v.shared() && v.ownerId() != SiteAccess.userId(auth).orElse(-1L))) {
            return new Opening.NoAccess();
        }
        if (v.deletedAt() != null) {
            return new Opening.Deleted(v);
        }
        repository.opened(v.id(), clock.instant());
        return new Opening.Found(v);
    }

    private String slug() {
        StringBuilder sb = new StringBuilder(10);
        for (int i = 0; i < 10; i++) {
            sb.append(ALPHABET.charAt(random.nextInt(ALPHABET.length())));
        }
        return sb.toString();
    }
}

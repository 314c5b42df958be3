package com.example.foldline.views;

import java.time.Instant;

/**
 * A saved view: a screen of one site with its segment state (the UI's query string), shared with everyone who can
 * see the site or private to its owner, reachable at {@code /v/{slug}}.
 */
public record SavedView(long id, long siteId, long ownerId, String owner, String slug, String name, String screen,
                        String state, boolean shared, boolean pinned, Instant createdAt, Instant lastOpenedAt,
                        Instant deletedAt, String link) {

    static String linkOf(String slug) {
        return "/v/" + slug;
    }
}

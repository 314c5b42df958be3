package com.example.foldline.views;

import org.springframework.http.HttpHeaders;
import org.springframework.http.HttpStatus;
import org.springframework.http.MediaType;
import org.springframework.http.ResponseEntity;
import org.springframework.security.core.Authentication;
import org.springframework.web.bind.annotation.GetMapping;
import org.springframework.web.bind.annotation.PathVariable;
import org.springframework.web.bind.annotation.RestController;
import org.springframework.web.util.HtmlUtils;

/**
 * Opens a shared link: the saved screen and state for those who may see it, otherwise a plain page that says why
 * (no access, deleted, unknown) — never an error dump.
 */
@RestController
class ShareLinkController {

    private final Views views;

    ShareLinkController(Views views) {
        this.views = views;
    }

    @GetMapping("/v/{slug}")
    ResponseEntity<String> open(@PathVariable String slug, Authentication auth) {
        Views.Opening opening = views.open(slug, auth);
        if (opening instanceof Views.Opening.Found found) {
            SavedView v = found.view();
            String state = v.state().isEmpty() ? "" : "&" + v.state();
            return ResponseEntity.status(HttpStatus.FOUND).header(HttpHeaders.LOCATION,
                    "/?screen=" + v.screen() + "&site=" + v.siteId() + stripScreenAndSite(state)).build();
        }
        if (opening instanceof Views.Opening.Deleted deleted) {
            return page(HttpStatus.GONE, "This view was deleted",
                    "The saved view “" + deleted.view().name() + "” was deleted. Its site may still be open to you.");
        }
        if (opening instanceof Views.Opening.NoAccess) {
            return page(HttpStatus.FORBIDDEN, "No access",
                    "You are signed in, but your account has no access to the site this view belongs to. "
                            + "Ask an admin of that site to add you or your team.");
        }
        return page(HttpStatus.NOT_FOUND, "No such view", "This link does not lead to a saved view.");
    }

    /** The stored state may carry its own screen and site; the view's own values win. */
    static String stripScreenAndSite(String state) {
        StringBuilder out = new StringBuilder();
        for (String part : state.split("&")) {
            if (part.isEmpty() || part.startsWith("screen=") || part.startsWith("site=")) {
                continue;
            }
            out.append('&').append(part);
        }
        return out.toString();
    }

    private static ResponseEntity<String> page(HttpStatus status, String title, String text) {
        String html = """
                <!doctype html>
                <html lang="en"><head><meta charset="utf-8"><title>%s · Foldline</title>
                <link rel="stylesheet" href="/css/app.css"></head>
                <body class="notice-page"><main><h1>%s</h1><p>%s</p><p><a href="/">Open Foldline</a></p></main></body>
                </html>""".formatted(HtmlUtils.htmlEscape(title), HtmlUtils.htmlEscape(title), HtmlUtils.htmlEscape(text));
        return ResponseEntity.status(status).contentType(MediaType.TEXT_HTML).body(html);
    }
}

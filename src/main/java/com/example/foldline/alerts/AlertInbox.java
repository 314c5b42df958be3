package com.example.foldline.alerts;

import java.time.Clock;
import java.util.List;
import java.util.Map;

import org.springframework.stereotype.Service;

import com.example.foldline.sites.Sites;
import com.example.foldline.system.NotFoundException;

/** In-app notifications: the bell's unread count, the list, acknowledging; and the delivery log. */
@Service
class AlertInbox {

    /** The bell: unread notifications in total and per site. */
    record Unread(long total, Map<Long, Long> bySite) {
    }

    private final NotificationRepository notifications;
    private final Sites sites;
    private final Clock clock;

    AlertInbox(NotificationRepository notifications, Sites sites, Clock clock) {
        this.notifications = notifications;
        this.sites = sites;
        this.clock = clock;
    }

    List<Notification> list(long siteId, boolean unreadOnly, int limit) {
        sites.require(siteId);
        return notifications.list(siteId, unreadOnly, Math.max(1, Math.min(limit, 500)));
    }

    long unread(long siteId) {
        sites.require(siteId);
        return notifications.unread(siteId);
    }

    /** Unread notifications of the given sites (null: every site). */
    Unread unread(java.util.Set<Long> visibleSites) {
        Map<Long, Long> bySite = new java.util.TreeMap<>(notifications.unreadBySite());
        if (visibleSites != null) {
            bySite.keySet().retainAll(visibleSites);
        }
        return new Unread(bySite.values().stream().mapToLong(Long::longValue).sum(), bySite);
    }

    void acknowledge(long siteId, long id, String user) {
        if (!notifications.acknowledge(siteId, id, user, clock.instant())) {
            throw new NotFoundException("no notification " + id + " on site " + siteId);
        }
    }

    int acknowledgeAll(long siteId, String user) {
        sites.require(siteId);
        return notifications.acknowledgeAll(siteId, user, clock.instant());
    }

    List<DeliveryLogEntry> attempts(long siteId, Long webhookId, int limit) {
        sites.require(siteId);
        return notifications.attempts(siteId, webhookId, Math.max(1, Math.min(limit, 1000)));
    }
}

package com.example.foldline.alerts;

import java.net.Inet4Address;
import java.net.Inet6Address;
import java.net.InetAddress;
import java.net.URI;
import java.net.UnknownHostException;
import java.util.List;
import java.util.Locale;

import org.springframework.beans.factory.annotation.Autowired;
import org.springframework.stereotype.Component;

/**
 * Refuses webhook targets that would turn alerting into a way to reach places it should not (server-side request
 * forgery): only http and https, no user info in the URL, only allow-listed hosts when an allow-list is set, and no
 * loopback, private, link-local (cloud metadata), carrier-grade NAT, unique-local or multicast address unless
 * {@code foldline.alerts.webhooks.allow-private-networks} is true. Checked when a webhook is saved and again before
 * every request and redirect, on every address the name resolves to (docs/alerts.md, "Webhook guard").
 */
@Component
class WebhookGuard {

    private final List<String> allowedHosts;
    private final boolean allowPrivate;

    @Autowired
    WebhookGuard(AlertProperties properties) {
        this(properties.webhooks().allowedHosts(), properties.webhooks().allowPrivateNetworks());
    }

    WebhookGuard(List<String> allowedHosts, boolean allowPrivate) {
        this.allowedHosts = List.copyOf(allowedHosts);
        this.allowPrivate = allowPrivate;
    }

    /** Why the target is refused, or null when it is acceptable. */
    String problem(URI uri) {
        String scheme = uri.getScheme() == null ? "" : uri.getScheme().toLowerCase(Locale.ROOT);
        if (!scheme.equals("http") && !scheme.equals("https")) {
            return "only http and https addresses are accepted";
        }
        if (uri.getRawUserInfo() != null) {
            return "user names or passwords in the address are not accepted";
        }
        String host = host(uri);
        if (host == null || host.isEmpty()) {
            return "the address has no host";
        }
        if (!allowedHosts.isEmpty() && allowedHosts.stream().noneMatch(a -> matches(a, host))) {
            return "host " + host + " is not in foldline.alerts.webhooks.allowed-hosts";
        }
        InetAddress[] addresses;
        try {
            addresses = InetAddress.getAllByName(host);
        } catch (UnknownHostException e) {
            return "host " + host + " does not resolve";
        }
        if (!allowPrivate) {
            for (InetAddress a : addresses) {
                if (isInternal(a)) {
                    return "host " + host + " resolves to " + a.getHostAddress() + ", a loopback or private address "
                            + "(allowed only with foldline.alerts.webhooks.allow-private-networks)";
                }
            }
        }
        return null;
    }

    /** The host in lower case without IPv6 brackets. */
    static String host(URI uri) {
        String h = uri.getHost();
        if (h == null) {
            return null;
        }
        h = h.toLowerCase(Locale.ROOT);
        return h.startsWith("[") && h.endsWith("]") ? h.substring(1, h.length() - 1) : h;
    }

    private static boolean matches(String allowed, String host) {
        return allowed.startsWith(".") ? host.endsWith(allowed) : host.equals(allowed);
    }

    /** Loopback, private (RFC 1918, fc00::/7), link-local, carrier-grade NAT (100.64/10), any-local or multicast. */
    static boolean isInternal(InetAddress a) {
        if (a.isLoopbackAddress() || a.isAnyLocalAddress() || a.isLinkLocalAddress() || a.isSiteLocalAddress()
                || a.isMulticastAddress()) {
            return true;
        }
        byte[] b = a.getAddress();
        if (a instanceof Inet4Address) {
            int first = b[0] & 0xff;
            int second = b[1] & 0xff;
            return first == 0 || (first == 100 && second >= 64 && second <= 127) || first >= 240;
        }
        if (a instanceof Inet6Address) {
            boolean uniqueLocal = (b[0] & 0xfe) == 0xfc;
            boolean v4Mapped = isV4Mapped(b);
            if (v4Mapped) {
                try {
                    return isInternal(InetAddress.getByAddress(new byte[]{b[12], b[13], b[14], b[15]}));
                } catch (UnknownHostException e) {
                    return true;
                }
            }
            return uniqueLocal;
        }
        return true;
    }

    private static boolean isV4Mapped(byte[] b) {
        for (int i = 0; i < 10; i++) {
            if (b[i] != 0) {
                return false;
            }
        }
        return (b[10] & 0xff) == 0xff && (b[11] & 0xff) == 0xff;
    }
}

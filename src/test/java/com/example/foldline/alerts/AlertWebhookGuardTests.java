package com.example.foldline.alerts;

import static org.assertj.core.api.Assertions.assertThat;

import java.net.URI;
import java.nio.charset.StandardCharsets;
import java.util.List;

import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;

/**
 * Issue #7: the webhook guard and the signature. Only literal addresses are used, so nothing is resolved or
 * contacted. Signature reference: RFC 4231 (HMAC-SHA256 test vectors), test case 2.
 */
class AlertWebhookGuardTests {

    private final WebhookGuard strict = new WebhookGuard(List.of(), false);

    @ParameterizedTest
    @ValueSource(strings = {"http://127.0.0.1/hook", "http://10.1.2.3/", "http://172.16.0.1/", "http://192.168.1.1/",
            "http://169.254.169.254/latest/meta-data", "http://100.64.0.1/", "http://0.0.0.0/", "http://[::1]/",
            "http://[fd00::1]/", "http://[fe80::1]/", "http://[::ffff:10.0.0.1]/", "http://224.0.0.1/"})
    void internalAddressesAreRefusedByDefault(String url) {
        assertThat(strict.problem(URI.create(url))).contains("loopback or private");
    }

    @Test
    void onlyHttpAndHttpsWithoutCredentials() {
        assertThat(strict.problem(URI.create("ftp://203.0.113.10/x"))).contains("only http and https");
        assertThat(strict.problem(URI.create("file:///etc/passwd"))).contains("only http and https");
        assertThat(strict.problem(URI.create("https://user:pw@203.0.113.10/"))).contains("user names");
        assertThat(strict.problem(URI.create("https://203.0.113.10/hook"))).isNull();   // TEST-NET-3, public
    }

    @Test
    void allowListAndPrivateSwitch() {
        WebhookGuard listed = new WebhookGuard(List.of("203.0.113.10", ".hooks.example"), false);
        assertThat(listed.problem(URI.create("https://203.0.113.11/"))).contains("allowed-hosts");
        assertThat(listed.problem(URI.create("https://203.0.113.10/"))).isNull();
        WebhookGuard loopback = new WebhookGuard(List.of("127.0.0.1"), true);
        assertThat(loopback.problem(URI.create("http://127.0.0.1:8081/hook"))).isNull();
        assertThat(loopback.problem(URI.create("http://10.0.0.1/hook"))).contains("allowed-hosts");
    }

    @Test
    void signatureIsHmacSha256InLowerCaseHex() {
        // RFC 4231 test case 2: key "Jefe", data "what do ya want for nothing?"
        assertThat(WebhookSender.sign("Jefe", "what do ya want for nothing?".getBytes(StandardCharsets.UTF_8)))
                .isEqualTo("5bdcc146bf60754e6a042426089575c75a003f089d2739839dec58b964ec3843");
    }
}

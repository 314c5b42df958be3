package com.example.foldline.alerts;

import org.springframework.boot.test.context.SpringBootTest;
import org.springframework.boot.webmvc.test.autoconfigure.AutoConfigureMockMvc;
import org.springframework.test.context.ActiveProfiles;
import org.springframework.test.context.TestPropertySource;

/** Issue #7 on H2, plus the API, webhooks, e-mail, the bell and suggestions ({@link AlertsApiTests}). */
@SpringBootTest
@AutoConfigureMockMvc
@ActiveProfiles("test")
// the tests run the sessionizer themselves; a scheduled run would contend for the site's lock while they seed
@TestPropertySource(properties = {"foldline.alerts.webhooks.allowed-hosts=127.0.0.1,localhost",
        "foldline.alerts.webhooks.allow-private-networks=true", "foldline.sessions.enabled=false"})
class AlertsH2Tests extends AlertsApiTests {
}

package com.example.foldline.alerts;

import static org.assertj.core.api.Assertions.assertThat;

import java.net.InetSocketAddress;
import java.time.Clock;
import java.time.Instant;
import java.util.ArrayList;
import java.util.Collections;
import java.util.List;
import java.util.concurrent.Callable;
import java.util.concurrent.CountDownLatch;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.Future;
import java.util.concurrent.TimeUnit;

import org.junit.jupiter.api.Test;
import org.springframework.beans.factory.annotation.Autowired;
import org.springframework.boot.test.context.SpringBootTest;
import org.springframework.boot.webmvc.test.autoconfigure.AutoConfigureMockMvc;
import org.springframework.test.context.TestPropertySource;
import org.springframework.transaction.support.TransactionTemplate;

import com.example.foldline.support.PostgresAvailable;
import com.sun.net.httpserver.HttpServer;

/**
 * Issue #7 on PostgreSQL: the contract, and two evaluator instances (and two dispatchers) sharing one database that
 * notify once per rule and window.
 */
@SpringBootTest
@AutoConfigureMockMvc
@PostgresAvailable
// the tests run the sessionizer themselves; a scheduled run would contend for the site's lock while they seed
@TestPropertySource(properties = {"foldline.alerts.webhooks.allowed-hosts=127.0.0.1,localhost",
        "foldline.alerts.webhooks.allow-private-networks=true", "foldline.sessions.enabled=false"})
class AlertsPostgresTests extends AlertsContract {

    private static final int RULES = 30;

    @Autowired
    RuleRepository ruleRepository;
    @Autowired
    AlertData alertData;
    @Autowired
    Notifier notifier;
    @Autowired
    TransactionTemplate transactions;
    @Autowired
    AlertProperties properties;
    @Autowired
    Clock clock;
    @Autowired
    NotificationRepository notificationRepository;
    @Autowired
    WebhookSender webhookSender;
    @Autowired
    MailNotifier mailNotifier;
    @Autowired
    AlertWebhooks webhooks;

    @Test
    void twoEvaluatorInstancesOnOneDatabaseNotifyOnce() throws Exception {
        List<String> deliveries = Collections.synchronizedList(new ArrayList<>());
        HttpServer server = HttpServer.create(new InetSocketAddress("127.0.0.1", 0), 0);
        server.createContext("/hook", exchange -> {
            exchange.getRequestBody().readAllBytes();
            deliveries.add(exchange.getRequestHeaders().getFirst("Foldline-Delivery"));
            exchange.sendResponseHeaders(204, -1);
            exchange.close();
        });
        server.start();
        try {
            NewWebhook hook = webhooks.create(jump.id(), new WebhookRequest("desk",
                    "http://127.0.0.1:" + server.getAddress().getPort() + "/hook", true));
            for (int i = 0; i < RULES; i++) {
                rules.create(jump.id(), jumpRule("Rule " + i, null, List.of(hook.webhook().id()), null));
            }
            // a second instance: its own evaluator and dispatcher objects, sharing only the database
            AlertEvaluator other = new AlertEvaluator(ruleRepository, alertData, notifier, sites, transactions,
                    properties, clock);
            DeliveryDispatcher otherDispatcher = new DeliveryDispatcher(notificationRepository, webhookSender,
                    mailNotifier, properties, json, clock);
            Instant t = at(jump, day9(13));

            List<EvaluationReport> reports = together(() -> evaluator.evaluateAll(t), () -> other.evaluateAll(t));
            assertThat(reports.get(0).notifications() + reports.get(1).notifications())
                    .as("notifications made by the two evaluators, %s", reports).isEqualTo(RULES);
            assertThat(reports).allSatisfy(r -> assertThat(r.failed()).isZero());
            assertThat(jdbc.sql("SELECT COUNT(*) FROM alert_notification WHERE site_id = :site")
                    .param("site", jump.id()).query(Long.class).single()).isEqualTo(RULES);
            assertThat(jdbc.sql("SELECT COUNT(*) FROM alert_state_change WHERE site_id = :site AND to_state = 'RAISED'")
                    .param("site", jump.id()).query(Long.class).single()).isEqualTo(RULES);
            // running both again for the same moment changes nothing
            List<EvaluationReport> again = together(() -> evaluator.evaluateAll(t), () -> other.evaluateAll(t));
            assertThat(again).allSatisfy(r -> assertThat(r.notifications()).isZero());

            List<Integer> attempts = together(() -> dispatcher.dispatchDue(t), () -> otherDispatcher.dispatchDue(t));
            assertThat(attempts.get(0) + attempts.get(1)).isEqualTo(RULES);
            assertThat(deliveries).hasSize(RULES).doesNotHaveDuplicates();
        } finally {
            server.stop(0);
        }
    }

    @SafeVarargs
    private static <T> List<T> together(Callable<T>... tasks) throws Exception {
        ExecutorService pool = Executors.newFixedThreadPool(tasks.length);
        try {
            CountDownLatch start = new CountDownLatch(1);
            List<Future<T>> futures = new ArrayList<>();
            for (Callable<T> task : tasks) {
                futures.add(pool.submit(() -> {
                    start.await();
                    return task.call();
                }));
            }
            start.countDown();
            List<T> out = new ArrayList<>();
            for (Future<T> f : futures) {
                out.add(f.get(120, TimeUnit.SECONDS));
            }
            return out;
        } finally {
            pool.shutdownNow();
        }
    }
}

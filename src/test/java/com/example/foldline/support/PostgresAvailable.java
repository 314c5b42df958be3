package com.example.foldline.support;

import java.io.IOException;
import java.lang.annotation.ElementType;
import java.lang.annotation.Retention;
import java.lang.annotation.RetentionPolicy;
import java.lang.annotation.Target;
import java.net.InetSocketAddress;
import java.net.Socket;

import org.junit.jupiter.api.extension.ConditionEvaluationResult;
import org.junit.jupiter.api.extension.ExecutionCondition;
import org.junit.jupiter.api.extension.ExtendWith;
import org.junit.jupiter.api.extension.ExtensionContext;
import org.springframework.test.context.ActiveProfiles;
import org.springframework.test.context.TestPropertySource;

/**
 * Runs a test class against the local PostgreSQL server (TEST_PG_URL, default
 * jdbc:postgresql://127.0.0.1:5432/foldline_test). Skipped when the server is unreachable on a developer machine;
 * under CI=true it always runs, so an unreachable server fails the build instead of hiding the tests.
 */
@Target(ElementType.TYPE)
@Retention(RetentionPolicy.RUNTIME)
@ExtendWith(PostgresAvailable.Condition.class)
@ActiveProfiles("test")
@TestPropertySource(properties = {
        "spring.datasource.url=${TEST_PG_URL:jdbc:postgresql://127.0.0.1:5432/foldline_test}",
        "spring.datasource.username=${TEST_PG_USER:foldline}",
        "spring.datasource.password=${TEST_PG_PASSWORD:foldline}"})
public @interface PostgresAvailable {

    class Condition implements ExecutionCondition {
        @Override
        public ConditionEvaluationResult evaluateExecutionCondition(ExtensionContext context) {
            if ("true".equalsIgnoreCase(System.getenv("CI"))) {
                return ConditionEvaluationResult.enabled("CI=true: PostgreSQL tests always run");
            }
            try (Socket socket = new Socket()) {
                socket.connect(new InetSocketAddress("127.0.0.1", 5432), 500);
                return ConditionEvaluationResult.enabled("PostgreSQL is listening on 127.0.0.1:5432");
            } catch (IOException e) {
                return ConditionEvaluationResult.disabled("PostgreSQL is not reachable on 127.0.0.1:5432");
            }
        }
    }
}

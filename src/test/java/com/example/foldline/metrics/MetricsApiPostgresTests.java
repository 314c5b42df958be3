package com.example.foldline.metrics;

import org.springframework.boot.test.context.SpringBootTest;
import org.springframework.boot.webmvc.test.autoconfigure.AutoConfigureMockMvc;
import org.springframework.test.context.TestPropertySource;

import com.example.foldline.support.PostgresAvailable;

/** Issue #3 metrics on PostgreSQL. */
@SpringBootTest
@AutoConfigureMockMvc
@PostgresAvailable
@TestPropertySource(properties = "foldline.ingest.max-body-bytes=65536")
class MetricsApiPostgresTests extends MetricsApiContract {
}

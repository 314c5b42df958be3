package com.example.foldline.sessions;

import org.springframework.boot.test.context.SpringBootTest;
import org.springframework.boot.webmvc.test.autoconfigure.AutoConfigureMockMvc;
import org.springframework.test.context.TestPropertySource;

import com.example.foldline.support.PostgresAvailable;

/** Issue #3 sessionizer on PostgreSQL (same configuration as the metrics tests, so the context is shared). */
@SpringBootTest
@AutoConfigureMockMvc
@PostgresAvailable
@TestPropertySource(properties = "foldline.ingest.max-body-bytes=65536")
class SessionizerPostgresTests extends SessionizerContract {
}

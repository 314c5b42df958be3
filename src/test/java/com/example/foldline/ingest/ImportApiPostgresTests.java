package com.example.foldline.ingest;

import org.springframework.boot.test.context.SpringBootTest;
import org.springframework.boot.webmvc.test.autoconfigure.AutoConfigureMockMvc;
import org.springframework.test.context.TestPropertySource;

import com.example.foldline.support.PostgresAvailable;

/** Issue #8 import contract (sessions and metrics, CSV mapping, idempotent re-runs) on the local PostgreSQL server. */
@SpringBootTest
@AutoConfigureMockMvc
@PostgresAvailable
@TestPropertySource(properties = "foldline.ingest.max-body-bytes=65536")
class ImportApiPostgresTests extends ImportApiContract {
}

package com.example.foldline.annotations;

import org.springframework.boot.test.context.SpringBootTest;
import org.springframework.boot.webmvc.test.autoconfigure.AutoConfigureMockMvc;
import org.springframework.test.context.TestPropertySource;

import com.example.foldline.support.PostgresAvailable;

/** Issue #5 annotations on PostgreSQL. */
@SpringBootTest
@AutoConfigureMockMvc
@PostgresAvailable
@TestPropertySource(properties = "foldline.ingest.max-body-bytes=65536")
class AnnotationsApiPostgresTests extends AnnotationsApiContract {
}

package com.example.foldline.privacy;

import java.util.List;

import org.springframework.web.bind.annotation.DeleteMapping;
import org.springframework.web.bind.annotation.PathVariable;
import org.springframework.web.bind.annotation.PostMapping;
import org.springframework.web.bind.annotation.RestController;

import com.example.foldline.sessions.VisitorData;

import io.swagger.v3.oas.annotations.Operation;
import io.swagger.v3.oas.annotations.tags.Tag;

@RestController
@Tag(name = "Privacy", description = "Deletion by visitor and the retention period (docs/security.md)")
class PrivacyController {

    private final VisitorPseudonyms pseudonyms;
    private final VisitorData data;
    private final Retention retention;

    PrivacyController(VisitorPseudonyms pseudonyms, VisitorData data, Retention retention) {
        this.pseudonyms = pseudonyms;
        this.data = data;
        this.retention = retention;
    }

    @DeleteMapping("/api/v1/sites/{siteId}/visitors/{visitor}")
    @Operation(summary = "Delete everything stored about a visitor",
            description = "visitor is the id the tag or client sent; Foldline hashes it the same way to find the data")
    VisitorData.Deleted delete(@PathVariable long siteId, @PathVariable String visitor) {
        return data.deleteVisitor(siteId, pseudonyms.of(siteId, visitor));
    }

    @PostMapping("/api/v1/admin/retention/run")
    @Operation(summary = "Apply every site's retention period now (the daily job, on demand)")
    List<Retention.Purged> runRetention() {
        return retention.purgeAll();
    }
}

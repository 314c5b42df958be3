package com.example.foldline.alerts;

import static org.assertj.core.api.Assertions.assertThat;
import static org.mockito.ArgumentMatchers.any;
import static org.mockito.ArgumentMatchers.anyBoolean;
import static org.mockito.ArgumentMatchers.anyList;
import static org.mockito.ArgumentMatchers.anyLong;
import static org.mockito.Mockito.mock;
import static org.mockito.Mockito.when;

import java.net.URI;
import java.time.Duration;
import java.time.Instant;
import java.time.LocalDate;
import java.time.ZoneId;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;

import org.junit.jupiter.api.Test;

import com.example.foldline.sessions.Dim;
import com.example.foldline.sessions.Group;
import com.example.foldline.sessions.Rollups;
import com.example.foldline.sessions.SegmentFilter;
import com.example.foldline.sessions.SessionTotals;

/** Issue #7: the evaluator's reads: one per site and segment per run, settled days kept for the TTL only. */
class AlertDataTests {

    private static final ZoneId UTC = ZoneId.of("UTC");
    private static final Instant NOW = Instant.parse("2026-11-20T10:00:00Z");

    private final List<SegmentFilter> asked = new ArrayList<>();
    private long sessions = 10;

    private AlertData data(Duration ttl) {
        Rollups rollups = mock(Rollups.class);
        when(rollups.sessions(anyLong(), any(), anyList(), anyBoolean())).thenAnswer(call -> {
            SegmentFilter f = call.getArgument(1);
            asked.add(f);
            List<Group<SessionTotals>> groups = new ArrayList<>();
            for (LocalDate d = f.from(); !d.isAfter(f.to()); d = d.plusDays(1)) {
                groups.add(new Group<>(d, Map.of(Dim.HOUR, 12),
                        new SessionTotals(sessions, 1, sessions, 0, 0, 0, 0, 0, 0, 0, 0, 0)));
            }
            return new Rollups.SessionAnswer(new Rollups.Plan("rollup_session", 20, null), groups);
        });
        AlertProperties properties = new AlertProperties(false, Duration.ofMinutes(1), Duration.ofSeconds(10),
                Duration.ofMinutes(15), Duration.ofDays(2), ttl, URI.create("http://localhost:8080"),
                new AlertProperties.Webhooks(List.of(), false, 6, Duration.ofSeconds(30), Duration.ofHours(1),
                        Duration.ofSeconds(5), Duration.ofSeconds(10)), new AlertProperties.Mail("a@b.example"),
                Duration.ofDays(400));
        return new AlertData(rollups, properties);
    }

    @Test
    void rulesOfOneSiteAndSegmentShareOneReadOfThePlannedDays() {
        AlertData data = data(Duration.ofHours(1));
        AlertData.Reads reads = data.reads(NOW);
        reads.plan(1, Map.of(), LocalDate.of(2026, 11, 12), LocalDate.of(2026, 11, 20));
        reads.plan(1, Map.of(), LocalDate.of(2026, 11, 5), LocalDate.of(2026, 11, 20));
        reads.hourly(1, UTC, Map.of(), LocalDate.of(2026, 11, 12), LocalDate.of(2026, 11, 20));
        HourlySeries s = reads.hourly(1, UTC, Map.of(), LocalDate.of(2026, 11, 5), LocalDate.of(2026, 11, 20));
        assertThat(reads.queries()).isEqualTo(1);
        assertThat(asked.get(0).from()).isEqualTo(LocalDate.of(2026, 11, 5));
        assertThat(s.sum(List.of(LocalDate.of(2026, 11, 5).atTime(12, 0))).sessions()).isEqualTo(10);
    }

    @Test
    void settledDaysAreKeptForTheTtlAndThenReadAgain() {
        AlertData data = data(Duration.ofHours(1));
        LocalDate from = LocalDate.of(2026, 11, 5);
        LocalDate to = LocalDate.of(2026, 11, 20);
        data.reads(NOW).hourly(1, UTC, Map.of(), from, to);
        sessions = 99;   // a late change to every day
        // an hour later: days up to 2026-11-18 are settled and kept, only the newest two are read again
        HourlySeries next = data.reads(NOW.plusSeconds(3600)).hourly(1, UTC, Map.of(), from, to);
        assertThat(asked.get(1).from()).isEqualTo(LocalDate.of(2026, 11, 19));
        assertThat(next.sum(List.of(from.atTime(12, 0))).sessions()).isEqualTo(10);
        assertThat(next.sum(List.of(to.atTime(12, 0))).sessions()).isEqualTo(99);
        // past the TTL the kept days are read again and the late change shows
        HourlySeries later = data.reads(NOW.plusSeconds(3600 + 3601)).hourly(1, UTC, Map.of(), from, to);
        assertThat(asked.get(2).from()).isEqualTo(from);
        assertThat(later.sum(List.of(from.atTime(12, 0))).sessions()).isEqualTo(99);
    }

    @Test
    void aZeroTtlReadsEverythingEveryRun() {
        AlertData data = data(Duration.ZERO);
        LocalDate from = LocalDate.of(2026, 11, 5);
        data.reads(NOW).hourly(1, UTC, Map.of(), from, LocalDate.of(2026, 11, 20));
        data.reads(NOW.plusSeconds(60)).hourly(1, UTC, Map.of(), from, LocalDate.of(2026, 11, 20));
        assertThat(asked).extracting(SegmentFilter::from).containsExactly(from, from);
    }
}

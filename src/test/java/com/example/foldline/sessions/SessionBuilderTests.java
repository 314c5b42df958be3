package com.example.foldline.sessions;

import static org.assertj.core.api.Assertions.assertThat;

import java.time.Instant;
import java.time.LocalDate;
import java.time.ZoneId;
import java.util.ArrayList;
import java.util.List;

import org.junit.jupiter.api.Test;

import com.example.foldline.sites.Site;

/** Session rules of docs/metrics.md (issue #3), on hand-made pageviews. */
class SessionBuilderTests {

    static final Site LISBON = new Site(1, "s", "s.example", ZoneId.of("Europe/Lisbon"), "EUR", 30, null, 400,
            Instant.EPOCH);
    static final Instant FAR_FUTURE = Instant.parse("2100-01-01T00:00:00Z");

    static PageviewRow pv(String id, String ts, String clientSession, int ads, Long engaged, long revenue) {
        return new PageviewRow(id, Instant.parse(ts), "v", clientSession, "/" + id, "search", "phone", "Lumen", null,
                "PT", null, null, ads, engaged, revenue, revenue > 0 ? 1 : 0, 0, 0);
    }

    @Test
    void aGapOfMoreThanThirtyMinutesStartsANewSession() {
        List<PageviewRow> rows = List.of(
                pv("a", "2026-10-20T10:00:00Z", null, 1, 1000L, 10),
                pv("b", "2026-10-20T10:30:00Z", null, 2, 2000L, 20),   // exactly 30 min: same session
                pv("c", "2026-10-20T11:00:01Z", null, 3, null, 30));   // 30 min 1 s: new session
        List<SessionFact> s = SessionBuilder.build(LISBON, rows, FAR_FUTURE);
        assertThat(s).hasSize(2);
        assertThat(s.get(0).pageviews()).isEqualTo(2);
        assertThat(s.get(0).bounce()).isFalse();
        assertThat(s.get(0).entryAds()).isEqualTo(1);
        assertThat(s.get(0).laterAds()).isEqualTo(2.0);
        assertThat(s.get(0).engagedMs()).isEqualTo(3000);
        assertThat(s.get(0).revenueMicros()).isEqualTo(30);
        assertThat(s.get(1).bounce()).isTrue();
        assertThat(s.get(1).laterAds()).isNull();
        assertThat(s.get(1).closed()).isTrue();
    }

    @Test
    void aChangedClientSessionIdStartsANewSession() {
        List<SessionFact> s = SessionBuilder.build(LISBON, List.of(
                pv("a", "2026-10-20T10:00:00Z", "one", 0, null, 0),
                pv("b", "2026-10-20T10:01:00Z", "two", 0, null, 0)), FAR_FUTURE);
        assertThat(s).extracting(SessionFact::id).containsExactly("a", "b");
    }

    @Test
    void engagedSinglePageIsNotABounceWhenTheSiteSaysSo() {
        Site engaged = new Site(1, "s", "s.example", ZoneId.of("UTC"), "EUR", 30, 10, 400, Instant.EPOCH);
        assertThat(SessionBuilder.build(engaged, List.of(pv("a", "2026-10-20T10:00:00Z", null, 0, 10_000L, 0)),
                FAR_FUTURE).get(0).bounce()).isFalse();
        assertThat(SessionBuilder.build(engaged, List.of(pv("a", "2026-10-20T10:00:00Z", null, 0, 9_999L, 0)),
                FAR_FUTURE).get(0).bounce()).isTrue();
    }

    @Test
    void aSessionAcrossMidnightBelongsToTheLocalDayItStarted() {
        // 22:50 UTC is 23:50 in Lisbon (UTC+1 in summer time); the second page is after local midnight
        List<SessionFact> s = SessionBuilder.build(LISBON, List.of(
                pv("a", "2026-10-20T22:50:00Z", null, 0, null, 0),
                pv("b", "2026-10-20T23:10:00Z", null, 0, null, 0)), FAR_FUTURE);
        assertThat(s).hasSize(1);
        assertThat(s.get(0).localDay()).isEqualTo(LocalDate.of(2026, 10, 20));
        assertThat(s.get(0).localHour()).isEqualTo(23);
    }

    @Test
    void localDayFollowsDaylightSavingTime() {
        // 2026-10-24T23:30Z is 00:30 on the 25th in Lisbon (still UTC+1); 2026-10-25T01:30Z is 01:30 (UTC+0 again)
        assertThat(SessionBuilder.build(LISBON, List.of(pv("a", "2026-10-24T23:30:00Z", null, 0, null, 0)), FAR_FUTURE)
                .get(0).localDay()).isEqualTo(LocalDate.of(2026, 10, 25));
        SessionFact after = SessionBuilder.build(LISBON, List.of(pv("b", "2026-10-25T01:30:00Z", null, 0, null, 0)),
                FAR_FUTURE).get(0);
        assertThat(after.localDay()).isEqualTo(LocalDate.of(2026, 10, 25));
        assertThat(after.localHour()).isEqualTo(1);
    }

    @Test
    void closedWhenTheLastPageviewIsBeforeTheThreshold() {
        List<SessionFact> s = SessionBuilder.build(LISBON, List.of(pv("a", "2026-10-20T10:00:00Z", null, 0, null, 0)),
                Instant.parse("2026-10-20T10:00:01Z"));
        assertThat(s.get(0).closed()).isTrue();
    }

    @Test
    void pageDetailRoundTrips() {
        List<PageStat> pages = new ArrayList<>(List.of(new PageStat(3, null, 100, 2, 1, 0),
                new PageStat(0, 15_000L, 0, 0, 0, 0)));
        assertThat(PageStat.decode(PageStat.encode(pages))).isEqualTo(pages);
        assertThat(PageStat.decode("")).isEmpty();
    }
}

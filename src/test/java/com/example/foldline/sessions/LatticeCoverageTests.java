package com.example.foldline.sessions;

import static org.assertj.core.api.Assertions.assertThat;

import java.time.LocalDate;
import java.util.ArrayList;
import java.util.EnumSet;
import java.util.HashSet;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.Set;

import org.junit.jupiter.api.Test;

/**
 * Issue #3: which (answer, filter set) questions the rollup lattice holds. The axes are the dimensions each answer
 * groups by (MetricsService, KneeAnalysis.recommendation, AlertData); the filters are the UI segment bar's.
 */
class LatticeCoverageTests {

    private static final Dim D = Dim.DEVICE;
    private static final Dim S = Dim.SOURCE;
    private static final Dim C = Dim.COUNTRY;
    private static final Dim R = Dim.REGION;
    private static final Dim B = Dim.BROWSER;
    private static final Dim V = Dim.VARIANT;
    private static final List<Dim> FILTERS = List.of(D, S, C, R, B, V);

    /** Answer → its grouping dimensions; "page:" answers read rollup_page. */
    private static final Map<String, Set<Dim>> AXES = new LinkedHashMap<>();

    static {
        AXES.put("overview, timeseries by day", EnumSet.noneOf(Dim.class));
        AXES.put("density", EnumSet.of(Dim.ENTRY_ADS));
        AXES.put("depth", EnumSet.of(Dim.PAGES));
        AXES.put("geography by country", EnumSet.of(C));
        AXES.put("geography by region", EnumSet.of(C, R));
        AXES.put("pages", EnumSet.of(Dim.ENTRY_PATH));
        AXES.put("timeseries by hour, alerts", EnumSet.of(Dim.HOUR));
        AXES.put("page: density's ad-cap advice", EnumSet.of(Dim.ADS, Dim.POSITION));
        AXES.put("page: engagement", EnumSet.of(Dim.ENGAGED_BUCKET));
    }

    /** The two-filter questions the lattice promises to hold (docs/architecture.md). */
    static final Set<Set<Dim>> COMMON_PAIRS = Set.of(EnumSet.of(D, S), EnumSet.of(D, V), EnumSet.of(S, V),
            EnumSet.of(D, C), EnumSet.of(C, R));

    @Test
    void everySingleFilterAndEveryCommonPairIsHeldByAViewForEveryAnswer() {
        List<String> missing = new ArrayList<>();
        for (Map.Entry<String, Set<Dim>> answer : AXES.entrySet()) {
            List<Set<Dim>> filters = new ArrayList<>();
            filters.add(EnumSet.noneOf(Dim.class));
            FILTERS.forEach(f -> filters.add(EnumSet.of(f)));
            filters.addAll(COMMON_PAIRS);
            for (Set<Dim> filter : filters) {
                if (view(answer.getKey(), answer.getValue(), filter) == null) {
                    missing.add(answer.getKey() + " with " + filter);
                }
            }
        }
        assertThat(missing).isEmpty();
    }

    @Test
    void theFallbacksAreTheDocumentedPairs() {
        // lattice 2 (docs/architecture.md): two filters with region or browser, or source x country or country x
        // variant, fall back for the answers whose axis is not country
        List<String> fallbacks = new ArrayList<>();
        for (Map.Entry<String, Set<Dim>> answer : AXES.entrySet()) {
            for (int i = 0; i < FILTERS.size(); i++) {
                for (int j = i + 1; j < FILTERS.size(); j++) {
                    Set<Dim> pair = EnumSet.of(FILTERS.get(i), FILTERS.get(j));
                    if (view(answer.getKey(), answer.getValue(), pair) == null) {
                        assertThat(pair.contains(R) || pair.contains(B) || pair.equals(EnumSet.of(S, C))
                                || pair.equals(EnumSet.of(C, V))).as(answer.getKey() + " " + pair).isTrue();
                        fallbacks.add(answer.getKey() + " " + pair);
                    }
                }
            }
        }
        // 66 of the 198 (answer, filter set) questions of no, one or two filters; lattice 1 left 130
        assertThat(fallbacks).hasSize(EXPECTED_FALLBACKS);
    }

    private static final int EXPECTED_FALLBACKS = 66;

    @Test
    void theIssuesSlowQuestionsAreReadFromSmallViews() {
        // entry paths with a source or a country filter, geography with device x variant (issue #3)
        assertThat(view("pages", EnumSet.of(Dim.ENTRY_PATH), EnumSet.of(S)).dims())
                .containsExactlyInAnyOrder(Dim.ENTRY_PATH, S);
        assertThat(view("pages", EnumSet.of(Dim.ENTRY_PATH), EnumSet.of(C)).dims())
                .containsExactlyInAnyOrder(Dim.ENTRY_PATH, C);
        assertThat(view("geography", EnumSet.of(C), EnumSet.of(D, V)).dims()).containsExactlyInAnyOrder(C, D, S, V);
        assertThat(view("pages", EnumSet.of(Dim.ENTRY_PATH), EnumSet.of(D, S)).dims())
                .containsExactlyInAnyOrder(Dim.ENTRY_PATH, D, S, V);
    }

    @Test
    void viewIdsAreUniqueAndTheFirstLatticeIsUnchanged() {
        // ids are stored in the rollup tables: lattice 1's ids must keep their dimensions
        assertThat(new HashSet<>(Cuboid.SESSION.stream().map(Cuboid::id).toList())).hasSize(Cuboid.SESSION.size());
        assertThat(new HashSet<>(Cuboid.PAGE.stream().map(Cuboid::id).toList())).hasSize(Cuboid.PAGE.size());
        assertThat(Cuboid.SESSION.stream().filter(c -> c.lattice() == 1 && !c.weekly()).count()).isEqualTo(27);
        assertThat(Cuboid.PAGE.stream().filter(c -> c.lattice() == 1 && !c.weekly()).count()).isEqualTo(11);
        assertThat(Cuboid.SESSION.stream().filter(c -> c.id() == 19).findFirst().orElseThrow().dims())
                .containsExactlyInAnyOrder(Dim.ENTRY_PATH, D);
        assertThat(Cuboid.SESSION.stream().filter(c -> c.id() == 26).findFirst().orElseThrow().dims())
                .containsExactlyInAnyOrder(Dim.HOUR, V);
        assertThat(Cuboid.PAGE.stream().filter(c -> c.id() == 10).findFirst().orElseThrow().dims())
                .containsExactlyInAnyOrder(D, S, V);
        assertThat(Cuboid.SESSION).allMatch(c -> c.lattice() >= 1 && c.lattice() <= Cuboid.LATTICE);
    }

    @Test
    void theCheapestViewIsTheSmallest() {
        // Harinarayan et al. (1996): answer from the smallest materialised ancestor
        assertThat(Cuboid.cheapest(Cuboid.SESSION, Set.of()).orElseThrow().id()).isZero();
        assertThat(Cuboid.cheapest(Cuboid.SESSION, Set.of(D)).orElseThrow().id()).isEqualTo(1);
        assertThat(Cuboid.cheapest(Cuboid.SESSION, Set.of(D, S)).orElseThrow().id()).isEqualTo(4);
        assertThat(Cuboid.cheapest(Cuboid.SESSION, Set.of(Dim.ENTRY_PATH, D, S)).orElseThrow().dims())
                .containsExactlyInAnyOrder(Dim.ENTRY_PATH, D, S, V);
    }

    @Test
    void dailyViewsButTheSmallestAndTheHourlyHaveWeeklyTwinsThatAreNeverChosenAlone() {
        // lattice 3: twins carry their daily view's dimensions and come after every daily view
        Cuboid pagesDaily = Cuboid.SESSION.stream().filter(c -> c.id() == 45).findFirst().orElseThrow();
        Cuboid twin = Cuboid.twin(Cuboid.SESSION, pagesDaily, c -> true).orElseThrow();
        assertThat(twin.weekly()).isTrue();
        assertThat(twin.lattice()).isEqualTo(pagesDaily.lattice());
        assertThat(twin.dims()).isEqualTo(pagesDaily.dims());
        assertThat(twin.id()).isGreaterThan(46);
        assertThat(Cuboid.SESSION.stream().filter(Cuboid::weekly).map(Cuboid::weekOf))
                .contains(5, 10, 13, 16, 18, 19, 27, 29, 37, 41, 42, 43, 44, 45, 46)
                .doesNotContain(0, 1, 2, 4, 6, 9, 15, 20, 21, 33); // small views and hourly views have none
        assertThat(Cuboid.SESSION.stream().filter(Cuboid::weekly)).allMatch(c -> c.size() >= 50 && !c.has(Dim.HOUR));
        assertThat(Cuboid.PAGE.stream().filter(Cuboid::weekly).map(Cuboid::weekOf)).contains(4, 5, 11, 13)
                .doesNotContain(0, 6, 9);
        assertThat(Cuboid.twin(Cuboid.SESSION, Cuboid.SESSION.get(0), c -> true)).isEmpty();
        for (Cuboid c : Cuboid.SESSION) {
            assertThat(Cuboid.cheapest(Cuboid.SESSION, c.dims()).orElseThrow().weekly()).isFalse();
        }
        // a twin stores each cell under the Monday of its week (ISO 8601 weeks)
        assertThat(twin.cellDay(LocalDate.parse("2026-11-01"))).isEqualTo(LocalDate.parse("2026-10-26"));
        assertThat(twin.cellDay(LocalDate.parse("2026-10-26"))).isEqualTo(LocalDate.parse("2026-10-26"));
        assertThat(pagesDaily.cellDay(LocalDate.parse("2026-11-01"))).isEqualTo(LocalDate.parse("2026-11-01"));
    }

    @Test
    void aRangeIsSplitIntoItsBuiltWholeWeeksAndTheDaysAroundThem() {
        Cuboid daily = Cuboid.SESSION.stream().filter(c -> c.id() == 18).findFirst().orElseThrow();
        Optional<Cuboid> twin = Cuboid.twin(Cuboid.SESSION, daily, c -> true);
        LocalDate built = LocalDate.parse("2026-11-23"); // every week up to the one of Monday 23 November is built
        // Wednesday 2026-10-14 to Wednesday 2026-11-04: Wed-Sun, two whole weeks, Mon-Wed
        assertThat(Cuboid.split(daily, twin, day("2026-10-14"), day("2026-11-04"), built)).containsExactly(
                new Cuboid.Part(daily, day("2026-10-14"), day("2026-10-18")),
                new Cuboid.Part(twin.get(), day("2026-10-19"), day("2026-11-01")),
                new Cuboid.Part(daily, day("2026-11-02"), day("2026-11-04")));
        // exactly one week: the twin alone
        assertThat(Cuboid.split(daily, twin, day("2026-10-19"), day("2026-10-25"), built))
                .containsExactly(new Cuboid.Part(twin.get(), day("2026-10-19"), day("2026-10-25")));
        // no whole week (Tuesday to the next Monday), no twin, or no week built: the daily view alone
        assertThat(Cuboid.split(daily, twin, day("2026-10-20"), day("2026-10-26"), built))
                .containsExactly(new Cuboid.Part(daily, day("2026-10-20"), day("2026-10-26")));
        assertThat(Cuboid.split(daily, Optional.empty(), day("2026-10-14"), day("2026-11-04"), built))
                .containsExactly(new Cuboid.Part(daily, day("2026-10-14"), day("2026-11-04")));
        assertThat(Cuboid.split(daily, twin, day("2026-10-14"), day("2026-11-04"), null))
                .containsExactly(new Cuboid.Part(daily, day("2026-10-14"), day("2026-11-04")));
        // weeks after the last built one are read day by day
        assertThat(Cuboid.split(daily, twin, day("2026-11-11"), day("2026-12-02"), built)).containsExactly(
                new Cuboid.Part(daily, day("2026-11-11"), day("2026-11-15")),
                new Cuboid.Part(twin.get(), day("2026-11-16"), day("2026-11-29")),
                new Cuboid.Part(daily, day("2026-11-30"), day("2026-12-02")));
        assertThat(Cuboid.split(daily, twin, day("2026-11-11"), day("2026-12-02"), day("2026-11-16")))
                .containsExactly(new Cuboid.Part(daily, day("2026-11-11"), day("2026-11-15")),
                        new Cuboid.Part(twin.get(), day("2026-11-16"), day("2026-11-22")),
                        new Cuboid.Part(daily, day("2026-11-23"), day("2026-12-02")));
        assertThat(Cuboid.split(daily, twin, day("2026-11-11"), day("2026-12-02"), day("2026-11-09")))
                .containsExactly(new Cuboid.Part(daily, day("2026-11-11"), day("2026-12-02")));
        // 90 days always read 18 cells per combination when every week is built: 12 weeks and 6 days
        for (LocalDate from = day("2026-06-01"); from.isBefore(day("2026-06-08")); from = from.plusDays(1)) {
            List<Cuboid.Part> parts = Cuboid.split(daily, twin, from, from.plusDays(89), built);
            long cells = parts.stream().mapToLong(p -> p.view().weekly()
                    ? (p.to().toEpochDay() - p.from().toEpochDay() + 1) / 7
                    : p.to().toEpochDay() - p.from().toEpochDay() + 1).sum();
            assertThat(cells).as("from %s", from).isEqualTo(18);
        }
    }

    private static LocalDate day(String text) {
        return LocalDate.parse(text);
    }

    private static Cuboid view(String answer, Set<Dim> axis, Set<Dim> filter) {
        Set<Dim> needed = EnumSet.noneOf(Dim.class);
        needed.addAll(axis);
        needed.addAll(filter);
        return Cuboid.cheapest(answer.startsWith("page:") ? Cuboid.PAGE : Cuboid.SESSION, needed).orElse(null);
    }
}

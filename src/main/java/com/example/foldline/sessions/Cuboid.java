package com.example.foldline.sessions;

import java.time.DayOfWeek;
import java.time.LocalDate;
import java.time.temporal.TemporalAdjusters;
import java.util.ArrayList;
import java.util.Comparator;
import java.util.EnumSet;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.Set;
import java.util.function.Predicate;

/**
 * One pre-aggregated view of the data cube: the set of dimensions it groups by (always also by day). The lists
 * below are the views Foldline maintains, chosen for the filters and axes people combine (after Harinarayan,
 * Rajaraman & Ullman 1996, "Implementing data cubes efficiently", SIGMOD); docs/architecture.md explains the choice.
 * A question is answered from the smallest view that holds every dimension it filters or groups by.
 *
 * <p>Lattice 2 (issue #3) adds views so that every answer with no filter, one filter of any segment dimension, or
 * two of the common pairs (device × source, device × variant, source × variant, device × country, country × region)
 * is held by a view ({@code LatticeCoverageTests} checks it).
 * Views of a later lattice are filled for existing data by {@link RollupFill} before questions may read them.
 *
 * <p><em>Weekly twins</em> (migration V9): each daily view but the smallest and the hourly ones has a twin with the
 * same dimensions whose cells hold whole weeks (Monday to Sunday of the site's local days, stored under the Monday).
 * A question over a range of days reads the range's whole, already built weeks from the twin and only the other days
 * from the daily view ({@link #split}): a 90-day question reads 18 cells per combination instead of 90, a 30-day one
 * 6 or 12 instead of 30. Twins are built a week at a time once the week is over ({@link WeeklyViews}) and kept up to
 * date from then on; they are never chosen by {@link #cheapest}, and a question that groups by day or hour cannot use
 * them.
 *
 * @param size the view's nominal rows per day: the product of {@link #CARDINALITY} over its dimensions, the cost
 *             measure of Harinarayan et al. (smaller is cheaper to read)
 * @param lattice the lattice version that introduced the view (1: the views shipped with V2); a twin's is its daily
 *                view's
 * @param weekOf for a weekly twin, the id of the daily view it sums by week; −1 for a daily view
 */
public record Cuboid(int id, Set<Dim> dims, long size, int lattice, int weekOf) {

    /** The current lattice version; {@link RollupFill} fills views newer than a site's rollups. */
    public static final int LATTICE = 2;

    /** Daily views at least this large (nominal rows per day) get a weekly twin; smaller ones are cheap to read. */
    static final long TWIN_SIZE = 50;

    /**
     * Nominal distinct values per day of each dimension on a large site, for ranking views only (the planner's
     * cost model; real sites are sparser, and every view is bounded by the sessions of the day). A region
     * determines its country, so country × region counts as the region's cardinality.
     */
    static final Map<Dim, Integer> CARDINALITY = Map.ofEntries(Map.entry(Dim.DEVICE, 4), Map.entry(Dim.SOURCE, 7),
            Map.entry(Dim.BROWSER, 8), Map.entry(Dim.VARIANT, 3), Map.entry(Dim.COUNTRY, 30),
            Map.entry(Dim.REGION, 100), Map.entry(Dim.HOUR, 24), Map.entry(Dim.ENTRY_ADS, 13),
            Map.entry(Dim.PAGES, 11), Map.entry(Dim.ENTRY_PATH, 2000), Map.entry(Dim.ADS, 13),
            Map.entry(Dim.POSITION, 2), Map.entry(Dim.ENGAGED_BUCKET, 9));

    private static final Dim D = Dim.DEVICE;
    private static final Dim S = Dim.SOURCE;
    private static final Dim B = Dim.BROWSER;
    private static final Dim V = Dim.VARIANT;
    private static final Dim C = Dim.COUNTRY;
    private static final Dim R = Dim.REGION;
    private static final Dim A = Dim.ENTRY_ADS;
    private static final Dim N = Dim.PAGES;
    private static final Dim H = Dim.HOUR;
    private static final Dim E = Dim.ENTRY_PATH;
    private static final Dim AP = Dim.ADS;
    private static final Dim POS = Dim.POSITION;
    private static final Dim EB = Dim.ENGAGED_BUCKET;

    /** Session-level views (table rollup_session). Never renumber: ids are stored. */
    public static final List<Cuboid> SESSION = withTwins(47, List.of(
            // lattice 1
            of(0, 1), of(1, 1, D), of(2, 1, S), of(3, 1, V), of(4, 1, D, S), of(5, 1, D, S, B, V),
            of(6, 1, C), of(7, 1, C, R), of(8, 1, C, D, S),
            of(9, 1, A), of(10, 1, A, D), of(11, 1, A, S), of(12, 1, A, V), of(13, 1, A, D, S, V), of(14, 1, A, C),
            of(15, 1, N), of(16, 1, N, D, S, V), of(17, 1, N, C),
            of(18, 1, E), of(19, 1, E, D),
            of(20, 1, H), of(21, 1, H, D), of(22, 1, H, C), of(25, 1, H, S), of(26, 1, H, V),
            of(23, 1, D, S, V), of(24, 1, C, D),
            // lattice 2: per axis, country x device, browser, region; hourly device x source x variant
            of(27, 2, A, C, D), of(28, 2, A, B), of(29, 2, A, C, R),
            of(30, 2, N, C, D), of(31, 2, N, B), of(32, 2, N, C, R),
            of(33, 2, H, D, S, V), of(34, 2, H, C, D), of(35, 2, H, B), of(36, 2, H, C, R),
            // geography by country and by region under every single filter and the common pairs
            of(37, 2, C, D, S, V), of(38, 2, C, B), of(39, 2, C, R, D, S, V), of(40, 2, C, R, B),
            // entry paths under a reader filter (the largest views: rows grow with the articles read that day)
            of(41, 2, E, S), of(42, 2, E, C), of(43, 2, E, B), of(44, 2, E, C, R), of(45, 2, E, D, S, V),
            of(46, 2, E, C, D)));

    /** Page-level views (table rollup_page). */
    public static final List<Cuboid> PAGE = withTwins(17, List.of(
            of(0, 1, AP, POS), of(1, 1, AP, POS, D), of(2, 1, AP, POS, S), of(3, 1, AP, POS, V),
            of(4, 1, AP, POS, D, S, V), of(5, 1, AP, POS, C),
            of(6, 1, EB), of(7, 1, EB, D, S, V), of(8, 1, EB, C),
            of(9, 1), of(10, 1, D, S, V),
            of(11, 2, AP, POS, C, D), of(12, 2, AP, POS, B), of(13, 2, AP, POS, C, R),
            of(14, 2, EB, C, D), of(15, 2, EB, B), of(16, 2, EB, C, R)));

    private static Cuboid of(int id, int lattice, Dim... dims) {
        EnumSet<Dim> set = EnumSet.noneOf(Dim.class);
        set.addAll(List.of(dims));
        long size = 1;
        for (Dim d : set) {
            if (!(d == C && set.contains(R))) {
                size *= CARDINALITY.get(d);
            }
        }
        return new Cuboid(id, Set.copyOf(set), size, lattice, -1);
    }

    /**
     * The daily views followed by their weekly twins, numbered from {@code firstTwin} in the order of the daily
     * views: every view of at least {@link #TWIN_SIZE} nominal rows a day without the hour.
     */
    private static List<Cuboid> withTwins(int firstTwin, List<Cuboid> daily) {
        List<Cuboid> all = new ArrayList<>(daily);
        int id = firstTwin;
        for (Cuboid c : daily) {
            if (c.size >= TWIN_SIZE && !c.has(Dim.HOUR)) {
                all.add(new Cuboid(id++, c.dims, c.size, c.lattice, c.id));
            }
        }
        return List.copyOf(all);
    }

    /** Whether this view's cells hold whole weeks (a weekly twin). */
    public boolean weekly() {
        return weekOf >= 0;
    }

    /** The day a cell of this view is stored under: the day itself, or for a weekly twin the Monday of its week. */
    LocalDate cellDay(LocalDate day) {
        return weekly() ? monday(day) : day;
    }

    static LocalDate monday(LocalDate day) {
        return day.with(TemporalAdjusters.previousOrSame(DayOfWeek.MONDAY));
    }

    /** The weekly twin of a daily view among {@code views}, if it has one that {@code usable} accepts. */
    static Optional<Cuboid> twin(List<Cuboid> views, Cuboid daily, Predicate<Cuboid> usable) {
        return views.stream().filter(c -> c.weekOf == daily.id && usable.test(c)).findFirst();
    }

    /** One part of a range read from one view: local days {@code from}..{@code to} (Mondays, for a twin). */
    public record Part(Cuboid view, LocalDate from, LocalDate to) {
    }

    /**
     * Splits the local days {@code from}..{@code to} into the days before the first whole Monday-to-Sunday week
     * (read from {@code daily}), the whole weeks up to the week of {@code builtThrough} (from {@code weekly}, when
     * present) and the days after them; a range without such a week, or without a twin, is one part of the daily view.
     *
     * @param builtThrough the Monday of the last week the twins hold ({@link WeeklyViews}), or null for none
     */
    static List<Part> split(Cuboid daily, Optional<Cuboid> weekly, LocalDate from, LocalDate to,
                            LocalDate builtThrough) {
        LocalDate firstMonday = from.with(TemporalAdjusters.nextOrSame(DayOfWeek.MONDAY));
        LocalDate lastSunday = to.with(TemporalAdjusters.previousOrSame(DayOfWeek.SUNDAY));
        if (builtThrough != null && lastSunday.isAfter(builtThrough.plusDays(6))) {
            lastSunday = builtThrough.plusDays(6);
        }
        if (weekly.isEmpty() || builtThrough == null || lastSunday.isBefore(firstMonday.plusDays(6))) {
            return List.of(new Part(daily, from, to));
        }
        List<Part> parts = new ArrayList<>(3);
        if (from.isBefore(firstMonday)) {
            parts.add(new Part(daily, from, firstMonday.minusDays(1)));
        }
        parts.add(new Part(weekly.get(), firstMonday, lastSunday));
        if (lastSunday.isBefore(to)) {
            parts.add(new Part(daily, lastSunday.plusDays(1), to));
        }
        return parts;
    }

    /** The cheapest view among {@code views} that holds all {@code needed} dimensions, if any. */
    public static Optional<Cuboid> cheapest(List<Cuboid> views, Set<Dim> needed) {
        return cheapest(views, needed, c -> true);
    }

    /** The same among the views {@code usable} accepts (views not yet filled for a site are left out). */
    static Optional<Cuboid> cheapest(List<Cuboid> views, Set<Dim> needed, Predicate<Cuboid> usable) {
        return views.stream().filter(c -> !c.weekly() && c.dims.containsAll(needed) && usable.test(c))
                .min(Comparator.comparingLong(Cuboid::size).thenComparingInt(c -> c.dims.size())
                        .thenComparingInt(Cuboid::id));
    }

    /** Ids of the views of {@code views} introduced after lattice {@code lattice}. */
    static List<Integer> newerThan(List<Cuboid> views, int lattice) {
        return views.stream().filter(c -> c.lattice > lattice).map(Cuboid::id).toList();
    }

    public boolean has(Dim dim) {
        return dims.contains(dim);
    }
}

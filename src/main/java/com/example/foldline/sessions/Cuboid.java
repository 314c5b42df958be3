package com.example.foldline.sessions;

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
 * @param size the view's nominal rows per day: the product of {@link #CARDINALITY} over its dimensions, the cost
 *             measure of Harinarayan et al. (smaller is cheaper to read)
 * @param lattice the lattice version that introduced the view (1: the views shipped with V2)
 */
public record Cuboid(int id, Set<Dim> dims, long size, int lattice) {

    /** The current lattice version; {@link RollupFill} fills views newer than a site's rollups. */
    public static final int LATTICE = 2;

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
    public static final List<Cuboid> SESSION = List.of(
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
            of(46, 2, E, C, D));

    /** Page-level views (table rollup_page). */
    public static final List<Cuboid> PAGE = List.of(
            of(0, 1, AP, POS), of(1, 1, AP, POS, D), of(2, 1, AP, POS, S), of(3, 1, AP, POS, V),
            of(4, 1, AP, POS, D, S, V), of(5, 1, AP, POS, C),
            of(6, 1, EB), of(7, 1, EB, D, S, V), of(8, 1, EB, C),
            of(9, 1), of(10, 1, D, S, V),
            of(11, 2, AP, POS, C, D), of(12, 2, AP, POS, B), of(13, 2, AP, POS, C, R),
            of(14, 2, EB, C, D), of(15, 2, EB, B), of(16, 2, EB, C, R));

    private static Cuboid of(int id, int lattice, Dim... dims) {
        EnumSet<Dim> set = EnumSet.noneOf(Dim.class);
        set.addAll(List.of(dims));
        long size = 1;
        for (Dim d : set) {
            if (!(d == C && set.contains(R))) {
                size *= CARDINALITY.get(d);
            }
        }
        return new Cuboid(id, Set.copyOf(set), size, lattice);
    }

    /** The cheapest view among {@code views} that holds all {@code needed} dimensions, if any. */
    public static Optional<Cuboid> cheapest(List<Cuboid> views, Set<Dim> needed) {
        return cheapest(views, needed, c -> true);
    }

    /** The same among the views {@code usable} accepts (views not yet filled for a site are left out). */
    static Optional<Cuboid> cheapest(List<Cuboid> views, Set<Dim> needed, Predicate<Cuboid> usable) {
        return views.stream().filter(c -> c.dims.containsAll(needed) && usable.test(c))
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

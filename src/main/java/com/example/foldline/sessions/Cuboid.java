package com.example.foldline.sessions;

import java.util.Comparator;
import java.util.EnumSet;
import java.util.List;
import java.util.Optional;
import java.util.Set;

/**
 * One pre-aggregated view of the data cube: the set of dimensions it groups by (always also by day). The lists
 * below are the views Foldline maintains, chosen for the filters and axes people combine (after Harinarayan,
 * Rajaraman & Ullman 1996, "Implementing data cubes efficiently", SIGMOD); docs/architecture.md explains the choice.
 * A question is answered from the smallest view that holds every dimension it filters or groups by.
 *
 * @param rank smaller is cheaper to read (views are listed from small to large)
 */
public record Cuboid(int id, Set<Dim> dims, int rank) {

    private static final Dim D = Dim.DEVICE;
    private static final Dim S = Dim.SOURCE;
    private static final Dim B = Dim.BROWSER;
    private static final Dim V = Dim.VARIANT;
    private static final Dim C = Dim.COUNTRY;
    private static final Dim R = Dim.REGION;

    /** Session-level views (table rollup_session). Never renumber: ids are stored. */
    public static final List<Cuboid> SESSION = List.of(
            of(0, 0),
            of(1, 1, D), of(2, 1, S), of(3, 1, V), of(4, 2, D, S), of(5, 5, D, S, B, V),
            of(6, 2, C), of(7, 4, C, R), of(8, 4, C, D, S),
            of(9, 1, Dim.ENTRY_ADS), of(10, 2, Dim.ENTRY_ADS, D), of(11, 2, Dim.ENTRY_ADS, S),
            of(12, 2, Dim.ENTRY_ADS, V), of(13, 4, Dim.ENTRY_ADS, D, S, V), of(14, 3, Dim.ENTRY_ADS, C),
            of(15, 1, Dim.PAGES), of(16, 4, Dim.PAGES, D, S, V), of(17, 3, Dim.PAGES, C),
            of(18, 5, Dim.ENTRY_PATH), of(19, 6, Dim.ENTRY_PATH, D),
            of(20, 2, Dim.HOUR), of(21, 3, Dim.HOUR, D), of(22, 4, Dim.HOUR, C), of(25, 3, Dim.HOUR, S),
            of(26, 3, Dim.HOUR, V),
            of(23, 3, D, S, V), of(24, 3, C, D));

    /** Page-level views (table rollup_page). */
    public static final List<Cuboid> PAGE = List.of(
            of(0, 1, Dim.ADS, Dim.POSITION), of(1, 2, Dim.ADS, Dim.POSITION, D), of(2, 2, Dim.ADS, Dim.POSITION, S),
            of(3, 2, Dim.ADS, Dim.POSITION, V), of(4, 4, Dim.ADS, Dim.POSITION, D, S, V),
            of(5, 3, Dim.ADS, Dim.POSITION, C),
            of(6, 1, Dim.ENGAGED_BUCKET), of(7, 3, Dim.ENGAGED_BUCKET, D, S, V), of(8, 2, Dim.ENGAGED_BUCKET, C),
            of(9, 0), of(10, 2, D, S, V));

    private static Cuboid of(int id, int rank, Dim... dims) {
        EnumSet<Dim> set = EnumSet.noneOf(Dim.class);
        set.addAll(List.of(dims));
        return new Cuboid(id, Set.copyOf(set), rank);
    }

    /** The cheapest view among {@code views} that holds all {@code needed} dimensions, if any. */
    public static Optional<Cuboid> cheapest(List<Cuboid> views, Set<Dim> needed) {
        return views.stream().filter(c -> c.dims.containsAll(needed))
                .min(Comparator.comparingInt(Cuboid::rank).thenComparingInt(c -> c.dims.size()));
    }

    public boolean has(Dim dim) {
        return dims.contains(dim);
    }
}

package com.example.foldline.stats;

/**
 * The alternative hypothesis of a test comparing group 1 with group 2 (or, for a breakpoint test, the sign of the
 * change in slope).
 */
public enum Alternative {
    /** Group 1 differs from group 2 in either direction. */
    TWO_SIDED,
    /** Group 1 is greater than group 2 (for a breakpoint test: the slope increases). */
    GREATER,
    /** Group 1 is less than group 2 (for a breakpoint test: the slope decreases). */
    LESS
}

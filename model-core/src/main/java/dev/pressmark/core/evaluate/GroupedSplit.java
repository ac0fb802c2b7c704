package dev.pressmark.core.evaluate;

import java.util.List;
import java.util.Objects;

/**
 * A train/test split that keeps every group on one side, with how near it came to its target.
 *
 * @param split the rows of both sides
 * @param achievedTestFraction test rows over all rows
 * @param oversized groups too large for the test side, largest first; each was kept on the
 *     training side, where it fits
 */
public record GroupedSplit(Split split, double achievedTestFraction, List<OversizedGroup> oversized) {

    public GroupedSplit {
        Objects.requireNonNull(split, "split");
        if (!(achievedTestFraction >= 0 && achievedTestFraction <= 1)) {
            throw new IllegalArgumentException("achievedTestFraction must be in [0, 1], was " + achievedTestFraction);
        }
        oversized = List.copyOf(oversized);
    }
}

package dev.pressmark.core.evaluate;

/**
 * A group with more rows than the part it would go to may hold: {@code rows > limit}. The group is
 * the caller's id; the caller names it (the value of the group column) in its warning.
 *
 * @param group the group's id as given to {@link Resampling}
 * @param rows the group's row count
 * @param limit the rows the part allows: the test target of a split, or a fold's share of a k-fold
 */
public record OversizedGroup(int group, int rows, int limit) {

    public OversizedGroup {
        if (rows <= limit) {
            throw new IllegalArgumentException("rows must be > limit, was " + rows + " <= " + limit);
        }
        if (limit < 0) {
            throw new IllegalArgumentException("limit must be >= 0, was " + limit);
        }
    }
}

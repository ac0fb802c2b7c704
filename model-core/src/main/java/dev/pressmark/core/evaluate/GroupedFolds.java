package dev.pressmark.core.evaluate;

import java.util.List;

/**
 * Repeated k-fold that keeps every group in one fold per repeat.
 *
 * @param folds {@code repeats × folds} folds, ordered by repeat and then by fold index
 * @param oversized groups with more rows than a fold's share (⌈n / k⌉), largest first; each is
 *     still in exactly one fold, which it makes larger than the others
 */
public record GroupedFolds(List<Fold> folds, List<OversizedGroup> oversized) {

    public GroupedFolds {
        folds = List.copyOf(folds);
        oversized = List.copyOf(oversized);
    }
}

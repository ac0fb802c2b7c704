package dev.pressmark.core.search;

import java.util.List;

/**
 * How the search chooses among its scored candidates (every metric pressmark reports is better
 * when higher).
 *
 * <ul>
 *   <li>{@code best}: the highest cross-validated mean; a tie goes to the simpler candidate.
 *   <li>{@code one-se}: among the candidates whose mean is at least the best mean minus the best
 *       candidate's standard error, the simplest: the smallest {@code classifier.c} (the strongest
 *       regularisation), then the fewest features, then the first in grid order. This is the
 *       one-standard-error rule of Breiman, Friedman, Olshen and Stone, "Classification and
 *       Regression Trees" (1984), as Hastie, Tibshirani and Friedman, "The Elements of
 *       Statistical Learning" (2nd ed., 2009), section 7.10, state it for cross-validation.
 * </ul>
 */
public enum Pick {
    BEST("best"),
    ONE_SE("one-se");

    private final String key;

    Pick(String key) {
        this.key = key;
    }

    /** The config file's spelling. */
    public String key() {
        return key;
    }

    /** The pick spelled {@code key}. */
    public static Pick fromKey(String key) {
        for (Pick pick : values()) {
            if (pick.key.equals(key)) {
                return pick;
            }
        }
        throw new IllegalArgumentException("search.pick must be one of best, one-se; was \"" + key + "\"");
    }

    /**
     * One candidate as the pick sees it.
     *
     * @param mean the cross-validated mean of the metric
     * @param standardError its standard error over the folds
     * @param c the classifier's C
     * @param features the number of features the candidate's pipeline fitted (mean over the folds)
     */
    public record Scored(double mean, double standardError, double c, double features) {
    }

    /** The index of the chosen candidate in {@code candidates} (not empty). */
    public int choose(List<Scored> candidates) {
        if (candidates.isEmpty()) {
            throw new IllegalArgumentException("candidates must not be empty");
        }
        int best = 0;
        for (int i = 1; i < candidates.size(); i++) {
            Scored candidate = candidates.get(i);
            Scored leader = candidates.get(best);
            if (candidate.mean > leader.mean || candidate.mean == leader.mean && simpler(candidate, leader)) {
                best = i;
            }
        }
        if (this == BEST) {
            return best;
        }
        double floor = candidates.get(best).mean - candidates.get(best).standardError;
        int chosen = -1;
        for (int i = 0; i < candidates.size(); i++) {
            Scored candidate = candidates.get(i);
            if (candidate.mean >= floor && (chosen < 0 || simpler(candidate, candidates.get(chosen)))) {
                chosen = i;
            }
        }
        return chosen;
    }

    /** Strictly simpler: smaller C, else as small a C and fewer features. */
    private static boolean simpler(Scored a, Scored b) {
        return a.c < b.c || a.c == b.c && a.features < b.features;
    }
}

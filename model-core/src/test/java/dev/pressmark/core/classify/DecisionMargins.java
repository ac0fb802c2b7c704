package dev.pressmark.core.classify;

import java.util.Arrays;

/**
 * For properties that compare two models' predictions where their decision values may differ by
 * a solver's tolerance: a prediction is only comparable when its winner is clear of that slack.
 */
public final class DecisionMargins {

    private DecisionMargins() {
    }

    /** Whether the top decision value beats the next (or 0, for one score) by more than twice {@code slack}. */
    public static boolean clearWinner(double[] values, double slack) {
        if (values.length == 1) {
            return Math.abs(values[0]) > 2 * slack;
        }
        double[] sorted = values.clone();
        Arrays.sort(sorted);
        return sorted[sorted.length - 1] - sorted[sorted.length - 2] > 2 * slack;
    }
}

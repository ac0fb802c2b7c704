package dev.pressmark.core.drift;

import java.util.Objects;

/**
 * How much longer or shorter live items are than training rows. Each shift is the relative
 * difference {@code (live - training) / max(training, 1)}: +0.5 means half as long again, -0.5
 * half as long. The denominator is floored at one token so that a training length of zero gives
 * the difference in tokens instead of a division by zero.
 *
 * @param live tokens per live item in the window
 * @param training tokens per training row, from the profile
 * @param mean the relative shift of the mean
 * @param p50 the relative shift of the median
 * @param p90 the relative shift of the 90th percentile
 */
public record LengthShift(LengthSummary live, LengthSummary training, double mean, double p50, double p90) {

    public LengthShift {
        Objects.requireNonNull(live, "live");
        Objects.requireNonNull(training, "training");
    }

    static LengthShift of(LengthSummary live, LengthSummary training) {
        return new LengthShift(live, training, relative(live.mean(), training.mean()), relative(live.p50(), training.p50()),
                relative(live.p90(), training.p90()));
    }

    static double relative(double live, double training) {
        return (live - training) / Math.max(training, 1.0);
    }
}

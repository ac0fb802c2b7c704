package dev.pressmark.core.evaluate;

import java.util.Arrays;
import java.util.Objects;

/**
 * One metric over the folds of a cross-validation: the mean, its standard error and the value of
 * every fold (in fold order, for drawing the spread). The array is copied in and out.
 */
public record MetricSummary(Metric metric, double mean, double standardError, double[] perFold) {

    public MetricSummary {
        Objects.requireNonNull(metric, "metric");
        Objects.requireNonNull(perFold, "perFold");
        if (perFold.length < 2) {
            throw new IllegalArgumentException("perFold must hold >= 2 values, had " + perFold.length);
        }
        if (!Double.isFinite(mean)) {
            throw new IllegalArgumentException("mean must be finite, was " + mean);
        }
        if (!(standardError >= 0.0) || !Double.isFinite(standardError)) {
            throw new IllegalArgumentException("standardError must be finite and >= 0, was " + standardError);
        }
        perFold = perFold.clone();
    }

    @Override
    public double[] perFold() {
        return perFold.clone();
    }

    public int foldCount() {
        return perFold.length;
    }

    @Override
    public boolean equals(Object other) {
        return other instanceof MetricSummary that
                && metric == that.metric
                && Double.compare(mean, that.mean) == 0
                && Double.compare(standardError, that.standardError) == 0
                && Arrays.equals(perFold, that.perFold);
    }

    @Override
    public int hashCode() {
        return Objects.hash(metric, mean, standardError) * 31 + Arrays.hashCode(perFold);
    }

    @Override
    public String toString() {
        return metric.key() + "=" + mean + " ± " + standardError + " over " + perFold.length + " folds";
    }
}

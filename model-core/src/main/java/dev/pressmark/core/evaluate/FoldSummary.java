package dev.pressmark.core.evaluate;

import java.util.ArrayList;
import java.util.List;
import java.util.Objects;

/**
 * The metrics of a cross-validation condensed over its folds, one {@link MetricSummary} per
 * metric, in {@link Metric} order.
 *
 * <p>The standard error is the sample standard deviation over the folds (divisor f − 1) divided
 * by sqrt(f), f being the number of folds (all repeats together). That formula treats the folds
 * as independent, which they are not: their training sets overlap, so it understates the true
 * uncertainty, and no unbiased estimator exists (Bengio and Grandvalet 2004, JMLR 5:1089). It is
 * reported as common practice does, as a guide to the spread rather than a confidence interval.
 */
public record FoldSummary(List<MetricSummary> metrics) {

    public FoldSummary {
        metrics = List.copyOf(Objects.requireNonNull(metrics, "metrics"));
    }

    /**
     * Summarises the given per-fold values (typically each fold's {@link Evaluation#overall()}).
     * Every fold must hold the same metrics, and there must be at least two folds.
     */
    public static FoldSummary of(List<MetricValues> folds) {
        Objects.requireNonNull(folds, "folds");
        if (folds.size() < 2) {
            throw new IllegalArgumentException("folds must hold >= 2 evaluations, had " + folds.size());
        }
        List<Metric> shared = folds.get(0).metrics();
        for (int f = 1; f < folds.size(); f++) {
            if (!folds.get(f).metrics().equals(shared)) {
                throw new IllegalArgumentException("every fold must hold the same metrics, but fold 0 has "
                        + shared + " and fold " + f + " has " + folds.get(f).metrics());
            }
        }
        List<MetricSummary> out = new ArrayList<>(shared.size());
        double[] values = new double[folds.size()];
        for (Metric metric : shared) {
            for (int f = 0; f < values.length; f++) {
                values[f] = folds.get(f).get(metric);
            }
            double mean = mean(values);
            out.add(new MetricSummary(metric, mean, standardError(values, mean), values));
        }
        return new FoldSummary(out);
    }

    /** The summary of {@code metric}. */
    public MetricSummary get(Metric metric) {
        for (MetricSummary summary : metrics) {
            if (summary.metric() == metric) {
                return summary;
            }
        }
        throw new IllegalArgumentException("no summary for " + metric.key());
    }

    static double mean(double[] values) {
        double sum = 0.0;
        for (double v : values) {
            sum += v;
        }
        return sum / values.length;
    }

    /** Two-pass form: squared deviations from the mean, not the cancelling Σx² − n·mean². */
    static double standardError(double[] values, double mean) {
        double squares = 0.0;
        for (double v : values) {
            double d = v - mean;
            squares += d * d;
        }
        return Math.sqrt(squares / (values.length - 1)) / Math.sqrt(values.length);
    }
}

package dev.pressmark.core.drift;

/**
 * Tokens per item: the mean and the nearest-rank 10th, 50th and 90th percentiles, counted after
 * tokenisation over every text field of the item.
 *
 * @param mean the mean, tokens per item
 * @param p10 the 10th percentile, tokens per item
 * @param p50 the median, tokens per item
 * @param p90 the 90th percentile, tokens per item
 */
public record LengthSummary(double mean, double p10, double p50, double p90) {

    public LengthSummary {
        requireCount("mean", mean);
        requireCount("p10", p10);
        requireCount("p50", p50);
        requireCount("p90", p90);
        if (p10 > p50 || p50 > p90) {
            throw new IllegalArgumentException("percentiles must not decrease, were p10 " + p10 + ", p50 " + p50 + ", p90 " + p90);
        }
    }

    private static void requireCount(String field, double value) {
        if (!(value >= 0.0) || Double.isInfinite(value)) {
            throw new IllegalArgumentException(field + " must be a finite number of tokens >= 0, was " + value);
        }
    }

    /** The summary of {@code lengths}, which this sorts in place. */
    public static LengthSummary of(int[] lengths) {
        if (lengths.length == 0) {
            throw new IllegalArgumentException("lengths must not be empty");
        }
        java.util.Arrays.sort(lengths);
        long total = 0;
        for (int length : lengths) {
            total += length;
        }
        return new LengthSummary((double) total / lengths.length, quantile(lengths, 0.10), quantile(lengths, 0.50), quantile(lengths, 0.90));
    }

    /** The nearest-rank quantile of sorted values, as the training profile computes it. */
    static int quantile(int[] sorted, double q) {
        int rank = (int) Math.ceil(q * sorted.length);
        return sorted[Math.max(0, Math.min(sorted.length - 1, rank - 1))];
    }
}

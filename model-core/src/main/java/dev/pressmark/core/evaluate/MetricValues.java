package dev.pressmark.core.evaluate;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.Collections;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/**
 * A set of metric values, at most one per {@link Metric}, listed in the enum's order. Immutable;
 * values are finite numbers (every 0/0 case has a defined value).
 */
public final class MetricValues {

    private static final Metric[] ALL = Metric.values();

    private final double[] values;
    private final boolean[] present;

    private MetricValues(double[] values, boolean[] present) {
        this.values = values;
        this.present = present;
    }

    public boolean has(Metric metric) {
        return present[metric.ordinal()];
    }

    /** The value of {@code metric}. */
    public double get(Metric metric) {
        if (!present[metric.ordinal()]) {
            throw new IllegalArgumentException("no value for " + metric.key() + "; present: " + metrics());
        }
        return values[metric.ordinal()];
    }

    /** The metrics present, in enum order. */
    public List<Metric> metrics() {
        List<Metric> out = new ArrayList<>(ALL.length);
        for (Metric metric : ALL) {
            if (present[metric.ordinal()]) {
                out.add(metric);
            }
        }
        return Collections.unmodifiableList(out);
    }

    /** The values keyed by {@link Metric#key()}, in enum order, for JSON and reports. */
    public Map<String, Double> asMap() {
        Map<String, Double> out = new LinkedHashMap<>();
        for (Metric metric : ALL) {
            if (present[metric.ordinal()]) {
                out.put(metric.key(), values[metric.ordinal()]);
            }
        }
        return Collections.unmodifiableMap(out);
    }

    @Override
    public boolean equals(Object other) {
        return other instanceof MetricValues that
                && Arrays.equals(present, that.present)
                && Arrays.equals(values, that.values);
    }

    @Override
    public int hashCode() {
        return 31 * Arrays.hashCode(present) + Arrays.hashCode(values);
    }

    @Override
    public String toString() {
        return asMap().toString();
    }

    static Builder builder() {
        return new Builder();
    }

    /** Collects values, then freezes them. */
    static final class Builder {
        private final double[] values = new double[ALL.length];
        private final boolean[] present = new boolean[ALL.length];

        Builder put(Metric metric, double value) {
            if (!Double.isFinite(value)) {
                throw new IllegalArgumentException(metric.key() + " must be finite, was " + value);
            }
            values[metric.ordinal()] = value;
            present[metric.ordinal()] = true;
            return this;
        }

        MetricValues build() {
            return new MetricValues(values.clone(), present.clone());
        }
    }
}

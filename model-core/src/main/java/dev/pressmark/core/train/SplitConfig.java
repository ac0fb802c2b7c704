package dev.pressmark.core.train;

import com.fasterxml.jackson.annotation.JsonCreator;
import com.fasterxml.jackson.annotation.JsonProperty;
import com.fasterxml.jackson.annotation.JsonPropertyOrder;

/**
 * The {@code split} section: the held-out test part.
 *
 * @param testFraction the share of rows held out for the final test, in (0, 1)
 * @param stratify keep each class's share equal in both parts
 * @param seed the seed of every random choice of the run (split, folds, solvers)
 */
@JsonPropertyOrder({"test_fraction", "stratify", "seed"})
public record SplitConfig(
        @JsonProperty("test_fraction") double testFraction,
        @JsonProperty("stratify") boolean stratify,
        @JsonProperty("seed") long seed) {

    public static final double DEFAULT_TEST_FRACTION = 0.25;
    public static final long DEFAULT_SEED = 7;
    public static final SplitConfig DEFAULT = new SplitConfig(DEFAULT_TEST_FRACTION, true, DEFAULT_SEED);

    public SplitConfig {
        if (!(testFraction > 0 && testFraction < 1)) {
            throw new IllegalArgumentException("split.test_fraction must be > 0 and < 1, was " + testFraction);
        }
    }

    @JsonCreator
    static SplitConfig fromYaml(
            @JsonProperty("test_fraction") Double testFraction,
            @JsonProperty("stratify") Boolean stratify,
            @JsonProperty("seed") Long seed) {
        return new SplitConfig(
                testFraction == null ? DEFAULT_TEST_FRACTION : testFraction,
                stratify == null || stratify,
                seed == null ? DEFAULT_SEED : seed);
    }
}

package dev.pressmark.core.train;

import com.fasterxml.jackson.annotation.JsonCreator;
import com.fasterxml.jackson.annotation.JsonProperty;
import com.fasterxml.jackson.annotation.JsonPropertyOrder;

/**
 * The {@code evaluation} section: cross-validation on the training part.
 *
 * @param folds the number of stratified folds, at least 2
 * @param repeats how many times the folds are drawn anew, at least 1
 * @param threads how many folds run at once, 0 for one per available core; the result is the
 *     same at any count, so the recorded config keeps 0 rather than this machine's core count
 */
@JsonPropertyOrder({"folds", "repeats", "threads"})
public record EvaluationConfig(
        @JsonProperty("folds") int folds,
        @JsonProperty("repeats") int repeats,
        @JsonProperty("threads") int threads) {

    public static final int DEFAULT_FOLDS = 10;
    public static final int DEFAULT_REPEATS = 1;
    /** One thread per available core. */
    public static final int DEFAULT_THREADS = 0;
    public static final EvaluationConfig DEFAULT = new EvaluationConfig(DEFAULT_FOLDS, DEFAULT_REPEATS, DEFAULT_THREADS);

    public EvaluationConfig {
        if (folds < 2) {
            throw new IllegalArgumentException("evaluation.folds must be >= 2, was " + folds);
        }
        if (repeats < 1) {
            throw new IllegalArgumentException("evaluation.repeats must be >= 1, was " + repeats);
        }
        if (threads < 0) {
            throw new IllegalArgumentException("evaluation.threads must be >= 0 (0: one per core), was " + threads);
        }
    }

    /** The number of threads to use on this machine. */
    public int effectiveThreads() {
        return threads == 0 ? Runtime.getRuntime().availableProcessors() : threads;
    }

    @JsonCreator
    static EvaluationConfig fromYaml(
            @JsonProperty("folds") Integer folds,
            @JsonProperty("repeats") Integer repeats,
            @JsonProperty("threads") Integer threads) {
        return new EvaluationConfig(
                folds == null ? DEFAULT_FOLDS : folds,
                repeats == null ? DEFAULT_REPEATS : repeats,
                threads == null ? DEFAULT_THREADS : threads);
    }
}

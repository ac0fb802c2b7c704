package dev.pressmark.core.drift;

/**
 * What a population stability index says, by the rule of thumb common in credit-scoring practice:
 * below 0.1 the population is stable, from 0.1 to 0.25 it has moved a little and is worth watching,
 * above 0.25 it has shifted. The thresholds are folklore, not derived from a test; they are a
 * starting point for alerting, not a verdict.
 */
public enum DriftStatus {
    OK("ok"),
    WATCH("watch"),
    DRIFT("drift");

    /** From this index on, the status is {@link #WATCH} (common practice). */
    public static final double WATCH_FROM = 0.1;
    /** Above this index, the status is {@link #DRIFT} (common practice). */
    public static final double DRIFT_ABOVE = 0.25;

    private final String key;

    DriftStatus(String key) {
        this.key = key;
    }

    /** The lower-case name the HTTP answer uses. */
    public String key() {
        return key;
    }

    public static DriftStatus of(double psi) {
        if (psi < WATCH_FROM) {
            return OK;
        }
        return psi <= DRIFT_ABOVE ? WATCH : DRIFT;
    }
}

package dev.pressmark.store.lifecycle;

import java.util.Objects;

/**
 * When {@link PromotionCheck} refuses to make a candidate the active version.
 *
 * @param metric the manifest metric compared, such as {@code balanced_accuracy}; higher must be better
 * @param maxDrop how far below the active version's value the candidate's may be, in the metric's own units, >= 0
 * @param minAgreement the least share of shadow-scored items on which the candidate must give the active version's
 *     label, in [0, 1]; 0 turns the shadow check off
 * @param minSamples how many shadow-scored items a report needs before its agreement counts, >= 1
 */
public record PromotionPolicy(String metric, double maxDrop, double minAgreement, long minSamples) {

    /**
     * Balanced accuracy: the mean recall over the labels, so a candidate cannot look better by
     * favouring the commonest label. It is recorded for every trained bundle.
     */
    public static final String DEFAULT_METRIC = "balanced_accuracy";
    /**
     * Two points of balanced accuracy. Our choice, not a standard: about the standard error of a
     * test split of a few hundred rows, so a drop within it is as likely noise as a real loss.
     */
    public static final double DEFAULT_MAX_DROP = 0.02;
    /**
     * Off. A better model is meant to disagree with the active one somewhere, and how much is
     * healthy depends on the data; a team that knows its figure sets it.
     */
    public static final double DEFAULT_MIN_AGREEMENT = 0.0;
    /** Below a hundred items an agreement share is too noisy to refuse on (its standard error can pass 0.05). */
    public static final long DEFAULT_MIN_SAMPLES = 100;

    public PromotionPolicy {
        Objects.requireNonNull(metric, "metric");
        if (!metric.matches("[a-z][a-z0-9_]{0,63}")) {
            throw new IllegalArgumentException("metric must be a manifest metric key such as " + DEFAULT_METRIC + ", was \"" + metric + "\"");
        }
        if (!(maxDrop >= 0.0) || Double.isInfinite(maxDrop)) {
            throw new IllegalArgumentException("maxDrop must be a finite number >= 0 (in the metric's units), was " + maxDrop);
        }
        if (!(minAgreement >= 0.0 && minAgreement <= 1.0)) {
            throw new IllegalArgumentException("minAgreement must be in [0, 1] (a share of items), was " + minAgreement);
        }
        if (minSamples < 1) {
            throw new IllegalArgumentException("minSamples must be >= 1 item, was " + minSamples);
        }
    }

    public static PromotionPolicy defaults() {
        return new PromotionPolicy(DEFAULT_METRIC, DEFAULT_MAX_DROP, DEFAULT_MIN_AGREEMENT, DEFAULT_MIN_SAMPLES);
    }

    public PromotionPolicy withMetric(String newMetric) {
        return new PromotionPolicy(newMetric, maxDrop, minAgreement, minSamples);
    }

    public PromotionPolicy withMaxDrop(double newMaxDrop) {
        return new PromotionPolicy(metric, newMaxDrop, minAgreement, minSamples);
    }

    public PromotionPolicy withMinAgreement(double newMinAgreement) {
        return new PromotionPolicy(metric, maxDrop, newMinAgreement, minSamples);
    }

    public PromotionPolicy withMinSamples(long newMinSamples) {
        return new PromotionPolicy(metric, maxDrop, minAgreement, newMinSamples);
    }
}

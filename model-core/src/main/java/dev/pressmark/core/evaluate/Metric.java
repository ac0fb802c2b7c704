package dev.pressmark.core.evaluate;

/**
 * The metrics pressmark reports. {@link #key()} is the stable snake_case name used in bundles,
 * reports and the HTTP API; the enum order is the order they are listed in.
 */
public enum Metric {
    ACCURACY("accuracy"),
    BALANCED_ACCURACY("balanced_accuracy"),
    SENSITIVITY("sensitivity"),
    SPECIFICITY("specificity"),
    PRECISION("precision"),
    NPV("npv"),
    F1("f1"),
    MCC("mcc"),
    KAPPA("kappa"),
    ROC_AUC("roc_auc"),
    PR_AUC("pr_auc");

    private static final Metric[] ALL = values();

    private final String key;

    Metric(String key) {
        this.key = key;
    }

    /** The stable snake_case identifier, such as {@code balanced_accuracy}. */
    public String key() {
        return key;
    }

    /** Whether the metric needs scores rather than hard predictions. */
    public boolean needsScores() {
        return this == ROC_AUC || this == PR_AUC;
    }

    /** The metric whose {@link #key()} is {@code key}. */
    public static Metric fromKey(String key) {
        for (Metric metric : ALL) {
            if (metric.key.equals(key)) {
                return metric;
            }
        }
        StringBuilder known = new StringBuilder();
        for (Metric metric : ALL) {
            known.append(known.length() == 0 ? "" : ", ").append(metric.key);
        }
        throw new IllegalArgumentException("unknown metric '" + key + "', expected one of " + known);
    }

    @Override
    public String toString() {
        return key;
    }
}
